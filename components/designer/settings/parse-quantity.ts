/**
 * Read a value typed with or without units ("0.1 psi", "3 mL/hPa", "12") into the setting's
 * canonical unit. Interim: lib/units.ts (engine) is the product's unit parser; until it lands this uses
 * mathjs units directly, with rates (/min, bpm) handled by hand because mathjs cannot convert to "1/min".
 */
import { unit as mathUnit } from "mathjs";

export type QuantityResult = { ok: true; value: number; converted: boolean } | { ok: false; error: string };

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
const RATE_PER_MIN: Record<string, number> = { "/min": 1, bpm: 1, "1/min": 1, "/s": 60, Hz: 60, "1/s": 60 };

function rate(text: string, canonical: string): QuantityResult | null {
  const m = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:e[-+]?\d+)?)\s*(\/min|bpm|1\/min|\/s|Hz|1\/s)$/i.exec(text);
  if (!m) return null;
  const perMin = Number(m[1]) * (RATE_PER_MIN[m[2]] ?? RATE_PER_MIN[m[2].toLowerCase()] ?? 1);
  if (canonical === "/min") return { ok: true, value: perMin, converted: m[2] !== "/min" };
  if (canonical === "Hz") return { ok: true, value: perMin / 60, converted: m[2] !== "Hz" };
  return { ok: false, error: `${m[2]} is a rate; this setting is in ${canonical || "plain numbers"}.` };
}

export function parseQuantity(input: string, canonical: string): QuantityResult {
  const text = input.trim().replace(/,/g, ".");
  if (text === "") return { ok: false, error: "Enter a value." };
  if (NUMBER.test(text)) return { ok: true, value: Number(text), converted: false };
  const asRate = rate(text, canonical);
  if (asRate) return asRate;
  if (canonical === "" || canonical === "%") return { ok: false, error: "This setting takes a plain number." };
  try {
    const u = mathUnit(text);
    if (u.value === null) return { ok: false, error: `Give a number with the unit, e.g. "5 ${canonical}".` };
    const value = u.toNumber(canonical);
    if (!Number.isFinite(value)) return { ok: false, error: "That value is not a finite number." };
    return { ok: true, value, converted: true };
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err);
    if (/do not match/i.test(msg)) return { ok: false, error: `"${text}" cannot be converted to ${canonical}.` };
    return { ok: false, error: `"${text}" is not a number with a known unit (try "5 ${canonical}").` };
  }
}

/** A value for display in its canonical unit: enough digits to be exact about what was typed, no float noise. */
export function formatQuantity(value: number, unit: string): string {
  const rounded = Number(value.toPrecision(6));
  return unit ? `${rounded} ${unit}` : String(rounded);
}
