/**
 * Values with units in the rig profile form. Every numeric field takes a bare number (already in its
 * canonical unit) or a number with units ("0.1 psi", "3 mL/hPa", "15 ms"); the resolver converts each
 * through lib/units before `rigSchema` sees it, so the PUT body and the server's validation are the
 * same as when the form took plain numbers. A unit of the wrong kind is reported at its field, by name.
 */
import { zodResolver } from "@hookform/resolvers/zod";
import { rigSchema, type Rig, type RigInput } from "@/lib/sim/types";
import type { Quantity } from "@/lib/units";
import { canonicalValues, unitResolver, type Canonical as CanonicalOf, type UnitPlace } from "@/components/forms/unit-field";
import { CALIBRATION_FIELDS, PEEP_VALVE_FIELD, RIG_FIELD_GROUPS, type RigField, type RigFormValues } from "./rig-fields";

// The generic reading lives in components/forms/unit-field.ts; re-exported so the rig form's imports stay put.
export { numberOf, readQuantity, type Reading } from "@/components/forms/unit-field";

export function quantityOf(field: RigField, values: RigFormValues): Quantity {
  return typeof field.quantity === "function" ? field.quantity(values) : field.quantity;
}

/** Every numeric place in the form, with the label its errors name. */
function locations(values: RigFormValues): UnitPlace[] {
  const places: UnitPlace[] = RIG_FIELD_GROUPS.flatMap((g) => g.fields).map((f) => ({
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

export type Canonical = CanonicalOf<RigInput>;

/** The form's values with every number in its canonical unit, and the fields that could not be read. */
export function toCanonical(values: RigFormValues): Canonical {
  return canonicalValues<RigFormValues, RigInput>(values, locations(values));
}

/** `rigSchema`'s resolver behind the unit conversion (unit errors win at the same field). */
export const rigResolver = unitResolver<RigFormValues, RigInput, Rig>(zodResolver(rigSchema), locations);
