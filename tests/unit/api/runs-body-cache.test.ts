/**
 * Pre-serialised run bodies (lib/runs/service.ts getRunViewJson, lib/runs/window-cache.ts): the same
 * answers as before, per-caller fields stay per caller, and access is still decided on every request —
 * someone else's run answers 404 even while its body is cached.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { POST as createRoute } from "@/app/api/runs/route";
import { GET as getRoute } from "@/app/api/runs/[id]/route";
import { GET as windowRoute } from "@/app/api/runs/[id]/waveform/route";
import { patientCases } from "@/db/schema";
import { isoCaseName, seedPatientCases } from "@/db/seed-cases";
import { getRunView, settleLiveRuns, type RunView } from "@/lib/runs/service";
import { simulationPool } from "@/lib/runs/pool";
import { runReadCache } from "@/lib/runs/read-cache";
import { waveformCache } from "@/lib/runs/waveform-cache";
import { WindowJsonCache, windowJsonCache } from "@/lib/runs/window-cache";
import type { WaveformWindow } from "@/lib/waveform/downsample";
import { openTestDb, type CallOptions, type TestDb } from "@/tests/fixtures/test-db";
import { newProject, newRevision, signedInUser, templateDefinition } from "@/tests/unit/runs/fixtures";
import { syntheticWaveforms } from "@/tests/unit/waveform/fixtures";

let t: TestDb;
let runId: string;
let outsider: { id: string; cookie: string };

beforeAll(async () => {
  t = await openTestDb();
  await seedPatientCases(t.db);
  const [iso] = await t.db.select().from(patientCases).where(eq(patientCases.name, isoCaseName(1)));
  const revisionId = await newRevision(t, t.team.projectId, templateDefinition("pressure-control"));
  outsider = await signedInUser(t, "engineer");
  await newProject(t, [{ userId: outsider.id }]);
  const created = await t.call<{ id: string; status: string }>(createRoute, {
    as: "engineer",
    body: { revisionId, caseId: iso.id, duration: 4, wait: true },
  });
  expect(created.status).toBe(201);
  expect(created.body.status).toBe("done");
  runId = created.body.id;
}, 120_000);

afterAll(async () => {
  await settleLiveRuns();
  await simulationPool().shutdown();
  await t.close();
});

describe("GET /api/runs/:id (pre-serialised)", () => {
  it("answers JSON equal to the run view, the same text while the read cache holds the run", async () => {
    const first = await t.call<RunView>(getRoute, { as: "engineer", params: { id: runId } });
    expect(first.status).toBe(200);
    expect(first.headers.get("content-type")).toMatch(/^application\/json/);
    expect(first.headers.get("cache-control")).toBe("no-store");
    const second = await t.call(getRoute, { as: "engineer", params: { id: runId } });
    expect(await second.response.text()).toBe(await first.response.text());
    const view = await getRunView(t.db, t.team.users.engineer, runId);
    expect(first.body).toEqual(JSON.parse(JSON.stringify(view)));
    runReadCache().clear();
    const fresh = await t.call(getRoute, { as: "engineer", params: { id: runId } });
    expect(fresh.body).toEqual(first.body);
  });

  it("keeps per-caller fields per caller and still answers 404 to someone outside the project", async () => {
    const engineer = await t.call<RunView>(getRoute, { as: "engineer", params: { id: runId } });
    const viewer = await t.call<RunView>(getRoute, { as: "viewer", params: { id: runId } });
    expect(engineer.body.canRun).toBe(true);
    expect(viewer.status).toBe(200);
    expect(viewer.body.canRun).toBe(false);
    expect((await t.call(getRoute, { as: { cookie: outsider.cookie }, params: { id: runId } })).status).toBe(404);
    expect((await t.call(getRoute, { params: { id: runId } })).status).toBe(401);
  });
});

describe("GET /api/runs/:id/waveform (pre-serialised windows)", () => {
  const call = (as: CallOptions["as"]) =>
    t.call<WaveformWindow>(windowRoute, { as, params: { id: runId }, path: `/api/runs/${runId}/waveform?from=0&to=3&points=200&signals=paw,flow` });

  it("serves the same window again from memory, recomputed once the run's waveforms are reloaded", async () => {
    const first = await call("engineer");
    expect(first.status).toBe(200);
    expect(first.body.t.length).toBeLessThanOrEqual(200);
    expect(Object.keys(first.body.signals).sort()).toEqual(["flow", "paw"]);
    const bytesAfterFirst = windowJsonCache().bytes;
    expect(bytesAfterFirst).toBeGreaterThan(0);
    const second = await call("viewer");
    expect(await second.response.text()).toBe(await first.response.text());
    expect(windowJsonCache().bytes).toBe(bytesAfterFirst);
    waveformCache().delete(runId);
    const reloaded = await call("engineer");
    expect(reloaded.body).toEqual(first.body);
  });

  it("still answers 404 to someone outside the project while the window is cached", async () => {
    expect((await call("engineer")).status).toBe(200);
    expect((await call({ cookie: outsider.cookie })).status).toBe(404);
  });
});

describe("WindowJsonCache", () => {
  const q = (points: number) => ({ points, signals: ["paw" as const] });

  it("keys by run and query", () => {
    expect(WindowJsonCache.key("r", { from: 0, to: 1, points: 10, signals: ["paw"] })).not.toBe(
      WindowJsonCache.key("r", { from: 0, to: 1, points: 10, signals: ["flow"] }),
    );
    expect(WindowJsonCache.key("r", q(10))).not.toBe(WindowJsonCache.key("r", { from: 0, ...q(10) }));
  });

  it("serves an entry only for the waveforms it was made from", () => {
    const cache = new WindowJsonCache(1000);
    const a = syntheticWaveforms(1).w;
    const b = syntheticWaveforms(1).w;
    cache.set("k", a, "[1,2,3]");
    expect(cache.get("k", a)).toBe("[1,2,3]");
    expect(cache.get("k", b)).toBeUndefined();
    expect(cache.get("k", a)).toBeUndefined(); // the stale entry was dropped
    expect(cache.bytes).toBe(0);
  });

  it("evicts the least recently used past its byte budget and skips what cannot fit", () => {
    const w = syntheticWaveforms(1).w;
    const cache = new WindowJsonCache(10);
    cache.set("a", w, "aaaa");
    cache.set("b", w, "bbbb");
    expect(cache.get("a", w)).toBe("aaaa"); // a is now the most recent
    cache.set("c", w, "cccc");
    expect(cache.get("b", w)).toBeUndefined();
    expect(cache.get("a", w)).toBe("aaaa");
    expect(cache.bytes).toBe(8);
    cache.set("big", w, "x".repeat(11));
    expect(cache.get("big", w)).toBeUndefined();
  });
});
