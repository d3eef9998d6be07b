/** Checks for the settings table's cells, each returning the sentence shown under the cell. */
import { dimensionOfUnit } from "@/machines/formula-analysis";
import { identifier, SIGNALS, type Setting } from "@/machines/schema";
import { checkFormula } from "../inspector/formula-check";
import { formatQuantity, parseQuantity } from "./parse-quantity";

export type CellCheck = { error: string | null; hint?: string | null };

export function checkSettingName(draft: string, current: string, settings: Readonly<Record<string, Setting>>): CellCheck {
  const parsed = identifier.safeParse(draft);
  if (!parsed.success) return { error: parsed.error.issues[0]?.message ?? "not a valid name" };
  if (draft in SIGNALS) return { error: `${draft} is a signal's name; choose another.` };
  if (draft !== current && draft in settings) return { error: "another setting has this name" };
  return { error: null, hint: draft !== current ? "formulas using the old name are updated" : null };
}

/** `unit` is the setting's effective unit (schema `effectiveUnit`): a unitBy setting converts by the current choice. */
export function checkValue(draft: string, s: Setting, unit: string = s.unit): CellCheck & { value?: number } {
  const r = parseQuantity(draft, unit);
  if (!r.ok) return { error: r.error };
  if (s.min !== undefined && r.value < s.min) return { error: `below the minimum, ${formatQuantity(s.min, unit)}` };
  if (s.max !== undefined && r.value > s.max) return { error: `above the maximum, ${formatQuantity(s.max, unit)}` };
  return { error: null, hint: r.converted ? `= ${formatQuantity(r.value, unit)}` : null, value: r.value };
}

export function checkBound(draft: string, s: Setting, which: "min" | "max", unit: string = s.unit): CellCheck & { value?: number | undefined } {
  if (draft.trim() === "") return { error: null, hint: "no bound", value: undefined };
  const r = parseQuantity(draft, unit);
  if (!r.ok) return { error: r.error };
  if (which === "min" && s.max !== undefined && r.value > s.max) return { error: "the minimum is above the maximum" };
  if (which === "max" && s.min !== undefined && r.value < s.min) return { error: "the maximum is below the minimum" };
  return { error: null, hint: r.converted ? `= ${formatQuantity(r.value, unit)}` : null, value: r.value };
}

export function checkUnit(draft: string): CellCheck {
  if (draft.length > 20) return { error: "keep units to 20 characters" };
  return dimensionOfUnit(draft) === null
    ? { error: null, hint: "not a unit the checks know: values are read as plain numbers" }
    : { error: null };
}

export function checkSettingFormula(draft: string, name: string, settings: Readonly<Record<string, Setting>>): CellCheck {
  if (draft.trim() === "") return { error: null, hint: "no formula: the value is set directly" };
  const s = settings[name];
  const c = checkFormula(draft, settings, { unit: s?.unit ?? "" });
  if (c.blocking[0]) return { error: c.blocking[0].message };
  return { error: null, hint: c.advisory[0]?.message ?? null };
}
