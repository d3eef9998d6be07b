/**
 * One simulation job: engine run + waveform encoding. Runs inside the worker thread, or in the
 * server's own thread when no worker can start (lib/runs/pool.ts). No server-only imports: the worker
 * is plain Node.
 */
import { simulate } from "@/lib/sim/simulate";
import { encodeWaveforms } from "@/lib/waveform/encode";
import type { RunControl, SimJob, SimOutcome } from "./protocol";

/** Progress is written at most this often (the engine may call back far more). */
const PROGRESS_MIN_STEP = 0.005;

export function executeJob(job: SimJob, control: RunControl): SimOutcome {
  const started = performance.now();
  try {
    const result = simulate({
      definition: job.definition,
      patient: job.patient,
      rig: job.rig,
      durationS: job.durationS,
      seed: job.seed,
      wallBudgetMs: job.wallBudgetMs,
      onProgress: (fraction) => {
        if (fraction - control.progress >= PROGRESS_MIN_STEP || fraction >= 1) control.progress = fraction;
      },
      shouldStop: () => control.cancelled,
    });
    if (control.cancelled) return { ok: false, reason: "cancelled", error: "Cancelled." };
    // The engine's sample clock (lib/sim/simulate.ts defaults: dt 1 ms, the rig's scan period, 10 ms on
    // the ideal circuit). Only a hint: the encoder stores t unless the grid reproduces it exactly.
    const scanS = job.rig === "ideal" ? 0.01 : job.rig.scanPeriodS;
    const waveform = encodeWaveforms(result.waveforms, typeof scanS === "number" ? { timeGrid: { dtS: 0.001, scanS } } : {});
    control.progress = 1;
    return {
      ok: true,
      output: {
        stepNames: result.stepNames,
        steps: result.steps,
        breaths: result.breaths,
        alarms: result.alarms,
        summary: result.summary,
        wallMs: result.wallMs,
        waveform,
        raw: result.waveforms,
      },
    };
  } catch (err) {
    if (control.cancelled) return { ok: false, reason: "cancelled", error: "Cancelled." };
    const message = err instanceof Error ? err.message : String(err);
    // lib/sim/errors.ts SimError carries a code ("budget", "cancelled", "loop", "bad-input", …).
    const code = (err as { code?: unknown } | null)?.code;
    if (code === "cancelled") return { ok: false, reason: "cancelled", error: "Cancelled." };
    const overBudget = code === "budget" || performance.now() - started >= job.wallBudgetMs;
    return { ok: false, reason: overBudget ? "budget" : "engine", error: message || "The engine stopped with an error." };
  }
}
