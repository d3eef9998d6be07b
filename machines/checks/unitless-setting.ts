/**
 * A setting declared without a unit adapts to whatever it meets, like a literal, so its formulas pass
 * the unit check; we still say where it stood in for a pressure, a flow and so on, because that is
 * exactly where a unit mistake could hide. A warning: the sequence may well be right.
 */
import type { CheckContext } from "@/machines/checks/context";
import { formulaProblems } from "@/machines/checks/formula-problems";
import type { Problem } from "@/machines/checks/types";

export const UNITLESS_SETTING = "unitless-setting";

export function checkUnitlessSettings(ctx: CheckContext): Problem[] {
  return formulaProblems(ctx, "unitless-setting", UNITLESS_SETTING, "warning");
}
