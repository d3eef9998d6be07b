/**
 * Runs API handler tests: every status of issue 5 §2 and the roles, results as the engine gives them,
 * waveform windows against full resolution, the stored blob bit-exact, CSV, cancel, failures kept.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { GET as listRoute, POST as createRoute } from "@/app/api/runs/route";
import { GET as getRoute } from "@/app/api/runs/[id]/route";
import { POST as cancelRoute } from "@/app/api/runs/[id]/cancel/route";
import { GET as windowRoute } from "@/app/api/runs/[id]/waveform/route";
import { GET as csvRoute } from "@/app/api/runs/[id]/waveform.csv/route";
import { patientCases, revisions, runs } from "@/db/schema";
import { sequenceDefinition } from "@/machines/schema";
import { findRunWaveform } from "@/db/queries/runs";
import { isoCaseName, seedPatientCases } from "@/db/seed-cases";
import type { Role } from "@/lib/auth/roles";
import { simulate } from "@/lib/sim/simulate";
import { patientSchema, type Summary, type Waveforms } from "@/lib/sim/types";
import { settleLiveRuns, type RunView } from "@/lib/runs/service";
import { simulationPool } from "@/lib/runs/pool";
import { decodeWaveforms } from "@/lib/waveform/codec";
import type { WaveformWindow } from "@/lib/waveform/downsample";
import { CSV_HEADER } from "@/lib/waveform/csv";
import { WAVEFORM_FIELDS } from "@/lib/waveform/format";
import { openTestDb, TEST_ORIGIN, type TestDb } from "@/tests/fixtures/test-db";
import { newProject, newRevision, signedInUser, templateDefinition } from "@/tests/unit/runs/fixtures";

let t: TestDb;
let revisionId: string; // pressure-control template, demo project
let foreignRevisionId: string; // a project the demo team is not in
let brokenRevisionId: string; // compiles badly: the engine fails
let isoRow1CaseId: string;
let normalCaseId: string;
let outsider: { id: string; cookie: string };
const UNKNOWN_ID = "9b2f3f9c-1111-4222-8333-444455556666";

type Created = { id: string; status: string; summary: Summary | null; error: string | null };

beforeAll(async () => {
  t = await openTestDb();
  await seedPatientCases(t.db);
  const cases = await t.db.select().from(patientCases).where(eq(patientCases.seeded, true));
  isoRow1CaseId = cases.find((c) => c.name === isoCaseName(1))!.id;
  normalCaseId = cases.find((c) => c.name === "Adult, normal lungs (passive)")!.id;
  revisionId = await newRevision(t, t.team.projectId, templateDefinition("pressure-control"));
  outsider = await signedInUser(t, "engineer");
  const foreign = await newProject(t, [{ userId: outsider.id }]);
  foreignRevisionId = await newRevision(t, foreign, templateDefinition("pressure-control"));
  const broken = templateDefinition("pressure-control");
  const firstStep = Object.values(broken.machine.states)[0];
  firstStep.meta.command = { kind: "pressure", target: "noSuchSetting + 5", rise: "0" };
  brokenRevisionId = await newRevision(t, t.team.projectId, broken);
}, 120_000);

afterAll(async () => {
  await settleLiveRuns();
  await simulationPool().shutdown();
  await t.close();
});

const post = (as: Role | { cookie: string } | null, body: unknown) => t.call<Created>(createRoute, { as, body });

async function waitForEnd(id: string, as: Role = "engineer"): Promise<RunView> {
  for (let i = 0; i < 600; i++) {
    const res = await t.call<RunView>(getRoute, { as, params: { id } });
    if (["done", "failed", "cancelled"].includes(res.body.status)) return res.body;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error("run did not end");
}

function bitExact(a: Waveforms, b: Waveforms): boolean {
  return WAVEFORM_FIELDS.every((f) => {
    const x = a[f.key];
    const y = b[f.key];
    return (
      x.constructor === y.constructor &&
      Buffer.from(x.buffer, x.byteOffset, x.byteLength).equals(Buffer.from(y.buffer, y.byteOffset, y.byteLength))
    );
  });
}

describe("POST /api/runs", () => {
  it("runs in a worker thread, not on the request thread", async () => {
    const res = await post("engineer", { revisionId, caseId: normalCaseId, duration: 2 });
    expect(res.status).toBe(201);
    expect(simulationPool().mode).toBe("workers");
  });

  it.each(["engineer", "clinician", "admin"] as Role[])("201 { id, summary } for %s once the run is done", async (role) => {
    const res = await post(role, { revisionId, caseId: normalCaseId, duration: 3 });
    expect(res.status).toBe(201);
    expect(res.body.status).toBe("done");
    expect(res.body.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.body.summary?.breaths).toBeGreaterThan(0);
  });

  it("403 for a viewer; 401 signed out; 403 cross-site", async () => {
    expect((await post("viewer", { revisionId, caseId: normalCaseId, duration: 2 })).status).toBe(403);
    expect((await post(null, { revisionId, caseId: normalCaseId, duration: 2 })).status).toBe(401);
    const cross = await t.call(createRoute, {
      as: "engineer",
      body: { revisionId, caseId: normalCaseId, duration: 2 },
      headers: { origin: "https://evil.example" },
    });
    expect(cross.status).toBe(403);
  });

  it("400 for a duration outside 1–600 s or not a number", async () => {
    for (const duration of [0, 0.5, 600.5, 601, -1, "10", null]) {
      const res = await post("engineer", { revisionId, caseId: normalCaseId, duration });
      expect(res.status, `duration ${String(duration)}`).toBe(400);
    }
    expect((await post("engineer", { revisionId, caseId: normalCaseId })).status).toBe(400);
    expect((await post("engineer", { revisionId, caseId: normalCaseId, duration: 1 })).status).toBe(201);
  });

  it("400 for a bad case: malformed id, unknown id, stored values no longer valid", async () => {
    const malformed = await post("engineer", { revisionId, caseId: "nope", duration: 2 });
    expect(malformed.status).toBe(400);
    const unknown = await post("engineer", { revisionId, caseId: UNKNOWN_ID, duration: 2 });
    expect(unknown.status).toBe(400);
    expect(unknown.body).toMatchObject({ error: expect.stringMatching(/case/) });
    const [bad] = await t.db.insert(patientCases).values({ name: "Broken", body: { complianceMlPerCmH2O: -1 } }).returning();
    expect((await post("engineer", { revisionId, caseId: bad.id, duration: 2 })).status).toBe(400);
  });

  it("400 for unknown fields, a bad rig or seed", async () => {
    expect((await post("engineer", { revisionId, caseId: normalCaseId, duration: 2, extra: true })).status).toBe(400);
    expect((await post("engineer", { revisionId, caseId: normalCaseId, duration: 2, rig: "bench" })).status).toBe(400);
    expect((await post("engineer", { revisionId, caseId: normalCaseId, duration: 2, seed: 1.5 })).status).toBe(400);
  });

  it("404 for a revision the caller cannot see, or that does not exist", async () => {
    expect((await post("engineer", { revisionId: foreignRevisionId, caseId: normalCaseId, duration: 2 })).status).toBe(404);
    expect((await post("clinician", { revisionId: foreignRevisionId, caseId: normalCaseId, duration: 2 })).status).toBe(404);
    expect((await post("engineer", { revisionId: UNKNOWN_ID, caseId: normalCaseId, duration: 2 })).status).toBe(404);
    // …while its own member can run it, and an admin sees every project.
    expect((await post(outsider, { revisionId: foreignRevisionId, caseId: normalCaseId, duration: 1 })).status).toBe(201);
    expect((await post("admin", { revisionId: foreignRevisionId, caseId: normalCaseId, duration: 1 })).status).toBe(201);
  });

  it("a per-project viewer role overrides an engineer account: 403", async () => {
    const eng = await signedInUser(t, "engineer");
    const p = await newProject(t, [{ userId: eng.id, role: "viewer" }]);
    const rev = await newRevision(t, p, templateDefinition("pressure-control"));
    expect((await post(eng, { revisionId: rev, caseId: normalCaseId, duration: 1 })).status).toBe(403);
  });

  it("ISO 80601-2-12 Table 201.105 row 1 (transcribed) on pressure-control: the same Vti as the engine gives directly", async () => {
    const res = await post("engineer", { revisionId, caseId: isoRow1CaseId, duration: 12, rig: "ideal", seed: 3 });
    expect(res.status).toBe(201);
    const [caseRow] = await t.db.select().from(patientCases).where(eq(patientCases.id, isoRow1CaseId));
    // The definition as stored: jsonb reorders object keys, and the engine numbers steps in key order.
    const [revRow] = await t.db.select().from(revisions).where(eq(revisions.id, revisionId));
    const direct = simulate({
      definition: sequenceDefinition.parse(revRow.definition),
      patient: patientSchema.parse(caseRow.body),
      rig: "ideal",
      durationS: 12,
      seed: 3,
    });
    expect(res.body.summary?.vti).toBe(direct.summary.vti);
    expect(res.body.summary).toEqual(direct.summary);

    // Stored waveforms: the blob decodes bit-exact to the engine's own arrays.
    const blob = await findRunWaveform(t.db, res.body.id);
    expect(blob).not.toBeNull();
    expect(bitExact(decodeWaveforms(blob!), direct.waveforms)).toBe(true);

    const view = await t.call<RunView>(getRoute, { as: "clinician", params: { id: res.body.id } });
    expect(view.body.breaths).toEqual(JSON.parse(JSON.stringify(direct.breaths)));
    expect(view.body.stepNames).toEqual(direct.stepNames);
    expect(view.body.steps).toEqual(direct.steps);
  });

  it("a run that fails in the engine is stored with its error and shown", async () => {
    const res = await post("engineer", { revisionId: brokenRevisionId, caseId: normalCaseId, duration: 2 });
    expect(res.status).toBe(201);
    expect(res.body.status).toBe("failed");
    expect(res.body.error).toBeTruthy();
    const view = await t.call<RunView>(getRoute, { as: "viewer", params: { id: res.body.id } });
    expect(view.status).toBe(200);
    expect(view.body.status).toBe("failed");
    expect(view.body.error).toBe(res.body.error);
    const [row] = await t.db.select({ status: runs.status, error: runs.error }).from(runs).where(eq(runs.id, res.body.id));
    expect(row).toEqual({ status: "failed", error: res.body.error });
  });

  it("wait: false → 202 { id, status: running }, progress while it runs, then done", async () => {
    const res = await t.call<{ id: string; status: string }>(createRoute, {
      as: "engineer",
      body: { revisionId, caseId: normalCaseId, duration: 60, wait: false },
    });
    expect(res.status).toBe(202);
    expect(res.body.status).toBe("running");
    const first = await t.call<RunView>(getRoute, { as: "engineer", params: { id: res.body.id } });
    expect(["queued", "running", "done"]).toContain(first.body.status);
    expect(first.body.progress).toBeGreaterThanOrEqual(0);
    expect(first.body.progress).toBeLessThanOrEqual(1);
    const end = await waitForEnd(res.body.id);
    expect(end.status).toBe("done");
    expect(end.progress).toBe(1);
  });
});

describe("POST /api/runs/:id/cancel", () => {
  it("stops a running run: 200 { status: cancelled }, stored as cancelled", async () => {
    const res = await t.call<{ id: string }>(createRoute, {
      as: "clinician",
      body: { revisionId, caseId: normalCaseId, duration: 600, wait: false },
    });
    expect(res.status).toBe(202);
    // Cancel at once: a 600 s run takes the engine only a few hundred ms, so any wait here races it.
    const cancel = await t.call<{ status: string }>(cancelRoute, { as: "clinician", params: { id: res.body.id }, method: "POST" });
    expect((await t.call(cancelRoute, { as: "viewer", params: { id: res.body.id }, method: "POST" })).status).toBe(403);
    expect(cancel.status).toBe(200);
    expect(cancel.body.status).toBe("cancelled");
    const view = await t.call<RunView>(getRoute, { as: "viewer", params: { id: res.body.id } });
    expect(view.body.status).toBe("cancelled");
    // The worker is free again for the next run.
    expect((await post("engineer", { revisionId, caseId: normalCaseId, duration: 1 })).body.status).toBe("done");
  });

  it("a finished run answers 200 with its status; unknown or foreign runs 404", async () => {
    const done = await post("engineer", { revisionId, caseId: normalCaseId, duration: 1 });
    const res = await t.call<{ status: string }>(cancelRoute, { as: "engineer", params: { id: done.body.id }, method: "POST" });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe("done");
    expect((await t.call(cancelRoute, { as: "engineer", params: { id: UNKNOWN_ID }, method: "POST" })).status).toBe(404);
    expect((await t.call(cancelRoute, { as: outsider, params: { id: done.body.id }, method: "POST" })).status).toBe(404);
  });
});

describe("GET /api/runs/:id", () => {
  let id: string;
  beforeAll(async () => {
    id = (await post("engineer", { revisionId, caseId: normalCaseId, duration: 5 })).body.id;
  });

  it("every role reads: summary, breaths, alarms, revision, case, steps", async () => {
    for (const role of ["viewer", "clinician", "engineer", "admin"] as Role[]) {
      const res = await t.call<RunView>(getRoute, { as: role, params: { id } });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        id,
        status: "done",
        progress: 1,
        durationS: 5,
        rig: "project",
        seed: 1,
        error: null,
        revision: { id: revisionId, number: 1, projectId: t.team.projectId },
        case: { id: normalCaseId, name: "Adult, normal lungs (passive)" },
        canRun: role !== "viewer",
      });
      expect(res.body.breaths.length).toBeGreaterThan(0);
      expect(res.body.stepNames.length).toBeGreaterThan(0);
      expect(res.body.steps.length).toBeGreaterThan(0);
      expect(Array.isArray(res.body.alarms)).toBe(true);
      expect(res.body.wallMs).toBeGreaterThan(0);
    }
  });

  it("404 for someone outside the project, an unknown or malformed id; 401 signed out", async () => {
    expect((await t.call(getRoute, { as: outsider, params: { id } })).status).toBe(404);
    expect((await t.call(getRoute, { as: "engineer", params: { id: UNKNOWN_ID } })).status).toBe(404);
    expect((await t.call(getRoute, { as: "engineer", params: { id: "x" } })).status).toBe(404);
    expect((await t.call(getRoute, { params: { id } })).status).toBe(401);
  });

  it("a run left running by an earlier process is shown as failed, not lost", async () => {
    const [row] = await t.db
      .insert(runs)
      .values({ revisionId, caseId: normalCaseId, durationS: 10, status: "running", createdAt: sql`now() - interval '1 hour'` })
      .returning({ id: runs.id });
    const res = await t.call<RunView>(getRoute, { as: "viewer", params: { id: row.id } });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe("failed");
    expect(res.body.error).toMatch(/server stopped/);
  });
});

describe("GET /api/runs?revisionId= / ?caseId=", () => {
  it("lists the revision's runs, newest first, with summary, case and revision", async () => {
    const res = await t.call<{ runs: Array<{ id: string; createdAt: string; case: { id: string } | null; revision: { id: string }; summary: unknown }> }>(
      listRoute,
      { as: "viewer", path: `/api/runs?revisionId=${revisionId}` },
    );
    expect(res.status).toBe(200);
    expect(res.body.runs.length).toBeGreaterThan(3);
    expect(res.body.runs.every((r) => r.revision.id === revisionId)).toBe(true);
    const times = res.body.runs.map((r) => Date.parse(r.createdAt));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
  });

  it("by case: only runs in projects the caller sees", async () => {
    const mine = await t.call<{ runs: Array<{ revision: { id: string } }> }>(listRoute, { as: "engineer", path: `/api/runs?caseId=${normalCaseId}` });
    expect(mine.status).toBe(200);
    expect(mine.body.runs.some((r) => r.revision.id === foreignRevisionId)).toBe(false);
    const theirs = await t.call<{ runs: Array<{ revision: { id: string } }> }>(listRoute, { as: outsider, path: `/api/runs?caseId=${normalCaseId}` });
    expect(theirs.body.runs.length).toBeGreaterThan(0);
    expect(theirs.body.runs.every((r) => r.revision.id === foreignRevisionId)).toBe(true);
    const outsiderOnDemo = await t.call<{ runs: unknown[] }>(listRoute, { as: outsider, path: `/api/runs?revisionId=${revisionId}` });
    expect(outsiderOnDemo.body.runs).toEqual([]);
  });

  it("400 without a filter or with a malformed one; 401 signed out", async () => {
    expect((await t.call(listRoute, { as: "engineer", path: "/api/runs" })).status).toBe(400);
    expect((await t.call(listRoute, { as: "engineer", path: "/api/runs?revisionId=zz" })).status).toBe(400);
    expect((await t.call(listRoute, { path: `/api/runs?revisionId=${revisionId}` })).status).toBe(401);
  });
});

describe("GET /api/runs/:id/waveform", () => {
  let id: string;
  let full: Waveforms;
  beforeAll(async () => {
    id = (await post("engineer", { revisionId, caseId: isoRow1CaseId, duration: 30 })).body.id;
    full = decodeWaveforms((await findRunWaveform(t.db, id))!);
  });

  const windowOf = (query: string, as: Role | { cookie: string } = "viewer") =>
    t.call<WaveformWindow>(windowRoute, { as, params: { id }, path: `/api/runs/${id}/waveform?${query}` });

  function fullMax(signal: "paw" | "flow" | "volume" | "pmus", from: number, to: number) {
    let max = -Infinity;
    let min = Infinity;
    for (let i = 0; i < full.t.length; i++) {
      if (full.t[i] < from || full.t[i] > to) continue;
      max = Math.max(max, full[signal][i]);
      min = Math.min(min, full[signal][i]);
    }
    return { max, min };
  }

  it("keeps the true peak of the window (compared with the full-resolution data)", async () => {
    for (const [from, to, points] of [
      [0, 30, 300],
      [3.2, 7.9, 100],
      [10, 10.5, 40],
    ] as const) {
      const res = await windowOf(`from=${from}&to=${to}&points=${points}&signals=paw,flow,volume,pmus`);
      expect(res.status).toBe(200);
      expect(res.body.points).toBeLessThanOrEqual(points);
      expect(res.body.t.length).toBe(res.body.points);
      for (const s of ["paw", "flow", "volume", "pmus"] as const) {
        const truth = fullMax(s, from, to);
        expect(Math.max(...res.body.signals[s]!), `${s} peak in ${from}–${to}`).toBe(truth.max);
        expect(Math.min(...res.body.signals[s]!), `${s} trough in ${from}–${to}`).toBe(truth.min);
      }
      for (let i = 1; i < res.body.t.length; i++) expect(res.body.t[i]).toBeGreaterThanOrEqual(res.body.t[i - 1]);
      expect(res.body.steps.every((st) => st.from >= from && st.to <= to)).toBe(true);
      expect(res.body.steps.length).toBeGreaterThan(0);
    }
  });

  it("defaults to the whole run and the four main signals; arm on request", async () => {
    const res = await windowOf("points=500");
    expect(res.status).toBe(200);
    expect(res.body.from).toBe(0);
    expect(res.body.to).toBeCloseTo(30, 2);
    expect(Object.keys(res.body.signals).sort()).toEqual(["flow", "paw", "pmus", "volume"]);
    const arm = await windowOf("signals=arm&points=100");
    expect(Object.keys(arm.body.signals)).toEqual(["arm"]);
  });

  it("400 for bad parameters, 404 outside the project, 409 for a run without waveforms", async () => {
    expect((await windowOf("signals=paw,heart")).status).toBe(400);
    expect((await windowOf("points=1")).status).toBe(400);
    expect((await windowOf("points=100000")).status).toBe(400);
    expect((await windowOf("from=5&to=2")).status).toBe(400);
    expect((await windowOf("from=-1")).status).toBe(400);
    expect((await windowOf("points=100", outsider)).status).toBe(404);
    const failed = await post("engineer", { revisionId: brokenRevisionId, caseId: normalCaseId, duration: 1 });
    const res = await t.call(windowRoute, { as: "viewer", params: { id: failed.body.id }, path: `/api/runs/${failed.body.id}/waveform` });
    expect(res.status).toBe(409);
  });
});

describe("GET /api/runs/:id/waveform.csv", () => {
  it("full resolution with a header naming columns and units", async () => {
    const id = (await post("engineer", { revisionId, caseId: normalCaseId, duration: 2 })).body.id;
    const cookie = await t.cookieFor("viewer");
    const response = await csvRoute(new Request(`${TEST_ORIGIN}/api/runs/${id}/waveform.csv`, { headers: { cookie } }), {
      params: Promise.resolve({ id }),
    });
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(response.headers.get("content-disposition")).toMatch(/attachment; filename=".+\.csv"/);
    const lines = (await response.text()).trimEnd().split("\n");
    expect(lines[0]).toBe(CSV_HEADER);
    const full = decodeWaveforms((await findRunWaveform(t.db, id))!);
    expect(lines.length).toBe(full.t.length + 1);
    const last = lines.at(-1)!.split(",");
    expect(Math.fround(Number(last[1]))).toBe(full.paw[full.t.length - 1]);
    const outsiderRes = await csvRoute(new Request(`${TEST_ORIGIN}/api/runs/${id}/waveform.csv`, { headers: { cookie: outsider.cookie } }), {
      params: Promise.resolve({ id }),
    });
    expect(outsiderRes.status).toBe(404);
  });
});
