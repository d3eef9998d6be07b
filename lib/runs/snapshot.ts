/**
 * What a run simulated: the patient and rig copies stored on the run row when it was started
 * (runs.patient, runs.rig_body), read back through the engine's schemas, and whether the case has
 * moved on since. Shared by the runs API (lib/runs/service.ts) and the run page.
 */
import "server-only";
import { isDeepStrictEqual } from "node:util";
import type { z } from "zod";
import type { RunRecord } from "@/db/queries/runs";
import { patientSchema, rigSchema, type Patient, type Rig } from "@/lib/sim/types";

export interface RunInputs {
  /** The patient body as simulated; null on runs stored before the copy was kept. */
  patient: Patient | null;
  /** The rig as simulated; null for the "ideal" circuit (and on runs stored before the copy was kept). */
  rigProfile: Rig | null;
  /** The case's current body differs from the one simulated (or the case cannot be read any more). */
  caseChangedSinceRun: boolean;
}

/** Parse a stored copy; a copy that no longer parses is logged and shown as missing rather than guessed at. */
function parseStored<T>(what: string, runId: string, raw: unknown, schema: z.ZodType<T>): T | null {
  if (raw === null || raw === undefined) return null;
  const parsed = schema.safeParse(raw);
  if (parsed.success) return parsed.data;
  console.error(`[runs] stored ${what} of run ${runId} does not parse`, parsed.error.issues);
  return null;
}

export function runInputs(run: RunRecord): RunInputs {
  const patient = parseStored("patient", run.id, run.patient, patientSchema);
  const rigProfile = parseStored("rig", run.id, run.rigBody, rigSchema);
  let caseChangedSinceRun = false;
  if (run.case) {
    if (patient) {
      // Both sides through the schema, so a default filled in on one side only is not a difference;
      // jsonb does not keep key order, and isDeepStrictEqual ignores it.
      const current = patientSchema.safeParse(run.case.body);
      caseChangedSinceRun = !current.success || !isDeepStrictEqual(current.data, patient);
    } else {
      // A run from before the copy was kept: an edit after the run is all we can tell.
      caseChangedSinceRun = run.case.updatedAt > run.createdAt;
    }
  }
  return { patient, rigProfile, caseChangedSinceRun };
}
