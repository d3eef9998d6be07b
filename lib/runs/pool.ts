/**
 * A small pool of simulation worker threads, kept warm so a run does not pay the engine's start-up.
 *
 * - Lazy: nothing starts at import (so `next build`, which imports route modules, never spawns a
 *   thread); the first `warm()` or `submit()` starts the workers, and they stay up, idle ones unref'd.
 * - The worker entry is `new Worker(new URL("./sim-worker.ts", import.meta.url))`, written literally so
 *   Turbopack recognises it and bundles the worker as its own entry (supported for node:worker_threads
 *   since Next 16.2; relative URL resolution fixed in vercel/next.js#93432). Outside Next (Vitest, tsx
 *   scripts) the URL is the .ts source and the worker loads it through tsx's CommonJS hook
 *   (`--require tsx/cjs`; tsx's ESM `--import` hook does not reach worker threads on Node 20).
 * - Cancellable: the engine runs synchronously inside the worker and polls a SharedArrayBuffer flag;
 *   a worker that does not stop in time is terminated and replaced.
 * - Wall-time budget: the engine has its own (SimOptions.wallBudgetMs); a watchdog here terminates a
 *   worker that runs past it plus a grace period.
 * - Fallback: if no worker can start at all, jobs run in the server's thread (logged once). That blocks
 *   the event loop for the length of a run, so it is a last resort, not a mode to live in.
 */
import "server-only";
import os from "node:os";
import { Worker } from "node:worker_threads";
import { z } from "zod";
import { RunControl, type FromWorker, type SimJob, type SimOutcome, type ToWorker } from "./protocol";

/** How long a starting worker may take to load the engine before we give up on it. */
const WORKER_START_TIMEOUT_MS = 30_000;
/** Extra time past the engine's own budget before the watchdog terminates the worker. */
const WATCHDOG_GRACE_MS = 5_000;
/** After a cancel, how long the engine may take to notice before the worker is terminated. */
const CANCEL_GRACE_MS = 2_000;
/** Jobs waiting beyond this are refused (the caller answers 503). */
export const MAX_QUEUED_JOBS = 32;
/** Workers that die more often than this in a row fall back to in-process runs. */
const MAX_CONSECUTIVE_START_FAILURES = 3;

export type JobState = "queued" | "running" | "settled";

export interface JobHandle {
  readonly id: number;
  readonly done: Promise<SimOutcome>;
  state(): JobState;
  /** Fraction simulated, 0..1. */
  progress(): number;
  cancel(): void;
}

export class PoolBusyError extends Error {
  constructor() {
    super("The simulator is busy with other runs.");
    this.name = "PoolBusyError";
  }
}

interface Pending {
  id: number;
  job: SimJob;
  control: RunControl;
  state: JobState;
  settle: (outcome: SimOutcome) => void;
  slot?: Slot;
  timers: NodeJS.Timeout[];
}

interface Slot {
  worker: Worker;
  ready: boolean;
  current: Pending | null;
  tsLoader: boolean;
}

const poolEnv = z.object({
  TIDEWRIGHT_SIM_WORKERS: z.coerce.number().int().min(0).max(16).optional(),
});

function defaultSize(): number {
  const parsed = poolEnv.safeParse(process.env);
  if (!parsed.success) {
    throw new Error(`Invalid TIDEWRIGHT_SIM_WORKERS: ${parsed.error.issues.map((i) => i.message).join("; ")}`);
  }
  if (parsed.data.TIDEWRIGHT_SIM_WORKERS !== undefined) return parsed.data.TIDEWRIGHT_SIM_WORKERS;
  // Leave a core for the HTTP server; at least one worker.
  return Math.max(1, Math.min(4, os.availableParallelism() - 1));
}

const TSX_LOADER_ARGS = ["--require", "tsx/cjs"];

/** Under Next (NEXT_RUNTIME is set) the worker entry is bundled JS; anywhere else it is the TypeScript source. */
function entryIsTypeScript(): boolean {
  return !process.env.NEXT_RUNTIME;
}

export class SimulationPool {
  private slots: Slot[] = [];
  private queue: Pending[] = [];
  private nextId = 1;
  private started = false;
  private inline = false;
  private inlineBusy = false;
  private startFailures = 0;
  private readonly live = new Map<number, Pending>();

  constructor(readonly size: number = defaultSize()) {}

  /** Start the workers if they are not running. Never called at import. */
  warm(): void {
    if (this.started) return;
    this.started = true;
    if (this.size === 0) {
      this.useInline("TIDEWRIGHT_SIM_WORKERS=0");
      return;
    }
    for (let i = 0; i < this.size; i++) this.spawn(entryIsTypeScript());
  }

  get mode(): "workers" | "inline" | "idle" {
    return !this.started ? "idle" : this.inline ? "inline" : "workers";
  }

  get queued(): number {
    return this.queue.length;
  }

  submit(job: SimJob): JobHandle {
    this.warm();
    if (this.queue.length >= MAX_QUEUED_JOBS) throw new PoolBusyError();
    const control = new RunControl();
    let settle!: (o: SimOutcome) => void;
    const done = new Promise<SimOutcome>((resolve) => (settle = resolve));
    const pending: Pending = { id: this.nextId++, job, control, state: "queued", settle: () => {}, timers: [] };
    pending.settle = (outcome) => {
      if (pending.state === "settled") return;
      pending.state = "settled";
      for (const t of pending.timers) clearTimeout(t);
      this.live.delete(pending.id);
      settle(outcome);
    };
    this.live.set(pending.id, pending);
    this.queue.push(pending);
    this.dispatch();
    return {
      id: pending.id,
      done,
      state: () => pending.state,
      progress: () => (pending.state === "queued" ? 0 : Math.min(1, Math.max(0, control.progress))),
      cancel: () => this.cancel(pending),
    };
  }

  /** Terminate every worker and fail what is pending (tests, shutdown). */
  async shutdown(): Promise<void> {
    for (const p of [...this.live.values()]) p.settle({ ok: false, reason: "worker", error: "The simulator was shut down." });
    this.queue = [];
    const slots = this.slots;
    this.slots = [];
    this.started = false;
    this.inline = false;
    await Promise.all(slots.map((s) => s.worker.terminate().catch(() => 0)));
  }

  private cancel(p: Pending): void {
    if (p.state === "settled") return;
    p.control.cancel();
    if (p.state === "queued") {
      this.queue = this.queue.filter((q) => q !== p);
      p.settle({ ok: false, reason: "cancelled", error: "Cancelled." });
      return;
    }
    const slot = p.slot;
    if (!slot) return; // inline: the engine polls the flag itself
    p.timers.push(
      setTimeout(() => {
        if (p.state === "settled" || slot.current !== p) return;
        this.replace(slot, `did not stop within ${CANCEL_GRACE_MS} ms of a cancel`);
        p.settle({ ok: false, reason: "cancelled", error: "Cancelled." });
      }, CANCEL_GRACE_MS),
    );
  }

  private spawn(tsLoader: boolean): void {
    let worker: Worker;
    try {
      worker = new Worker(new URL("./sim-worker.ts", import.meta.url), {
        name: "tidewright-sim",
        execArgv: tsLoader ? TSX_LOADER_ARGS : undefined,
      });
    } catch (err) {
      this.onStartFailure(err, tsLoader);
      return;
    }
    const slot: Slot = { worker, ready: false, current: null, tsLoader };
    this.slots.push(slot);
    worker.unref();
    const startTimer = setTimeout(() => {
      if (!slot.ready) {
        this.removeSlot(slot);
        void worker.terminate();
        this.onStartFailure(new Error(`worker did not start within ${WORKER_START_TIMEOUT_MS} ms`), tsLoader);
      }
    }, WORKER_START_TIMEOUT_MS);
    startTimer.unref();

    worker.on("message", (message: FromWorker) => {
      if (message.type === "ready") {
        clearTimeout(startTimer);
        slot.ready = true;
        this.startFailures = 0;
        this.dispatch();
        return;
      }
      const p = slot.current;
      if (!p || p.id !== message.jobId) return;
      slot.current = null;
      worker.unref();
      if (message.type === "done") p.settle({ ok: true, output: message.output });
      else p.settle({ ok: false, reason: message.reason, error: message.error });
      this.dispatch();
    });
    worker.on("error", (err) => {
      clearTimeout(startTimer);
      if (!slot.ready) {
        this.removeSlot(slot);
        this.onStartFailure(err, tsLoader);
        return;
      }
      console.error("[runs] simulation worker crashed:", err);
      this.failCurrent(slot, `The simulation worker crashed: ${err.message}`);
    });
    worker.on("exit", (code) => {
      clearTimeout(startTimer);
      if (!this.slots.includes(slot)) return; // replaced or shut down on purpose
      this.removeSlot(slot);
      if (!slot.ready) return; // start failure, handled by "error"
      this.failCurrent(slot, `The simulation worker stopped unexpectedly (exit code ${code}).`);
      if (this.started && !this.inline) this.spawn(slot.tsLoader);
    });
  }

  private onStartFailure(err: unknown, tsLoader: boolean): void {
    if (!this.started) return; // shut down meanwhile
    const code = (err as NodeJS.ErrnoException | undefined)?.code;
    if (!tsLoader && code === "ERR_UNKNOWN_FILE_EXTENSION") {
      // The entry is TypeScript source and no loader was given: try again through tsx.
      this.spawn(true);
      return;
    }
    this.startFailures++;
    console.error(`[runs] simulation worker failed to start (attempt ${this.startFailures}):`, err);
    if (this.startFailures < MAX_CONSECUTIVE_START_FAILURES) {
      this.spawn(tsLoader);
      return;
    }
    if (!this.slots.some((s) => s.ready)) this.useInline(err instanceof Error ? err.message : String(err));
  }

  private useInline(why: string): void {
    if (!this.inline) {
      console.error(
        `[runs] no simulation worker could start (${why}); running simulations in the server thread. ` +
          "Requests will stall while a simulation runs.",
      );
    }
    this.inline = true;
    this.dispatch();
  }

  private removeSlot(slot: Slot): void {
    this.slots = this.slots.filter((s) => s !== slot);
  }

  private failCurrent(slot: Slot, error: string): void {
    const p = slot.current;
    slot.current = null;
    if (p) p.settle({ ok: false, reason: p.control.cancelled ? "cancelled" : "worker", error: p.control.cancelled ? "Cancelled." : error });
  }

  /** Terminate a worker that will not finish, and start another in its place. */
  private replace(slot: Slot, why: string): void {
    console.warn(`[runs] replacing a simulation worker that ${why}`);
    this.removeSlot(slot);
    slot.current = null;
    void slot.worker.terminate();
    if (this.started && !this.inline) this.spawn(slot.tsLoader);
  }

  private dispatch(): void {
    if (this.inline) {
      this.dispatchInline();
      return;
    }
    for (const slot of this.slots) {
      if (!slot.ready || slot.current) continue;
      const p = this.queue.shift();
      if (!p) return;
      slot.current = p;
      p.slot = slot;
      p.state = "running";
      slot.worker.ref();
      const budget = p.job.wallBudgetMs + WATCHDOG_GRACE_MS;
      p.timers.push(
        setTimeout(() => {
          if (p.state === "settled" || slot.current !== p) return;
          this.replace(slot, `ran past its wall-time budget (${p.job.wallBudgetMs} ms)`);
          p.settle({
            ok: false,
            reason: "budget",
            error: `The simulation took longer than its wall-time budget of ${(p.job.wallBudgetMs / 1000).toFixed(0)} s and was stopped.`,
          });
        }, budget),
      );
      const message: ToWorker = { type: "run", jobId: p.id, job: p.job, control: p.control.buffer };
      slot.worker.postMessage(message);
    }
  }

  private dispatchInline(): void {
    if (this.inlineBusy) return;
    const p = this.queue.shift();
    if (!p) return;
    this.inlineBusy = true;
    p.state = "running";
    // Yield first so the request that queued the job can finish its own work.
    setImmediate(() => {
      import("./execute")
        .then(({ executeJob }) => p.settle(executeJob(p.job, p.control)))
        .catch((err: unknown) => p.settle({ ok: false, reason: "engine", error: err instanceof Error ? err.message : String(err) }))
        .finally(() => {
          this.inlineBusy = false;
          this.dispatchInline();
        });
    });
  }
}

const POOL_KEY = Symbol.for("tidewright.sim-pool");

/** The process's pool (kept on globalThis: Next may bundle this module into several chunks). */
export function simulationPool(): SimulationPool {
  const g = globalThis as unknown as Record<symbol, SimulationPool | undefined>;
  g[POOL_KEY] ??= new SimulationPool();
  return g[POOL_KEY];
}

/** Start the workers ahead of the first run (e.g. when a page that can launch runs loads). */
export function warmSimulationPool(): void {
  // `next build` imports route modules and may render pages: never start threads there.
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  simulationPool().warm();
}
