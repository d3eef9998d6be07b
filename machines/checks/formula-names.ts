/**
 * Formulas naming signals, settings, functions or choice options that do not exist: the formula would
 * fail (or, for an option, silently never match) when the sequence runs.
 */
import type { CheckContext } from "@/machines/checks/context";
import { formulaProblems } from "@/machines/checks/formula-problems";
import type { Problem } from "@/machines/checks/types";

export const FORMULA_UNKNOWN_NAME = "formula-unknown-name";
export const FORMULA_UNKNOWN_FUNCTION = "formula-unknown-function";
export const FORMULA_UNKNOWN_OPTION = "formula-unknown-option";

export function checkFormulaNames(ctx: CheckContext): Problem[] {
  return [
    ...formulaProblems(ctx, "unknown-name", FORMULA_UNKNOWN_NAME),
    ...formulaProblems(ctx, "unknown-function", FORMULA_UNKNOWN_FUNCTION),
    ...formulaProblems(ctx, "unknown-option", FORMULA_UNKNOWN_OPTION),
  ];
}
