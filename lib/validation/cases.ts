/**
 * Payloads of the patient case API (/api/cases/**). Shared by the case form (resolver) and the handlers.
 * The lung/effort/leak body is `patientSchema` from the engine contract (lib/sim/types.ts).
 */
import { z } from "zod";
import { patientSchema } from "@/lib/sim/types";
import { canEditPatientCases } from "@/lib/auth/roles";

/** Engineers, clinicians and admins create and edit cases; viewers read (lib/auth/roles.ts "cases:edit"). */
export const canEditCases = canEditPatientCases;

export const caseName = z
  .string({ error: "name must be text" })
  .trim()
  .min(1, "give the case a name")
  .max(120, "keep the name to 120 characters");

export const caseDescription = z.string({ error: "description must be text" }).trim().max(2000, "keep the description to 2000 characters");

/** Where the numbers come from: a citation, or "memory" / "common practice" (the tags for values without a single source). */
export const caseSource = z.string({ error: "source must be text" }).trim().max(500, "keep the source to 500 characters");

export const createCaseBody = z
  .object({
    name: caseName,
    description: caseDescription.default(""),
    source: caseSource.default(""),
    patient: patientSchema,
  })
  .strict();
export type CreateCaseBody = z.infer<typeof createCaseBody>;
export type CreateCaseInput = z.input<typeof createCaseBody>;

export const patchCaseBody = z
  .object({
    name: caseName.optional(),
    description: caseDescription.optional(),
    source: caseSource.optional(),
    patient: patientSchema.optional(),
  })
  .strict()
  .refine((b) => Object.values(b).some((v) => v !== undefined), { message: "nothing to change" });
export type PatchCaseBody = z.infer<typeof patchCaseBody>;

export const caseIdParams = z.object({ id: z.uuid() });
