/**
 * Current values of derived settings (those with a formula), for the table to show next to the
 * formula. Derived settings may use each other, so evaluation repeats until nothing new resolves.
 */
import { evaluateNumber, type FormulaScope } from "@/machines/formula";
import type { Setting } from "@/machines/schema";

export type DerivedValue = { ok: true; value: number } | { ok: false; error: string };

export function derivedValues(settings: Readonly<Record<string, Setting>>): Record<string, DerivedValue> {
  const scope: FormulaScope = {};
  for (const [k, s] of Object.entries(settings)) if (!s.formula && s.value !== undefined) scope[k] = s.value;
  const pending = Object.entries(settings).filter(([, s]) => s.formula);
  const out: Record<string, DerivedValue> = {};
  for (let round = 0; round <= pending.length; round++) {
    let progressed = false;
    for (const [k, s] of pending) {
      if (k in scope) continue;
      try {
        const v = evaluateNumber(s.formula as string, scope);
        scope[k] = v;
        out[k] = { ok: true, value: v };
        progressed = true;
      } catch (err) {
        out[k] = { ok: false, error: err instanceof Error ? err.message : String(err) };
      }
    }
    if (!progressed) break;
  }
  return out;
}
