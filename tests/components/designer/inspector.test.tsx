import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { StepForm } from "@/components/designer/inspector/step-form";
import { TransitionForm } from "@/components/designer/inspector/transition-form";
import type { StepMeta } from "@/machines/schema";
import type { TransitionSpec } from "@/components/designer/model/transition-ops";
import { assistVolume } from "./fixtures";

function renderStep(name = "inhale", overrides: Partial<Parameters<typeof StepForm>[0]> = {}) {
  const onApplyMeta = vi.fn<(meta: StepMeta) => void>();
  const onRename = vi.fn<(to: string) => void>();
  render(
    <StepForm
      name={name}
      definition={assistVolume()}
      readOnly={false}
      onApplyMeta={onApplyMeta}
      onRename={onRename}
      onSetInitial={vi.fn()}
      onDelete={vi.fn()}
      {...overrides}
    />,
  );
  return { onApplyMeta, onRename };
}

describe("step inspector", () => {
  it("shows an error naming the unknown name in a bad formula, and does not apply it", async () => {
    const { onApplyMeta } = renderStep();
    const flow = screen.getByTestId("command-flow");
    fireEvent.change(flow, { target: { value: "Vt / Tinsp * 60 / 1000" } });
    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent("Tinsp");
    expect(alert).toHaveTextContent(/not a signal or a setting/);
    expect(flow).toHaveAttribute("aria-invalid", "true");
    expect(onApplyMeta).not.toHaveBeenCalled();
  });

  it("reports a syntax error with its position", async () => {
    renderStep();
    fireEvent.change(screen.getByTestId("command-flow"), { target: { value: "Vt / (Ti" } });
    expect(await screen.findByRole("alert")).toHaveTextContent(/character|end of the formula/);
  });

  it("applies a valid formula live and says what it computes", async () => {
    const { onApplyMeta } = renderStep();
    fireEvent.change(screen.getByTestId("command-flow"), { target: { value: "Vt / Ti * 60 / 1000" } });
    await waitFor(() => expect(onApplyMeta).toHaveBeenCalled());
    const meta = onApplyMeta.mock.calls.at(-1)?.[0];
    expect(meta?.command).toEqual({ kind: "flow", flow: "Vt / Ti * 60 / 1000" });
    expect(meta?.kind).toBe("inhale");
    expect(screen.getByText(/gives a flow/)).toBeInTheDocument();
  });

  it("warns about a unit mismatch but still applies the formula", async () => {
    const { onApplyMeta } = renderStep();
    // PEEP is a pressure; a flow command expects a flow.
    fireEvent.change(screen.getByTestId("command-flow"), { target: { value: "PEEP" } });
    expect(await screen.findByText(/is expected here/)).toBeInTheDocument();
    await waitFor(() => expect(onApplyMeta).toHaveBeenCalled());
  });

  it("lists the names a formula may use, with units, and inserts one on click", async () => {
    renderStep();
    const user = userEvent.setup();
    const flow = screen.getByTestId("command-flow") as HTMLInputElement;
    await user.clear(flow);
    await user.click(screen.getByText("Names you can use"));
    await user.click(screen.getByRole("button", { name: /^Finsp/ }));
    expect(flow.value).toBe("Finsp");
    expect(screen.getByRole("button", { name: /^paw\s*\[cmH2O\]/ })).toBeInTheDocument();
  });

  it("refuses a name another step has and renames on Enter otherwise", async () => {
    const { onRename } = renderStep();
    const user = userEvent.setup();
    const name = screen.getByTestId("step-name");
    await user.clear(name);
    await user.type(name, "hold{Enter}");
    expect(await screen.findByText("another step already has this name")).toBeInTheDocument();
    expect(onRename).not.toHaveBeenCalled();
    await user.clear(name);
    await user.type(name, "deliver{Enter}");
    await waitFor(() => expect(onRename).toHaveBeenCalledWith("deliver"));
  });

  it("switches the command kind with fresh fields", async () => {
    const { onApplyMeta } = renderStep();
    fireEvent.change(screen.getByTestId("command-kind"), { target: { value: "pressure" } });
    await waitFor(() => expect(onApplyMeta.mock.calls.at(-1)?.[0].command.kind).toBe("pressure"));
    expect(screen.getByTestId("command-target")).toHaveValue("20");
    expect(screen.getByTestId("command-rise")).toHaveValue("0.1");
  });

  it("is all read-only for a viewer", () => {
    renderStep("inhale", { readOnly: true });
    expect(screen.getByTestId("command-flow")).toBeDisabled();
    expect(screen.getByTestId("step-name")).toBeDisabled();
    expect(screen.queryByTestId("delete-step")).toBeNull();
  });
});

describe("transition inspector", () => {
  function renderTransition() {
    const def = assistVolume();
    const onApply = vi.fn<(spec: TransitionSpec) => void>();
    const ref = { step: "expire", group: "on" as const, key: "SCAN", index: 0 };
    const t = def.machine.states.expire.on?.SCAN;
    const transition = Array.isArray(t) ? t[0] : t;
    if (!transition) throw new Error("fixture changed");
    render(<TransitionForm transitionRef={ref} transition={transition} definition={def} readOnly={false} onApply={onApply} onMove={vi.fn()} onDelete={vi.fn()} />);
    return { onApply };
  }

  it("shows the condition and its priority", () => {
    renderTransition();
    expect(screen.getByTestId("trigger-type")).toHaveValue("condition");
    expect(screen.getByTestId("priority")).toHaveTextContent("Checked 1st of");
  });

  it("turns a condition into a timer once the timer formula is valid", async () => {
    const { onApply } = renderTransition();
    fireEvent.change(screen.getByTestId("trigger-type"), { target: { value: "timer" } });
    const key = await screen.findByTestId("timer-key");
    fireEvent.change(key, { target: { value: "Tnope" } });
    expect(await screen.findByRole("alert")).toHaveTextContent("Tnope");
    expect(onApply).not.toHaveBeenCalled();
    fireEvent.change(key, { target: { value: "pause + 0.1" } });
    await waitFor(() => expect(onApply).toHaveBeenCalled());
    expect(onApply.mock.calls.at(-1)?.[0].trigger).toEqual({ type: "timer", key: "pause + 0.1" });
  });

  it("rejects a condition that compares a time with a pressure only as advice", async () => {
    const { onApply } = renderTransition();
    fireEvent.change(screen.getByTestId("condition"), { target: { value: "tStep > PEEP" } });
    expect(await screen.findByText(/./, { selector: "span.text-amber-800" })).toBeInTheDocument();
    await waitFor(() => expect(onApply).toHaveBeenCalled());
  });
});
