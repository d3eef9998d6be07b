/**
 * Runs: start (off the request thread, lib/runs/pool.ts), follow, cancel, read, window, CSV.
 *
 * A run row is written before the engine starts and updated when it ends, whatever the ending:
 * done (results + waveform blob), failed (the engine's error, or the worker's), cancelled. Nothing is
 * lost on the way: a result that cannot be stored is recorded as a failure with that reason, and a
 * run orphaned by a restart is failed with a note the next time someone opens it.
 */
import "server-only";
import type { Db } from "@/db";
import { findCaseRow, parseCaseBody } from "@/db/queries/cases";
import {
  completeRun,
  failOrphanedRun,
  failRun,
  findProjectRigBody,
  findRunWaveform,
  findVisibleRevision,
  findVisibleRun,
  insertRun,
  listVisibleRuns,
  storedSteps,
  type RunRecord,
  type StoredSteps,
} from "@/db/queries/runs";
import { canRunSimulations } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { ApiError, badRequest, forbidden, notFound } from "@/lib/errors";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { rigSchema, type Alarm, type Breath, type Patient, type Rig, type StepInterval, type Summary, type Waveforms } from "@/lib/sim/types";
import { sequenceDefinition } from "@/machines/schema";
import type { CreateRunBody, ListRunsQuery, RunRigValue, RunStatusValue, WaveformQuery } from "@/lib/validation/runs";
import { openWaveforms, StoredWaveforms, WaveformFormatError } from "@/lib/waveform/codec";
import { csvStream } from "@/lib/waveform/csv";
import { arraySource, buildSignalIndex, sourceWindow, type MinMaxIndex, type WaveformSource, type WaveformWindow } from "@/lib/waveform/downsample";
import { WAVEFORM_SIGNALS } from "@/lib/validation/runs";
import { MAX_QUEUED_JOBS, PoolBusyError, simulationPool, warmSimulationPool, type JobHandle } from "./pool";
import type { SimJob, SimOutcome } from "./protocol";
import { runReadCache } from "./read-cache";
import { runInputs } from "./snapshot";
import { waveformCache, type CachedWaveforms } from "./waveform-cache";
import { windowJsonCache, WindowJsonCache } from "./window-cache";

/**
 * Engine wall-time budget: a fixed allowance plus a share per simulated second, so a 600 s run gets
 * 80 s. The engine targets far faster than real time (a 60 s run in well under 100 ms); the budget is a
 * guard against a sequence that makes it crawl, not an expected duration.
 */
export function wallBudgetMsFor(durationS: number): number {
  return 20_000 + 100 * durationS;
}

const PROCESS_STARTED_AT = new Date();

interface LiveRun {
  handle: JobHandle;
  /** Resolves once the outcome is stored. */
  stored: Promise<StoredOutcome>;
}

interface StoredOutcome {
  status: Extract<RunStatusValue, "done" | "failed" | "cancelled">;
  summary: Summary | null;
  error: string | null;
}

const LIVE_KEY = Symbol.for("tidewright.live-runs");
function liveRuns(): Map<string, LiveRun> {
  const g = globalThis as unknown as Record<symbol, Map<string, LiveRun> | undefined>;
  g[LIVE_KEY] ??= new Map();
  return g[LIVE_KEY];
}

/** Wait until every run of this process has stored its outcome (tests, shutdown). */
export async function settleLiveRuns(): Promise<void> {
  await Promise.all([...liveRuns().values()].map((r) => r.stored));
}

/** Issue 5: engineers, clinicians and admins run; viewers read. */
function canRun(role: SessionUser["role"]): boolean {
  return canRunSimulations(role);
}

function resolveRig(rig: RunRigValue, stored: unknown): { rig: Rig | "ideal" } | { error: string } {
  if (rig === "ideal") return { rig: "ideal" };
  if (stored === null || stored === undefined) return { rig: DEFAULT_RIG };
  const parsed = rigSchema.safeParse(stored);
  if (!parsed.success) return { error: "The project's rig profile is no longer valid; open the rig page and save it again." };
  return { rig: parsed.data };
}

export type StartRunResult =
  | { status: 201; body: { id: string; status: StoredOutcome["status"]; summary: Summary | null; error: string | null } }
  | { status: 202; body: { id: string; status: "running" } };

export async function startRun(db: Db, user: SessionUser, body: CreateRunBody): Promise<StartRunResult> {
  const revision = await findVisibleRevision(db, user, body.revisionId);
  if (!revision) throw notFound("That revision");
  if (!canRun(revision.role)) throw forbidden("Your role does not allow starting runs.");

  const caseRow = await findCaseRow(db, body.caseId);
  if (!caseRow) throw badRequest("That patient case does not exist.", { caseId: ["no such patient case"] });
  const patient = parseCaseBody(caseRow);
  if (!patient) throw badRequest("That patient case is not valid any more; edit and save it first.", { caseId: ["the stored case is not valid"] });

  const pool = simulationPool();
  if (pool.queued >= MAX_QUEUED_JOBS) {
    throw new ApiError(503, "The simulator is busy with other runs. Try again in a moment.", undefined, { headers: { "Retry-After": "5" } });
  }

  const rig = resolveRig(body.rig, body.rig === "project" ? await findProjectRigBody(db, revision.projectId) : null);
  const definition = sequenceDefinition.safeParse(revision.definition);
  // The same objects go into the job below and into the run row: the row records what was simulated.
  const simulatedRig: Rig | null = "error" in rig || rig.rig === "ideal" ? null : rig.rig;

  const run = await insertRun(db, {
    revisionId: revision.id,
    caseId: caseRow.id,
    durationS: body.duration,
    rig: body.rig,
    seed: body.seed,
    createdBy: user.id,
    status: "running",
    patient,
    rigBody: simulatedRig,
  });

  // Failures known before the engine starts are stored like engine failures: shown, never lost.
  if ("error" in rig || !definition.success) {
    const error = "error" in rig ? rig.error : "The revision's definition is not valid in this version of the sequence format.";
    if (!definition.success) console.error(`[runs] revision ${revision.id} does not parse`, definition.error.issues);
    await failRun(db, run.id, "failed", error, null);
    return { status: 201, body: { id: run.id, status: "failed", summary: null, error } };
  }

  const job: SimJob = {
    definition: definition.data,
    patient,
    rig: rig.rig,
    durationS: body.duration,
    seed: body.seed,
    wallBudgetMs: wallBudgetMsFor(body.duration),
  };
  let handle: JobHandle;
  try {
    handle = pool.submit(job);
  } catch (err) {
    const error = err instanceof PoolBusyError ? "The simulator was busy; the run was not started." : "The simulator could not take the run.";
    if (!(err instanceof PoolBusyError)) console.error("[runs] submit failed", err);
    await failRun(db, run.id, "failed", error, null);
    throw new ApiError(503, "The simulator is busy with other runs. Try again in a moment.", undefined, { headers: { "Retry-After": "5" } });
  }
  const stored = handle.done.then((outcome) => storeOutcome(db, run.id, outcome));
  const live: LiveRun = { handle, stored };
  liveRuns().set(run.id, live);
  void stored.finally(() => liveRuns().delete(run.id));

  if (!body.wait) return { status: 202, body: { id: run.id, status: "running" } };
  const outcome = await stored;
  return { status: 201, body: { id: run.id, ...outcome } };
}

async function storeOutcome(db: Db, runId: string, outcome: SimOutcome): Promise<StoredOutcome> {
  if (outcome.ok) {
    const o = outcome.output;
    const steps: StoredSteps = { names: o.stepNames, intervals: o.steps };
    try {
      await completeRun(db, runId, {
        summary: o.summary,
        breaths: o.breaths,
        alarms: o.alarms,
        steps,
        waveform: o.waveform,
        wallMs: o.wallMs,
      });
      waveformCache().set(runId, o.raw);
      return { status: "done", summary: o.summary, error: null };
    } catch (err) {
      console.error(`[runs] could not store the result of run ${runId}`, err);
      const error = "The run finished but its result could not be stored. Start it again.";
      await failRun(db, runId, "failed", error, o.wallMs).catch((e: unknown) => console.error(`[runs] could not record the failure of run ${runId}`, e));
      return { status: "failed", summary: null, error };
    }
  }
  const status = outcome.reason === "cancelled" ? "cancelled" : "failed";
  const error = outcome.reason === "cancelled" ? "Cancelled." : outcome.reason === "worker" ? outcome.error : `The engine stopped: ${outcome.error}`;
  try {
    await failRun(db, runId, status, error, null);
  } catch (err) {
    console.error(`[runs] could not record the ${status} run ${runId} (${error})`, err);
  }
  return { status, summary: null, error };
}

/** The run, with a live status from this process; an orphan of an earlier process is failed first. */
async function visibleRun(db: Db, user: SessionUser, id: string): Promise<RunRecord> {
  let run = await findVisibleRun(db, user, id);
  if (!run) throw notFound("That run");
  if ((run.status === "queued" || run.status === "running") && !liveRuns().has(id)) {
    if (await failOrphanedRun(db, id, PROCESS_STARTED_AT)) {
      run = (await findVisibleRun(db, user, id)) ?? run;
    }
  }
  return run;
}

/** visibleRun for the read endpoints, through the two-second read cache (lib/runs/read-cache.ts). */
async function readableRun(db: Db, user: SessionUser, id: string): Promise<RunRecord> {
  const cache = runReadCache();
  const cached = cache.get(user.id, user.role, id);
  if (cached) return cached;
  const run = await visibleRun(db, user, id);
  cache.set(user.id, user.role, run);
  return run;
}

function parseSteps(raw: unknown): StoredSteps {
  const parsed = storedSteps.safeParse(raw);
  return parsed.success ? parsed.data : { names: [], intervals: [] };
}

export interface RunView {
  id: string;
  status: RunStatusValue;
  progress: number;
  error: string | null;
  durationS: number;
  seed: number;
  rig: RunRigValue;
  createdAt: string;
  finishedAt: string | null;
  wallMs: number | null;
  revision: RunRecord["revision"];
  case: { id: string; name: string } | null;
  /** The case was edited after this run: its current values are not the ones simulated. */
  caseChangedSinceRun: boolean;
  /** The patient body as simulated (null only on runs stored before it was kept). */
  patient: Patient | null;
  /** The rig as simulated; null for the "ideal" circuit (or a run stored before it was kept). */
  rigProfile: Rig | null;
  summary: Summary | null;
  breaths: Breath[];
  alarms: Alarm[];
  stepNames: string[];
  steps: StepInterval[];
  /** May the caller start and cancel runs in this project? */
  canRun: boolean;
}

export async function getRunView(db: Db, user: SessionUser, id: string): Promise<RunView> {
  return runView(await readableRun(db, user, id));
}

/**
 * Serialised views of finished runs, keyed by the read cache's record (one per caller, role and run,
 * kept for its two seconds). Why: under load the summary's JSON (breaths, alarms, steps, the parsed
 * patient and rig) cost more than the rest of the request once the queries were cached. A finished run
 * is immutable, so the text lives exactly as long as the record it was made from; the caller's access is
 * still decided on every request (readableRun), and `canRun` is per caller because the record is.
 */
const finishedViewJson = new WeakMap<RunRecord, string>();

/** getRunView, as the JSON text of the response body. */
export async function getRunViewJson(db: Db, user: SessionUser, id: string): Promise<string> {
  const run = await readableRun(db, user, id);
  if (!isFinished(run.status)) return JSON.stringify(runView(run));
  let json = finishedViewJson.get(run);
  if (json === undefined) {
    json = JSON.stringify(runView(run));
    finishedViewJson.set(run, json);
  }
  return json;
}

function isFinished(status: RunStatusValue): boolean {
  return status === "done" || status === "failed" || status === "cancelled";
}

function runView(run: RunRecord): RunView {
  const id = run.id;
  const live = liveRuns().get(id);
  let status: RunStatusValue = run.status;
  let progress = run.status === "done" ? 1 : 0;
  if (live && (status === "queued" || status === "running")) {
    const state = live.handle.state();
    status = state === "queued" ? "queued" : "running";
    progress = live.handle.progress();
  }
  const steps = parseSteps(run.steps);
  const inputs = runInputs(run);
  return {
    id: run.id,
    status,
    progress,
    error: run.error,
    durationS: run.durationS,
    seed: run.seed,
    rig: run.rig,
    createdAt: run.createdAt.toISOString(),
    finishedAt: run.finishedAt?.toISOString() ?? null,
    wallMs: run.wallMs,
    revision: run.revision,
    case: run.case ? { id: run.case.id, name: run.case.name } : null,
    caseChangedSinceRun: inputs.caseChangedSinceRun,
    patient: inputs.patient,
    rigProfile: inputs.rigProfile,
    summary: (run.summary as Summary | null) ?? null,
    breaths: Array.isArray(run.breaths) ? (run.breaths as Breath[]) : [],
    alarms: Array.isArray(run.alarms) ? (run.alarms as Alarm[]) : [],
    stepNames: steps.names,
    steps: steps.intervals,
    canRun: canRun(run.role),
  };
}

export async function cancelRun(db: Db, user: SessionUser, id: string): Promise<{ status: RunStatusValue }> {
  const run = await visibleRun(db, user, id);
  if (!canRun(run.role)) throw forbidden("Your role does not allow cancelling runs.");
  const live = liveRuns().get(id);
  if (!live) return { status: run.status };
  live.handle.cancel();
  const outcome = await live.stored;
  return { status: outcome.status };
}

export async function listRuns(db: Db, user: SessionUser, query: ListRunsQuery) {
  // Someone looking at a list of runs is likely to start one: have the workers ready.
  warmSimulationPool();
  const rows = await listVisibleRuns(db, user, query);
  return {
    runs: rows.map((r) => {
      const live = liveRuns().get(r.id);
      const status: RunStatusValue = live && (r.status === "running" || r.status === "queued") ? (live.handle.state() === "queued" ? "queued" : "running") : r.status;
      return {
        id: r.id,
        status,
        createdAt: r.createdAt.toISOString(),
        durationS: r.durationS,
        rig: r.rig,
        error: r.error,
        case: r.case,
        revision: r.revision,
        summary: (r.summary as Summary | null) ?? null,
      };
    }),
  };
}

async function loadWaveforms(db: Db, run: RunRecord): Promise<CachedWaveforms> {
  if (run.status !== "done") throw new ApiError(409, "This run has no waveforms: it did not finish.");
  const cache = waveformCache();
  const cached = cache.get(run.id);
  if (cached) return cached;
  const blob = await findRunWaveform(db, run.id);
  if (!blob) throw new ApiError(409, "This run has no stored waveforms.");
  let waveforms: CachedWaveforms;
  try {
    // v2 blobs: only the header and chunk table are read here; windows inflate what they need.
    waveforms = openWaveforms(blob);
  } catch (err) {
    throw new ApiError(500, "The stored waveforms of this run could not be read.", undefined, { cause: err });
  }
  cache.set(run.id, waveforms);
  return waveforms;
}

/** Below this many samples a plain scan is as fast as building the block index. */
const INDEX_MIN_SAMPLES = 50_000;
const indexes = new WeakMap<Waveforms, MinMaxIndex>();

function indexOf(w: Waveforms): MinMaxIndex | undefined {
  if (w.t.length < INDEX_MIN_SAMPLES) return undefined;
  let index = indexes.get(w);
  if (!index) {
    index = {};
    for (const s of WAVEFORM_SIGNALS) index[s] = buildSignalIndex(w[s]);
    indexes.set(w, index);
  }
  return index;
}

function sourceOf(w: CachedWaveforms): WaveformSource {
  return w instanceof StoredWaveforms ? w : arraySource(w, indexOf(w));
}

/** A window over a stored run; a chunk that fails to inflate is a broken blob, not a bad request. */
function windowOf(w: CachedWaveforms, steps: StepInterval[], query: WaveformQuery): WaveformWindow {
  try {
    return sourceWindow(sourceOf(w), steps, query);
  } catch (err) {
    if (err instanceof WaveformFormatError) throw new ApiError(500, "The stored waveforms of this run could not be read.", undefined, { cause: err });
    throw err;
  }
}

function fullOf(w: CachedWaveforms): Waveforms {
  try {
    return w instanceof StoredWaveforms ? w.full() : w;
  } catch (err) {
    if (err instanceof WaveformFormatError) throw new ApiError(500, "The stored waveforms of this run could not be read.", undefined, { cause: err });
    throw err;
  }
}

export async function getWaveformWindow(db: Db, user: SessionUser, id: string, query: WaveformQuery): Promise<WaveformWindow> {
  const run = await readableRun(db, user, id);
  const waveforms = await loadWaveforms(db, run);
  return windowOf(waveforms, parseSteps(run.steps).intervals, query);
}

/** getWaveformWindow, as the JSON text of the response body (shared windows: lib/runs/window-cache.ts). */
export async function getWaveformWindowJson(db: Db, user: SessionUser, id: string, query: WaveformQuery): Promise<string> {
  const run = await readableRun(db, user, id);
  const waveforms = await loadWaveforms(db, run);
  const cache = windowJsonCache();
  const key = WindowJsonCache.key(id, query);
  let json = cache.get(key, waveforms);
  if (json === undefined) {
    json = JSON.stringify(windowOf(waveforms, parseSteps(run.steps).intervals, query));
    cache.set(key, waveforms, json);
  }
  return json;
}

export async function getWaveformCsv(db: Db, user: SessionUser, id: string): Promise<Response> {
  const run = await readableRun(db, user, id);
  const waveforms = await loadWaveforms(db, run);
  const names = parseSteps(run.steps).names;
  const filename = `run-${run.revision.sequenceName.replace(/[^A-Za-z0-9_-]+/g, "-").slice(0, 60)}-r${run.revision.number}-${run.id.slice(0, 8)}.csv`;
  return new Response(csvStream(fullOf(waveforms), names), {
    status: 200,
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${filename}"`,
    },
  });
}
