import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { Caution } from "@/components/shell/caution";
import { Header } from "@/components/shell/header";
import { LogoMark } from "@/components/shell/logo";

describe("shell", () => {
  it("shows PRODUCT.md's caution in full", () => {
    render(<Caution />);
    const caution = screen.getByRole("complementary", { name: "Caution" });
    expect(caution).toHaveTextContent("It is not a medical device and does not give clinical advice.");
    expect(caution).toHaveTextContent("Follow local regulations and licensed clinical practice.");
  });

  it("shows the signed-in user's role and offers Users only to admins", () => {
    const projects = [{ id: "p1", name: "Lowtide bag-compressor build" }];
    const { rerender } = render(
      <Header user={{ id: "u", email: "c@demo.test", name: "Cleo", role: "clinician" }} projects={projects} />,
    );
    expect(screen.getByTestId("user-role")).toHaveTextContent("Clinician");
    expect(screen.queryByRole("link", { name: "Users" })).toBeNull();
    expect(screen.getByRole("link", { name: "Lowtide bag-compressor build" })).toHaveAttribute("href", "/projects/p1");
    expect(screen.getByRole("button", { name: "Sign out" })).toBeInTheDocument();

    rerender(<Header user={{ id: "u", email: "a@demo.test", name: "Ada", role: "admin" }} projects={projects} />);
    expect(screen.getByTestId("user-role")).toHaveTextContent("Admin");
    expect(screen.getByRole("link", { name: "Users" })).toHaveAttribute("href", "/admin/users");
  });

  it("draws the logo as an accessible image", () => {
    render(<LogoMark />);
    expect(screen.getByRole("img", { name: "Tidewright" })).toBeInTheDocument();
  });
});
