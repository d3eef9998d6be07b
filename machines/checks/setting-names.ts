/**
 * A setting named like a signal (`paw`) would make every formula that reads it ambiguous; a unit we
 * cannot read leaves the setting out of unit checking, which the engineer should know.
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { dimensionOfUnit } from "@/machines/formula-analysis";
import { SIGNALS } from "@/machines/schema";

export const SETTING_SHADOWS_SIGNAL = "setting-shadows-signal";
export const SETTING_UNIT_UNKNOWN = "setting-unit-unknown";

export function checkSettingNames(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  for (const [name, s] of Object.entries(ctx.definition.settings)) {
    const target = { type: "setting" as const, setting: name };
    if (name in SIGNALS) {
      problems.push({
        id: SETTING_SHADOWS_SIGNAL,
        severity: "error",
        message: `Setting ${name} has the name of a live signal, so formulas could not tell them apart; rename the setting.`,
        target,
      });
    }
    const choice = (s.options?.length ?? 0) > 0 || typeof s.value === "string";
    if (!choice && dimensionOfUnit(s.unit ?? "") === null) {
      problems.push({
        id: SETTING_UNIT_UNKNOWN,
        severity: "warning",
        message: `Setting ${name} has the unit "${s.unit}", which Tidewright does not recognise, so formulas using it are not unit-checked. Use a canonical unit (cmH2O, mL, L/min, s, /min, deg, Hz, %) or none.`,
        target,
      });
    }
  }
  return problems;
}
