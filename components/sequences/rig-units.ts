/**
 * Values with units in the rig profile form. Every numeric field takes a bare number (already in its
 * canonical unit) or a number with units ("0.1 psi", "3 mL/hPa", "15 ms"); the resolver converts each
 * through lib/units before `rigSchema` sees it, so the PUT body and the server's validation are the
 * same as when the form took plain numbers. A unit of the wrong kind is reported at its field, by name.
 */
import { get, set, type FieldErrors, type Resolver, type ResolverOptions } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { rigSchema, type Rig, type RigInput } from "@/lib/sim/types";
import { UnitError, parseQuantity, type Quantity } from "@/lib/units";
import { CALIBRATION_FIELDS, PEEP_VALVE_FIELD, RIG_FIELD_GROUPS, type RigField, type RigFormValues } from "./rig-fields";

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

/** The number a typed value stands for, or NaN: for the calibration plot and new rows while typing. */
export function numberOf(value: unknown, quantity: Quantity): number {
  const r = readQuantity(value, quantity);
  return r.ok ? r.value : NaN;
}

export function quantityOf(field: RigField, values: RigFormValues): Quantity {
  return typeof field.quantity === "function" ? field.quantity(values) : field.quantity;
}

interface Located {
  path: string;
  label: string;
  unit: string;
  quantity: Quantity;
}

/** Every numeric place in the form, with the label its errors name. */
function locations(values: RigFormValues): Located[] {
  const places: Located[] = RIG_FIELD_GROUPS.flatMap((g) => g.fields).map((f) => ({
    path: f.path,
    label: f.label,
    unit: f.unit,
    quantity: quantityOf(f, values),
  }));
  // null: the valve follows the sequence's PEEP, nothing to read.
  if (values.peepValveCmH2O !== null && values.peepValveCmH2O !== undefined) {
    places.push({ path: PEEP_VALVE_FIELD.path, label: PEEP_VALVE_FIELD.label, unit: PEEP_VALVE_FIELD.unit, quantity: "pressure" });
  }
  (values.bagCalibration ?? []).forEach((_, i) => {
    for (const [key, f] of Object.entries(CALIBRATION_FIELDS)) {
      places.push({ path: `bagCalibration.${i}.${key}`, label: `${f.label} of point ${i + 1}`, unit: f.unit, quantity: f.quantity });
    }
  });
  return places;
}

export interface Canonical {
  values: RigInput;
  problems: Array<{ path: string; message: string }>;
}

/** The form's values with every number in its canonical unit, and the fields that could not be read. */
export function toCanonical(values: RigFormValues): Canonical {
  // Form values are plain data (no refs), so a deep copy is safe and leaves the form's own state alone.
  const out = structuredClone(values);
  const problems: Canonical["problems"] = [];
  for (const place of locations(values)) {
    const r = readQuantity(get(values, place.path), place.quantity);
    if (r.ok) set(out, place.path, r.value);
    else problems.push({ path: place.path, message: `${place.label}: ${r.error}` });
  }
  // Every numeric leaf is now a number (the unreadable ones are reported and the result is not used).
  return { values: out as RigInput, problems };
}

const zod = zodResolver(rigSchema);

/**
 * `rigSchema`'s resolver behind the unit conversion. Unit errors take precedence over the schema's at
 * the same field: "expected a pressure, got 3 mL" says more than "must be a number".
 */
export const rigResolver: Resolver<RigFormValues, unknown, Rig> = async (values, context, options) => {
  const { values: canonical, problems } = toCanonical(values);
  const result = await zod(canonical, context, options as unknown as ResolverOptions<RigInput>);
  const errors = result.errors as FieldErrors<RigFormValues>;
  for (const p of problems) set(errors, p.path, { type: "units", message: p.message });
  if (Object.keys(errors).length > 0) return { values: {}, errors };
  return { values: result.values as Rig, errors: {} };
};
