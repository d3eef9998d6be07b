/**
 * Read a value typed with or without units ("0.1 psi", "3 mL/hPa", "12") into a setting's canonical
 * unit, through the product's unit parser (lib/units), as a result the table can show.
 */
import { parseSettingValue, UnitError } from "@/lib/units";

export type QuantityResult = { ok: true; value: number; converted: boolean } | { ok: false; error: string };

export function parseQuantity(input: string, canonicalUnit: string): QuantityResult {
  const text = input.trim();
  if (text === "") return { ok: false, error: "Enter a value." };
  try {
    const value = parseSettingValue(text, canonicalUnit);
    return { ok: true, value, converted: !Number.isFinite(Number(text)) };
  } catch (err) {
    if (err instanceof UnitError) return { ok: false, error: `${err.message[0].toUpperCase()}${err.message.slice(1)}.` };
    throw err;
  }
}

/** A value for display in its canonical unit: enough digits to be exact about what was typed, no float noise. */
export function formatQuantity(value: number, unit: string): string {
  const rounded = Number(value.toPrecision(6));
  return unit ? `${rounded} ${unit}` : String(rounded);
}
