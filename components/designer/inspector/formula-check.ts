/**
 * As-you-type analysis of one formula field (machines/formula-analysis, the checks' own core, so the
 * field and the problems panel never disagree). Syntax errors and unknown names block applying the
 * edit — the sequence could not run; a unit mismatch is shown but applied, and the static checks
 * decide at save time.
 */
import {
  DIMENSIONS,
  analyseFormula,
  describeDimension,
  dimensionOfUnit,
  formulaScope,
  type Expectation,
  type FormulaProblem,
  type FormulaScope,
} from "@/machines/formula-analysis";
import type { Setting } from "@/machines/schema";

export type FormulaPlace = "flow" | "pressure" | "time" | "angle" | "pulse-rate" | "condition" | "any" | { unit: string };

export const PLACE_UNITS: Record<Exclude<FormulaPlace, { unit: string }>, string> = {
  flow: "L/min",
  pressure: "cmH2O",
  time: "s",
  angle: "deg",
  "pulse-rate": "Hz",
  condition: "true/false",
  any: "",
};

export function expectationFor(place: FormulaPlace): Expectation {
  if (typeof place === "object") return dimensionOfUnit(place.unit) ?? "any";
  switch (place) {
    case "flow":
      return DIMENSIONS.flow;
    case "pressure":
      return DIMENSIONS.pressure;
    case "time":
      return DIMENSIONS.time;
    case "angle":
      return DIMENSIONS.angle;
    case "pulse-rate":
      return DIMENSIONS.frequency;
    case "condition":
      return DIMENSIONS.boolean;
    case "any":
      return "any";
  }
}

const scopes = new WeakMap<Readonly<Record<string, Setting>>, FormulaScope>();

export function scopeFor(settings: Readonly<Record<string, Setting>>): FormulaScope {
  let scope = scopes.get(settings);
  if (!scope) {
    scope = formulaScope(settings);
    scopes.set(settings, scope);
  }
  return scope;
}

const BLOCKING: ReadonlySet<FormulaProblem["kind"]> = new Set([
  "syntax",
  "unknown-name",
  "unknown-function",
  "unsupported",
  "unknown-option",
]);

export interface FormulaCheck {
  blocking: FormulaProblem[];
  advisory: FormulaProblem[];
  /** What the formula computes, in words ("a pressure"), when it parses. */
  gives: string | null;
}

export function checkFormula(expr: string, settings: Readonly<Record<string, Setting>>, place: FormulaPlace): FormulaCheck {
  if (expr.trim() === "") return { blocking: [{ kind: "syntax", message: "Enter a formula." }], advisory: [], gives: null };
  const analysis = analyseFormula(expr, scopeFor(settings), expectationFor(place));
  return {
    blocking: analysis.problems.filter((p) => BLOCKING.has(p.kind)),
    advisory: analysis.problems.filter((p) => !BLOCKING.has(p.kind)),
    gives: analysis.ast ? describeDimension(analysis.dimension) : null,
  };
}
