/** Formula analysis: names, syntax errors, dimension inference and constant verdicts. */
import { describe, expect, it } from "vitest";
import {
  DIMENSIONS,
  analyseFormula,
  describeDimension,
  dimensionOfUnit,
  evaluateRange,
  formulaScope,
  formulaSymbols,
  guardVerdict,
  rangeEnvironment,
  sameDimension,
  KNOWN_FUNCTIONS,
  type InferredDimension,
} from "@/machines/formula-analysis";
import { FORMULA_FUNCTIONS } from "@/machines/formula";
import type { Setting } from "@/machines/schema";

const settings: Record<string, Setting> = {
  PEEP: { unit: "cmH2O", value: 5, min: 0, max: 20 },
  sensitivity: { unit: "cmH2O", value: 2, min: 0.5, max: 5 },
  Vt: { unit: "mL", value: 500 },
  Ti: { unit: "s", value: 1, min: 0.3, max: 2 },
  RR: { unit: "/min", value: 15, min: 4, max: 30 },
  IE: { unit: "", value: 2 },
  cycleOff: { unit: "%", value: 25 },
  mode: { unit: "", options: ["pressure", "flow"], value: "pressure" },
};
const scope = formulaScope(settings);
const dimOf = (expr: string): InferredDimension => analyseFormula(expr, scope).dimension;
const kinds = (expr: string): string[] => analyseFormula(expr, scope).problems.map((p) => p.kind);
const same = (a: InferredDimension, b: InferredDimension): boolean => a !== "unknown" && b !== "unknown" && sameDimension(a, b);

describe("functions", () => {
  it("are exactly the ones the engine's restricted formula instance allows", () => {
    expect([...KNOWN_FUNCTIONS].sort()).toEqual([...FORMULA_FUNCTIONS].sort());
  });
});

describe("names", () => {
  it("lists symbols without function names, once each, in order", () => {
    expect(formulaSymbols("max(paw, PEEP) > PEEP + sensitivity")).toEqual(["paw", "PEEP", "sensitivity"]);
    expect(analyseFormula("max(paw, PEEP) > 3", scope).functions).toEqual(["max"]);
  });
});

describe("syntax errors", () => {
  it("gives a readable message and a 0-based position", () => {
    const [p] = analyseFormula("paw >", scope).problems;
    expect(p.kind).toBe("syntax");
    expect(p.message).toBe("Unexpected end of expression at the end of the formula.");
    expect(p.position).toBe(5);
    const [q] = analyseFormula("paw > @ 3", scope).problems;
    expect(q.position).toBe(6);
    expect(q.message).toContain('character 7 ("@ 3")');
  });
});

describe("dimension inference", () => {
  it("accepts a trigger condition", () => {
    const a = analyseFormula("paw < PEEP - sensitivity", scope, DIMENSIONS.boolean);
    expect(a.problems).toEqual([]);
    expect(a.dimension).toEqual(DIMENSIONS.boolean);
  });
  it("reports a time compared with a pressure", () => {
    const a = analyseFormula("tStep > PEEP", scope);
    expect(a.problems).toMatchObject([{ kind: "unit-mismatch", message: "`tStep > PEEP` compares a time with a pressure." }]);
  });
  it("combines by multiplication and division, ignoring scale", () => {
    expect(same(dimOf("Vt / Ti * 60 / 1000"), DIMENSIONS.flow)).toBe(true);
    expect(same(dimOf("60 / RR"), DIMENSIONS.time)).toBe(true);
    expect(same(dimOf("Vt / PEEP"), DIMENSIONS.compliance)).toBe(true);
    expect(same(dimOf("sqrt(Vt * Vt)"), DIMENSIONS.volume)).toBe(true);
    expect(same(dimOf("Ti ^ 2 / Ti"), DIMENSIONS.time)).toBe(true);
  });
  it("lets literals adapt in sums, comparisons, min/max and ternaries", () => {
    expect(same(dimOf("PEEP + 5"), DIMENSIONS.pressure)).toBe(true);
    expect(same(dimOf("max(PEEP, 3)"), DIMENSIONS.pressure)).toBe(true);
    expect(same(dimOf("tStep > 0.5 ? PEEP : 0"), DIMENSIONS.pressure)).toBe(true);
    expect(kinds("vol >= 0.9 * Vt")).toEqual([]);
  });
  it("reports mismatches in sums, functions and ternary branches", () => {
    expect(kinds("PEEP + Ti")).toEqual(["unit-mismatch"]);
    expect(kinds("max(PEEP, Ti)")).toEqual(["unit-mismatch"]);
    expect(kinds("tStep > 1 ? PEEP : Ti")).toEqual(["unit-mismatch"]);
    expect(kinds("exp(Ti)")).toEqual(["unit-mismatch"]);
    expect(kinds("Ti ^ RR")).toEqual(["unit-mismatch"]);
  });
  it("gives booleans for comparisons and logic, and wants conditions in logic", () => {
    expect(dimOf("paw > 3 and not (flow < 0)")).toEqual(DIMENSIONS.boolean);
    expect(kinds("paw > 3 and vol")).toEqual(["unit-mismatch"]);
    expect(dimOf("0 < tStep < Ti")).toEqual(DIMENSIONS.boolean);
    expect(kinds("0 < tStep < PEEP")).toEqual(["unit-mismatch"]);
  });
  it("treats percent and empty units as dimensionless, choices as text", () => {
    expect(kinds("flow < cycleOff / 100 * peakFlow")).toEqual([]);
    expect(kinds('mode == "flow"')).toEqual([]);
    expect(kinds("mode > 2")).toEqual(["unit-mismatch"]);
    expect(kinds('mode == "volume"')).toEqual(["unknown-option"]);
    expect(kinds("Ti * IE")).toEqual([]);
  });
  it("checks the result against what the place expects", () => {
    expect(analyseFormula("RR", scope, DIMENSIONS.time).problems).toMatchObject([
      { kind: "unit-mismatch", message: "`RR` gives a frequency, but a time is expected here." },
    ]);
    expect(analyseFormula("0.5", scope, DIMENSIONS.time).problems).toEqual([]);
    expect(analyseFormula("paw", scope, DIMENSIONS.boolean).problems.map((p) => p.kind)).toEqual(["unit-mismatch"]);
  });
  it("reports unknown names, functions and unsupported syntax, and stays unknown instead of guessing", () => {
    expect(analyseFormula("pawz > 3", scope).problems).toMatchObject([{ kind: "unknown-name", name: "pawz" }]);
    expect(kinds("clamp(paw, 0, 1)")).toEqual(["unknown-function"]);
    expect(kinds("[1, 2]")).toEqual(["unsupported"]);
    expect(dimOf("pawz + 3")).toBe("unknown");
  });
});

describe("units", () => {
  it("maps unit strings to dimensions", () => {
    expect(dimensionOfUnit("L/min")).toEqual(DIMENSIONS.flow);
    expect(dimensionOfUnit("/min")).toEqual(DIMENSIONS.frequency);
    expect(dimensionOfUnit("Hz")).toEqual(DIMENSIONS.frequency);
    expect(dimensionOfUnit("mL/cmH2O")).toEqual(DIMENSIONS.compliance);
    expect(dimensionOfUnit("cmH2O/(L/s)")).toEqual(DIMENSIONS.resistance);
    expect(dimensionOfUnit("%")).toEqual(DIMENSIONS.dimensionless);
    expect(dimensionOfUnit("psi")).toBeNull();
  });
  it("describes dimensions in words", () => {
    expect(describeDimension(DIMENSIONS.flow)).toBe("a flow");
    expect(describeDimension(DIMENSIONS.angle)).toBe("an angle");
    expect(describeDimension(dimensionOfUnit("mL/s^2")!)).toBe("a volume/time^2 quantity");
  });
});

describe("constant verdicts", () => {
  const bounds = rangeEnvironment(settings, "bounds");
  it("decides literal-only conditions", () => {
    expect(guardVerdict("1 < 2", bounds)).toBe("always");
    expect(guardVerdict("2 < 1", bounds)).toBe("never");
    expect(guardVerdict("0.1 + 0.2 == 0.3", bounds)).toBe("always");
  });
  it("knows the clocks never go below zero, and other signals are free", () => {
    expect(guardVerdict("tStep >= 0", bounds)).toBe("always");
    expect(guardVerdict("tBreath < 0", bounds)).toBe("never");
    expect(guardVerdict("paw > 3", bounds)).toBe("depends");
  });
  it("uses the allowed range of bounded settings and the value of unbounded ones", () => {
    expect(guardVerdict("PEEP > 25", bounds)).toBe("never");
    expect(guardVerdict("PEEP > 10", bounds)).toBe("depends");
    expect(guardVerdict("PEEP <= 20 or paw > 0", bounds)).toBe("always");
    expect(guardVerdict("Vt == 500", bounds)).toBe("always");
    expect(guardVerdict('mode == "volume"', bounds)).toBe("never");
    expect(guardVerdict('mode == "flow"', bounds)).toBe("depends");
  });
  it("bounds derived values through their formulas", () => {
    const env = rangeEnvironment({ ...settings, Te: { unit: "s", formula: "60 / RR - Ti" } }, "bounds");
    expect(evaluateRange("Te", env)).toEqual({ kind: "number", lo: 0, hi: 14.7 });
    const saved = rangeEnvironment({ ...settings, Te: { unit: "s", formula: "60 / RR - Ti" } }, "defaults");
    expect(evaluateRange("Te", saved)).toEqual({ kind: "number", lo: 3, hi: 3 });
  });
});
