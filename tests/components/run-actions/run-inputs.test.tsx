/** The run page's "Simulated with" panel: the stored inputs, each number with its unit. */
import { describe, expect, it } from "vitest";
import { render, screen, within } from "@testing-library/react";
import { RunInputs } from "@/components/run-actions/run-inputs";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { patientSchema } from "@/lib/sim/types";

const patient = patientSchema.parse({
  complianceMlPerCmH2O: 42,
  resistanceCmH2OPerLps: 11,
  effort: { shape: "half-sine", amplitudeCmH2O: 4, ratePerMin: 14, effortTimeS: 0.9, onsetS: 1.5, variability: 0.1 },
});

describe("RunInputs", () => {
  it("lists lung mechanics, effort and rig figures with units", () => {
    render(<RunInputs patient={patient} rig={DEFAULT_RIG} rigChoice="project" />);
    const lung = screen.getByTestId("run-inputs-lung");
    expect(within(lung).getByText("Compliance").nextElementSibling?.textContent).toBe("42.0mL/cmH2O");
    expect(within(lung).getByText("Resistance").nextElementSibling?.textContent).toBe("11.0cmH2O/(L/s)");
    const effort = screen.getByTestId("run-inputs-effort");
    expect(within(effort).getByText("Amplitude").nextElementSibling?.textContent).toBe("4.0cmH2O");
    expect(within(effort).getByText("Variability").nextElementSibling?.textContent).toBe("10%");
    const rig = screen.getByTestId("run-inputs-rig");
    expect(within(rig).getByText("Relief valve opens at").nextElementSibling?.textContent).toBe("40.0cmH2O");
    expect(within(rig).getByText("PEEP valve").nextElementSibling?.textContent).toBe("follows the PEEP setting");
  });

  it("says an ideal-circuit run had no rig model, and a legacy run has no record", () => {
    const { rerender } = render(<RunInputs patient={patient} rig={null} rigChoice="ideal" />);
    expect(screen.getByTestId("run-inputs-rig").textContent).toMatch(/Ideal circuit/);
    rerender(<RunInputs patient={null} rig={null} rigChoice="project" />);
    expect(screen.getByTestId("run-inputs").textContent).toMatch(/before its inputs were recorded/);
  });
});
