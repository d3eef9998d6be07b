/**
 * A run records what it simulated: the patient body and the rig handed to the engine are stored on the
 * run row, so editing the case (PATCH /api/cases/:id) or the project rig (PUT /api/projects/:id/rig)
 * afterwards leaves GET /api/runs/:id showing the values simulated, and `caseChangedSinceRun` compares
 * the stored patient with the case's current body.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { POST as createRunRoute } from "@/app/api/runs/route";
import { GET as getRunRoute } from "@/app/api/runs/[id]/route";
import { POST as createCaseRoute } from "@/app/api/cases/route";
import { PATCH as patchCaseRoute } from "@/app/api/cases/[id]/route";
import { PUT as putRigRoute } from "@/app/api/projects/[id]/rig/route";
import { runs } from "@/db/schema";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { patientSchema, rigSchema, type Patient, type PatientInput, type Rig, type Summary } from "@/lib/sim/types";
import { settleLiveRuns, type RunView } from "@/lib/runs/service";
import { simulationPool } from "@/lib/runs/pool";
import { runReadCache } from "@/lib/runs/read-cache";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { newRevision, templateDefinition, unique } from "@/tests/unit/runs/fixtures";

let t: TestDb;
let revisionId: string;

type Created = { id: string; status: string; summary: Summary | null; error: string | null };

const PATIENT: PatientInput = {
  complianceMlPerCmH2O: 42,
  resistanceCmH2OPerLps: 11,
  e2CmH2OPerL2: 3,
  effort: { shape: "half-sine", amplitudeCmH2O: 4, ratePerMin: 14, effortTimeS: 0.9, onsetS: 1.5, variability: 0.1 },
  leak: { kind: "orifice", coefficient: 5 },
};
const RIG_A: Rig = { ...rigSchema.parse(DEFAULT_RIG), name: "Snapshot rig A", reliefValveCmH2O: 45, scanPeriodS: 0.005 };
const RIG_B: Rig = { ...RIG_A, name: "Snapshot rig B", reliefValveCmH2O: 30, circuit: { ...RIG_A.circuit, complianceMlPerCmH2O: 3 } };

beforeAll(async () => {
  t = await openTestDb();
  // This file has its own database copy, so the demo project's rig may be changed here.
  revisionId = await newRevision(t, t.team.projectId, templateDefinition("pressure-control"));
}, 120_000);

afterAll(async () => {
  await settleLiveRuns();
  await simulationPool().shutdown();
  await t.close();
});

async function newCase(patient: PatientInput): Promise<string> {
  const res = await t.call<{ id: string }>(createCaseRoute, { as: "engineer", body: { name: unique("Snapshot case"), patient } });
  expect(res.status).toBe(201);
  return res.body.id;
}

async function putRig(rig: Rig): Promise<void> {
  const res = await t.call(putRigRoute, { method: "PUT", as: "engineer", params: { id: t.team.projectId }, body: { rig } });
  expect(res.status).toBe(200);
}

async function run(caseId: string, rig: "project" | "ideal"): Promise<string> {
  const res = await t.call<Created>(createRunRoute, { as: "engineer", body: { revisionId, caseId, duration: 2, rig } });
  expect(res.status).toBe(201);
  expect(res.body.status).toBe("done");
  return res.body.id;
}

/** Reads past the two-second read cache, which would otherwise hide an edit made just now. */
async function read(id: string): Promise<RunView> {
  runReadCache().clear();
  const res = await t.call<RunView>(getRunRoute, { as: "clinician", params: { id } });
  expect(res.status).toBe(200);
  return res.body;
}

describe("a run keeps the inputs it simulated", () => {
  it("editing the case and the project rig leaves the run's patient and rigProfile as simulated", async () => {
    const simulatedPatient: Patient = patientSchema.parse(PATIENT);
    const caseId = await newCase(PATIENT);
    await putRig(RIG_A);
    const runId = await run(caseId, "project");

    const before = await read(runId);
    expect(before.patient).toEqual(simulatedPatient);
    expect(before.rigProfile).toEqual(RIG_A);
    expect(before.caseChangedSinceRun).toBe(false);
    // Every field the API gave before is still there.
    expect(before).toMatchObject({ id: runId, status: "done", rig: "project", case: { id: caseId }, durationS: 2, seed: 1 });
    expect(before.summary?.breaths).toBeGreaterThan(0);

    const patched = await t.call(patchCaseRoute, {
      method: "PATCH",
      as: "clinician",
      params: { id: caseId },
      body: { patient: { ...PATIENT, complianceMlPerCmH2O: 20, effort: { ...PATIENT.effort, amplitudeCmH2O: 9 } } },
    });
    expect(patched.status).toBe(200);
    await putRig(RIG_B);

    const after = await read(runId);
    expect(after.patient).toEqual(simulatedPatient);
    expect(after.rigProfile).toEqual(RIG_A);
    expect(after.caseChangedSinceRun).toBe(true);

    // The copies are on the row itself, not derived from the case or rig at read time.
    const [row] = await t.db.select({ patient: runs.patient, rigBody: runs.rigBody }).from(runs).where(eq(runs.id, runId));
    expect(row.patient).toEqual(simulatedPatient);
    expect(row.rigBody).toEqual(RIG_A);

    // A new run on the edited case and rig records the new values.
    const second = await read(await run(caseId, "project"));
    expect(second.patient?.complianceMlPerCmH2O).toBe(20);
    expect(second.rigProfile).toEqual(RIG_B);
    expect(second.caseChangedSinceRun).toBe(false);
  });

  it("an ideal-circuit run records its patient and no rig", async () => {
    const caseId = await newCase(PATIENT);
    const view = await read(await run(caseId, "ideal"));
    expect(view.rig).toBe("ideal");
    expect(view.rigProfile).toBeNull();
    expect(view.patient).toEqual(patientSchema.parse(PATIENT));
  });

  it("renaming the case without touching its values does not flag the run", async () => {
    const caseId = await newCase(PATIENT);
    const runId = await run(caseId, "ideal");
    const renamed = await t.call(patchCaseRoute, { method: "PATCH", as: "engineer", params: { id: caseId }, body: { name: unique("Renamed") } });
    expect(renamed.status).toBe(200);
    expect((await read(runId)).caseChangedSinceRun).toBe(false);
  });

  it("a run stored before the copies existed falls back to the case's edit time", async () => {
    const caseId = await newCase(PATIENT);
    const runId = await run(caseId, "project");
    await t.db.update(runs).set({ patient: null, rigBody: null }).where(eq(runs.id, runId));
    const legacy = await read(runId);
    expect(legacy.patient).toBeNull();
    expect(legacy.rigProfile).toBeNull();
    expect(legacy.caseChangedSinceRun).toBe(false);
    await t.call(patchCaseRoute, { method: "PATCH", as: "engineer", params: { id: caseId }, body: { description: "edited later" } });
    expect((await read(runId)).caseChangedSinceRun).toBe(true);
  });
});
