/** Formulas that do not parse, or use constructs (assignment, lists, blocks) the engine refuses. */
import type { CheckContext } from "@/machines/checks/context";
import { formulaProblems } from "@/machines/checks/formula-problems";
import type { Problem } from "@/machines/checks/types";

export const FORMULA_SYNTAX = "formula-syntax";
export const FORMULA_UNSUPPORTED = "formula-unsupported";

export function checkFormulaSyntax(ctx: CheckContext): Problem[] {
  return [...formulaProblems(ctx, "syntax", FORMULA_SYNTAX), ...formulaProblems(ctx, "unsupported", FORMULA_UNSUPPORTED)];
}
