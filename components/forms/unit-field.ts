/**
 * Values with units in a form. A numeric field takes a bare number (already in its canonical unit) or a
 * number with units ("0.1 psi", "3 mL/hPa", "15 ms"). The resolver here converts each such field through
 * lib/units before the form's own schema resolver sees the values. That way the request body and the
 * server's validation stay exactly what they were when the form took plain numbers. A unit of the wrong
 * kind is reported at its field, by the field's name.
 *
 * Shared by the rig profile form (components/sequences/rig-units.ts) and the patient case form
 * (components/cases/case-units.ts). Each of them only says which paths hold numbers and how to read them.
 */
import { get, set, type FieldErrors, type FieldValues, type Resolver, type ResolverOptions } from "react-hook-form";
import { UnitError, parseQuantity, type Quantity } from "@/lib/units";

/** A form's values while the user types: every number may be text with units until the resolver converts it. */
export type Editable<T> = T extends number
  ? number | string
  : T extends readonly (infer U)[]
    ? Editable<U>[]
    : T extends object
      ? { [K in keyof T]: Editable<T[K]> }
      : T;

export type Reading = { ok: true; value: number; converted: boolean } | { ok: false; error: string };

/** Read one typed value as `quantity`; `converted` says units were typed (so the form shows the result). */
export function readQuantity(value: unknown, quantity: Quantity): Reading {
  try {
    if (typeof value === "number") return { ok: true, value: parseQuantity(value, quantity), converted: false };
    const text = typeof value === "string" ? value : "";
    const n = parseQuantity(text, quantity);
    return { ok: true, value: n, converted: !Number.isFinite(Number(text.trim())) };
  } catch (err) {
    if (err instanceof UnitError) return { ok: false, error: err.message };
    throw err;
  }
}

/**
 * Read a value whose unit lib/units has no quantity for (cmH2O/L², L/min per cmH2O, a fraction): only a
 * bare number in `unit` is taken. Units are refused rather than ignored. Otherwise "30 %" would be
 * stored as 30 where 0.3 was meant.
 */
export function readBare(value: unknown, unit: string): Reading {
  const expected = `expected a plain number (${unit})`;
  if (typeof value === "number") {
    return Number.isFinite(value) ? { ok: true, value, converted: false } : { ok: false, error: `${expected}, got ${value}` };
  }
  const text = typeof value === "string" ? value.trim() : "";
  if (text === "") return { ok: false, error: `${expected}, got nothing` };
  const n = Number(text);
  return Number.isFinite(n) ? { ok: true, value: n, converted: false } : { ok: false, error: `${expected}, got "${text}"` };
}

/** How a field's text is read: through a lib/units quantity, or (null) as a bare number only. */
export type UnitKind = Quantity | null;

export function readValue(value: unknown, kind: UnitKind, unit: string): Reading {
  return kind === null ? readBare(value, unit) : readQuantity(value, kind);
}

/** "= 49.0333 mL/cmH2O" for a value typed with units, so the stored number is visible; null otherwise. */
export function convertedText(r: Reading, unit: string): string | null {
  return r.ok && r.converted ? `= ${Number(r.value.toPrecision(6))} ${unit}` : null;
}

/** The number a typed value stands for, or NaN: for plots and derived values while typing. */
export function numberOf(value: unknown, quantity: Quantity): number {
  const r = readQuantity(value, quantity);
  return r.ok ? r.value : NaN;
}

/** One numeric place in a form: its path, the label its errors name, and how its text is read. */
export interface UnitPlace {
  path: string;
  label: string;
  /** Canonical unit shown beside the field; used in the message when only a bare number is taken. */
  unit: string;
  quantity: UnitKind;
}

export interface Canonical<T> {
  values: T;
  problems: Array<{ path: string; message: string }>;
}

/** The form's values with every listed number in its canonical unit, and the places that could not be read. */
export function canonicalValues<TForm, TInput>(values: TForm, places: UnitPlace[]): Canonical<TInput> {
  // Form values are plain data (no refs), so a deep copy is safe and leaves the form's own state alone.
  const out = structuredClone(values) as object;
  const problems: Canonical<TInput>["problems"] = [];
  for (const place of places) {
    const r = readValue(get(values, place.path), place.quantity, place.unit);
    if (r.ok) set(out, place.path, r.value);
    else problems.push({ path: place.path, message: `${place.label}: ${r.error}` });
  }
  // Every listed leaf is now a number (the unreadable ones are reported and the result is not used).
  return { values: out as TInput, problems };
}

/**
 * `inner` (the form's schema resolver) behind the unit conversion. Unit errors take precedence over the
 * schema's at the same field: "expected a pressure, got 3 mL" says more than "must be a number".
 */
export function unitResolver<TForm extends FieldValues, TInput extends FieldValues, TOutput>(
  inner: Resolver<TInput, unknown, TOutput>,
  placesOf: (values: TForm) => UnitPlace[],
): Resolver<TForm, unknown, TOutput> {
  return async (values, context, options) => {
    const { values: canonical, problems } = canonicalValues<TForm, TInput>(values, placesOf(values));
    // The options carry field names and refs, not values; they are the same under either value type.
    const result = await inner(canonical, context, options as unknown as ResolverOptions<TInput>);
    const errors = result.errors as FieldErrors<TForm>;
    for (const p of problems) set(errors, p.path, { type: "units", message: p.message });
    if (Object.keys(errors).length > 0) return { values: {}, errors };
    return { values: result.values as TOutput, errors: {} };
  };
}
