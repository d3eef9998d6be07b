/**
 * Settings whose saved value breaks their own declaration: outside min..max, bounds the wrong way
 * round, a choice that is not among the options, or no value at all. A derived setting is judged by
 * the value its formula gives from the saved values of the settings it reads.
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { evaluateRange } from "@/machines/formula-analysis";
import type { Setting } from "@/machines/schema";

export const SETTING_OUT_OF_RANGE = "setting-out-of-range";
export const SETTING_BOUNDS_INVERTED = "setting-bounds-inverted";
export const SETTING_INVALID_CHOICE = "setting-invalid-choice";
export const SETTING_NO_VALUE = "setting-no-value";

const show = (x: number, unit: string | undefined): string => `${Number(x.toPrecision(6))}${unit ? ` ${unit}` : ""}`;

function valueOf(ctx: CheckContext, name: string, s: Setting): number | string | null {
  if (!s.formula) return s.value ?? null;
  const r = evaluateRange(s.formula, ctx.defaults);
  if (r.kind === "number" && r.lo === r.hi) return r.lo;
  if (r.kind === "text" && r.values?.length === 1) return r.values[0];
  return null;
}

function problemsOf(ctx: CheckContext, name: string, s: Setting): Problem[] {
  const target = { type: "setting" as const, setting: name };
  const problem = (id: string, message: string): Problem => ({ id, severity: "error", message, target });
  if (s.min !== undefined && s.max !== undefined && s.min > s.max) {
    return [problem(SETTING_BOUNDS_INVERTED, `Setting ${name} has a minimum (${show(s.min, s.unit)}) above its maximum (${show(s.max, s.unit)}).`)];
  }
  const value = valueOf(ctx, name, s);
  const derived = s.formula ? ` (from its formula \`${s.formula}\`)` : "";
  if (value === null) {
    return s.formula ? [] : [problem(SETTING_NO_VALUE, `Setting ${name} has no value and no formula.`)];
  }
  if (s.options && s.options.length > 0) {
    if (typeof value !== "string" || !s.options.includes(value)) {
      return [problem(SETTING_INVALID_CHOICE, `Setting ${name} is ${JSON.stringify(value)}${derived}, which is not one of its choices (${s.options.map((o) => `"${o}"`).join(", ")}).`)];
    }
    return [];
  }
  if (typeof value !== "number") return [];
  if (s.min !== undefined && value < s.min) {
    return [problem(SETTING_OUT_OF_RANGE, `Setting ${name} is ${show(value, s.unit)}${derived}, below its minimum of ${show(s.min, s.unit)}.`)];
  }
  if (s.max !== undefined && value > s.max) {
    return [problem(SETTING_OUT_OF_RANGE, `Setting ${name} is ${show(value, s.unit)}${derived}, above its maximum of ${show(s.max, s.unit)}.`)];
  }
  return [];
}

export function checkSettingValues(ctx: CheckContext): Problem[] {
  return Object.entries(ctx.definition.settings).flatMap(([name, s]) => problemsOf(ctx, name, s));
}
