/**
 * A setting named like a signal (`paw`) would make every formula that reads it ambiguous; a unit we
 * cannot read leaves the setting out of unit checking, which the engineer should know. A `unitBy` must
 * follow a choice setting that has every option it lists a unit for: otherwise the unit it promises
 * is never the one in force.
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { dimensionOfUnit } from "@/machines/formula-analysis";
import { SIGNALS, type Setting } from "@/machines/schema";

export const SETTING_SHADOWS_SIGNAL = "setting-shadows-signal";
export const SETTING_UNIT_UNKNOWN = "setting-unit-unknown";
export const SETTING_UNIT_BY_INVALID = "setting-unit-by-invalid";

const quoted = (xs: readonly string[]): string => xs.map((x) => `"${x}"`).join(", ");

function unitByProblems(name: string, s: Setting, settings: Readonly<Record<string, Setting>>): Problem[] {
  const by = s.unitBy;
  if (!by) return [];
  const target = { type: "setting" as const, setting: name };
  const error = (message: string): Problem => ({ id: SETTING_UNIT_BY_INVALID, severity: "error", message, target });
  if (s.options?.length) return [error(`Setting ${name} is a choice, so it has no unit to take from ${by.setting}; remove its unitBy.`)];
  const choice = settings[by.setting];
  if (!choice) return [error(`Setting ${name} takes its unit from ${by.setting}, which is not a setting of this sequence.`)];
  if (!choice.options?.length) {
    return [error(`Setting ${name} takes its unit from ${by.setting}, which is not a choice setting (it has no options); unitBy must name a choice such as a trigger type.`)];
  }
  const problems: Problem[] = [];
  const extra = Object.keys(by.units).filter((k) => !choice.options!.includes(k));
  if (extra.length > 0) {
    problems.push(
      error(`Setting ${name} lists a unit for ${quoted(extra)}, which ${extra.length > 1 ? "are not choices" : "is not a choice"} of ${by.setting} (${quoted(choice.options)}).`),
    );
  }
  for (const [option, unit] of Object.entries(by.units)) {
    if (dimensionOfUnit(unit) !== null) continue;
    problems.push({
      id: SETTING_UNIT_UNKNOWN,
      severity: "warning",
      message: `Setting ${name} has the unit "${unit}" when ${by.setting} is "${option}", which Tidewright does not recognise, so formulas using it there are not unit-checked.`,
      target,
    });
  }
  return problems;
}

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
    problems.push(...unitByProblems(name, s, ctx.definition.settings));
  }
  return problems;
}
