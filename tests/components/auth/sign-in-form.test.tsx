import { render, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { SignInForm } from "@/components/auth/sign-in-form";

afterEach(() => vi.unstubAllGlobals());

describe("SignInForm", () => {
  it("checks the fields before calling the server", async () => {
    const fetchMock = vi.fn();
    vi.stubGlobal("fetch", fetchMock);
    render(<SignInForm next="/projects" />);
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByText("Enter a valid email address.")).toBeInTheDocument();
    expect(screen.getByText("Enter your password.")).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("shows the server's message on a wrong password and on throttling", async () => {
    const fetchMock = vi
      .fn()
      .mockResolvedValueOnce(Response.json({ error: "Email or password is incorrect." }, { status: 401 }))
      .mockResolvedValueOnce(Response.json({ error: "Too many failed sign-in attempts. Try again in 15 minutes." }, { status: 429 }));
    vi.stubGlobal("fetch", fetchMock);
    render(<SignInForm next="/projects" />);
    await userEvent.type(screen.getByLabelText("Email"), "engineer@demo.test");
    await userEvent.type(screen.getByLabelText("Password"), "wrong");
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByRole("alert")).toHaveTextContent("Email or password is incorrect.");
    await userEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByText(/Too many failed sign-in attempts/)).toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledWith("/api/auth/sign-in", expect.objectContaining({ method: "POST" }));
  });
});
