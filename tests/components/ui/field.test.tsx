import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { Field, Input } from "@/components/ui/field";

describe("Field", () => {
  it("labels its control and announces errors tied to it", () => {
    render(
      <Field label="Email" errors={["Enter a valid email address."]} hint="Your work address">
        {(a) => <Input {...a} />}
      </Field>,
    );
    const input = screen.getByLabelText("Email");
    expect(input).toHaveAttribute("aria-invalid", "true");
    expect(input).toHaveAccessibleDescription("Your work address Enter a valid email address.");
    expect(screen.getByRole("alert")).toHaveTextContent("Enter a valid email address.");
  });

  it("is valid and silent without errors", () => {
    render(<Field label="Name">{(a) => <Input {...a} />}</Field>);
    expect(screen.getByLabelText("Name")).toHaveAttribute("aria-invalid", "false");
    expect(screen.queryByRole("alert")).toBeNull();
  });
});
