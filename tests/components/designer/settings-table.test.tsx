import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen } from "@testing-library/react";
import { SettingsTable } from "@/components/designer/settings/settings-table";
import { parseQuantity } from "@/components/designer/settings/parse-quantity";
import { DEFAULT_RIG_FOR_TESTS } from "./rig";
import type { SequenceDefinition } from "@/machines/schema";
import { assistVolume } from "./fixtures";

function renderTable(def = assistVolume(), readOnly = false) {
  const onChange = vi.fn<(d: SequenceDefinition, group?: string) => void>();
  render(<SettingsTable definition={def} rig={DEFAULT_RIG_FOR_TESTS} readOnly={readOnly} onChange={onChange} />);
  return { onChange, def };
}

function lastDef(onChange: ReturnType<typeof vi.fn>): SequenceDefinition {
  const call = onChange.mock.calls.at(-1);
  if (!call) throw new Error("onChange was not called");
  return call[0] as SequenceDefinition;
}

describe("settings table", () => {
  it("lists every setting with its canonical unit and bounds", () => {
    renderTable();
    expect(screen.getByTestId("setting-row-PEEP")).toBeInTheDocument();
    expect(screen.getByTestId("setting-unit-PEEP")).toHaveValue("cmH2O");
    expect(screen.getByTestId("setting-min-PEEP")).toHaveValue("0");
    expect(screen.getByTestId("setting-max-PEEP")).toHaveValue("25");
  });

  it("converts a value typed with units to the canonical unit", () => {
    const { onChange } = renderTable();
    const cell = screen.getByTestId("setting-value-PEEP");
    fireEvent.change(cell, { target: { value: "10 hPa" } });
    // 1 hPa = 1.01972 cmH2O
    expect(screen.getByText("= 10.1972 cmH2O")).toBeInTheDocument();
    fireEvent.keyDown(cell, { key: "Enter" });
    expect(lastDef(onChange).settings.PEEP.value).toBeCloseTo(10.1972, 3);
  });

  it("converts psi, as the product brief's example", () => {
    const r = parseQuantity("0.1 psi", "cmH2O");
    expect(r.ok && r.value).toBeCloseTo(7.0307, 3);
  });

  it("refuses a value in the wrong kind of unit, and one out of bounds, without changing anything", () => {
    const { onChange } = renderTable();
    const cell = screen.getByTestId("setting-value-PEEP");
    fireEvent.change(cell, { target: { value: "5 mL" } });
    expect(screen.getByRole("alert")).toHaveTextContent(/expected a pressure \(cmH2O\)/i);
    fireEvent.blur(cell);
    fireEvent.change(cell, { target: { value: "0.5 psi" } });
    expect(screen.getByRole("alert")).toHaveTextContent(/above the maximum, 25 cmH2O/);
    fireEvent.keyDown(cell, { key: "Enter" });
    expect(onChange).not.toHaveBeenCalled();
  });

  it("shows derived settings' current values from their formulas", () => {
    renderTable();
    // Finsp = Vt / Ti * 60 / 1000 with Vt 400 mL, Ti 1 s → 24 L/min
    expect(screen.getByTestId("setting-value-Finsp")).toHaveTextContent("= 24 L/min");
  });

  it("renames a setting and rewrites the formulas that use it", () => {
    const { onChange } = renderTable();
    const name = screen.getByTestId("setting-name-Vt");
    fireEvent.change(name, { target: { value: "Vtidal" } });
    fireEvent.keyDown(name, { key: "Enter" });
    const def = lastDef(onChange);
    expect(def.settings.Vtidal).toBeDefined();
    expect(def.settings.Vt).toBeUndefined();
    expect(def.settings.Finsp.formula).toBe("Vtidal / Ti * 60 / 1000");
  });

  it("refuses a new name that is a signal's", () => {
    renderTable();
    const name = screen.getByTestId("setting-name-Vt");
    fireEvent.change(name, { target: { value: "paw" } });
    expect(screen.getByRole("alert")).toHaveTextContent(/signal/);
  });

  it("checks a setting's formula as you type", () => {
    renderTable();
    const f = screen.getByTestId("setting-formula-Te");
    fireEvent.change(f, { target: { value: "60 / RRR - Ti" } });
    expect(screen.getByRole("alert")).toHaveTextContent("RRR");
  });

  it("adds and removes settings", () => {
    const { onChange, def } = renderTable();
    fireEvent.click(screen.getByTestId("add-setting"));
    expect(Object.keys(lastDef(onChange).settings)).toContain("setting");
    fireEvent.click(screen.getByTestId("setting-remove-pause"));
    expect(lastDef(onChange).settings.pause).toBeUndefined();
    expect(def.settings.pause).toBeDefined();
  });

  it("has no inputs to edit when read-only", () => {
    renderTable(assistVolume(), true);
    expect(screen.getByTestId("setting-value-PEEP")).toBeDisabled();
    expect(screen.queryByTestId("add-setting")).toBeNull();
    expect(screen.queryByTestId("setting-remove-PEEP")).toBeNull();
  });

  it("shows and converts a trigger sensitivity by the unit of the current trigger (unitBy)", () => {
    const { onChange } = renderTable();
    expect(screen.getByTestId("setting-effective-unit-sensitivity")).toHaveTextContent('cmH2O while trigger is "pressure"');
    const cell = screen.getByTestId("setting-value-sensitivity");
    fireEvent.change(cell, { target: { value: "2 hPa" } });
    // 1 hPa = 1.019716 cmH2O (derived: 100 Pa / 98.0665 Pa)
    expect(screen.getByText("= 2.03943 cmH2O")).toBeInTheDocument();
    fireEvent.keyDown(cell, { key: "Enter" });
    expect(lastDef(onChange).settings.sensitivity.value).toBeCloseTo(2.03943, 4);
  });

  it("with a flow trigger, the sensitivity is in L/min and a pressure is refused", () => {
    const def = assistVolume();
    def.settings.trigger.value = "flow";
    renderTable(def);
    expect(screen.getByTestId("setting-effective-unit-sensitivity")).toHaveTextContent('L/min while trigger is "flow"');
    const cell = screen.getByTestId("setting-value-sensitivity");
    fireEvent.change(cell, { target: { value: "2 hPa" } });
    expect(screen.getByRole("alert")).toHaveTextContent(/expected a flow \(L\/min\)/i);
    fireEvent.change(cell, { target: { value: "50 mL/s" } });
    expect(screen.getByText("= 3 L/min")).toBeInTheDocument();
  });

  it("computes Ti/Te, Vt from PBW and the pulse rate for a flow", () => {
    renderTable();
    fireEvent.click(screen.getByText("Calculators"));
    fireEvent.change(screen.getByTestId("calc-rr"), { target: { value: "20" } });
    fireEvent.change(screen.getByTestId("calc-ie"), { target: { value: "2" } });
    expect(screen.getByTestId("calc-times")).toHaveTextContent("Ti = 1 s, Te = 2 s");
    fireEvent.change(screen.getByTestId("calc-ie"), { target: { value: "1:2" } });
    fireEvent.change(screen.getByTestId("calc-height"), { target: { value: "67 in" } });
    // ARDSNet: female 45.5 + 2.3 × (67 − 60) = 61.6 kg; × 6 mL/kg = 370 mL
    expect(screen.getByTestId("calc-vt")).toHaveTextContent("PBW = 61.6 kg, Vt = 370 mL");
    expect(screen.getByTestId("calc-pulse")).toHaveTextContent(/Hz/);
    fireEvent.change(screen.getByTestId("calc-flow"), { target: { value: "30 kg" } });
    expect(screen.getByTestId("calc-pulse")).toHaveTextContent(/expected a flow/);
  });
});
