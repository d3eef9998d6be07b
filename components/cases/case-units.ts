/**
 * Values with units in the patient case form. The numeric fields of `patientSchema` take a bare number
 * (already canonical) or a number with units ("50 mL/hPa", "10 hPa/(L/s)", "800 ms"). The resolver
 * converts them through lib/units before `createCaseBody` sees them, so the POST/PATCH bodies stay the
 * canonical numbers the server validates (components/forms/unit-field.ts).
 */
import type { FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { createCaseBody, type CreateCaseBody, type CreateCaseInput } from "@/lib/validation/cases";
import { unitResolver, type Editable, type UnitKind, type UnitPlace } from "@/components/forms/unit-field";

export type CaseFormValues = Editable<CreateCaseInput>;

export interface CaseField {
  path: FieldPath<CaseFormValues>;
  label: string;
  /** The canonical unit the value is stored in, shown beside the input. */
  unit: string;
  /**
   * The lib/units quantity typed units are converted as. null: lib/units has no such quantity
   * (cmH2O/L², L/min per cmH2O, a fraction), so only a bare number is taken.
   */
  quantity: UnitKind;
  hint?: string;
}

export const LUNG_FIELDS: CaseField[] = [
  { path: "patient.complianceMlPerCmH2O", label: "Compliance", unit: "mL/cmH2O", quantity: "compliance" },
  { path: "patient.resistanceCmH2OPerLps", label: "Resistance", unit: "cmH2O/(L/s)", quantity: "resistance" },
  {
    path: "patient.e2CmH2OPerL2",
    label: "Non-linear elastance E2",
    unit: "cmH2O/L²",
    quantity: null,
    hint: "0 for a linear lung. A bare number in cmH2O/L².",
  },
];

export const EFFORT_FIELDS: CaseField[] = [
  { path: "patient.effort.amplitudeCmH2O", label: "Peak muscle pressure", unit: "cmH2O", quantity: "pressure" },
  { path: "patient.effort.ratePerMin", label: "Rate", unit: "/min", quantity: "rate" },
  { path: "patient.effort.effortTimeS", label: "Effort time", unit: "s", quantity: "time" },
  { path: "patient.effort.onsetS", label: "First onset", unit: "s", quantity: "time" },
  // lib/units reads "30 %" as 30 (for settings kept in %), not 0.3, so the fraction takes a bare number.
  { path: "patient.effort.variability", label: "Variability", unit: "fraction", quantity: null, hint: "0 = regular, 0.3 = ±30 %." },
];

/**
 * The leak coefficient's unit follows the model: the orifice one is a flow (L/min at 10 cmH2O) and
 * converts as one. lib/units has no flow-per-pressure quantity, so the linear one takes a bare number.
 */
export function leakField(kind: unknown): CaseField {
  const path = "patient.leak.coefficient";
  const label = "Leak coefficient";
  if (kind === "linear") return { path, label, unit: "L/min per cmH2O", quantity: null, hint: "Linear: L/min per cmH2O, a bare number." };
  if (kind === "orifice") return { path, label, unit: "L/min", quantity: "flow", hint: "Orifice: L/min at 10 cmH2O." };
  // No leak: the coefficient is not used; read it as the orifice flow so a leftover value still passes.
  return { path, label, unit: "L/min", quantity: "flow", hint: "Orifice: L/min at 10 cmH2O. Linear: L/min per cmH2O." };
}

export function caseFields(values: CaseFormValues): CaseField[] {
  return [...LUNG_FIELDS, ...EFFORT_FIELDS, leakField(values.patient?.leak?.kind)];
}

const places = (values: CaseFormValues): UnitPlace[] =>
  caseFields(values).map(({ path, label, unit, quantity }) => ({ path, label, unit, quantity }));

/** `createCaseBody`'s resolver (the handler's schema) behind the unit conversion. */
export const caseResolver = unitResolver<CaseFormValues, CreateCaseInput, CreateCaseBody>(zodResolver(createCaseBody), places);
