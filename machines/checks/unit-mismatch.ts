/**
 * Formulas whose dimensions do not agree (a time compared with a pressure), or that produce the wrong
 * kind of value for their place (a timer that is a volume, a condition that is a flow).
 */
import type { CheckContext } from "@/machines/checks/context";
import { formulaProblems } from "@/machines/checks/formula-problems";
import type { Problem } from "@/machines/checks/types";

export const UNIT_MISMATCH = "unit-mismatch";

export function checkUnitMismatch(ctx: CheckContext): Problem[] {
  return formulaProblems(ctx, "unit-mismatch", UNIT_MISMATCH);
}
