/**
 * Messages between the server and the simulation worker (lib/runs/sim-worker.ts), and the job and
 * result shapes shared with the in-process fallback. Pure data: structured-cloneable.
 */
import type { Alarm, Breath, PatientInput, RigInput, StepInterval, Summary, Waveforms } from "@/lib/sim/types";
import type { SequenceDefinition } from "@/machines/schema";

export interface SimJob {
  definition: SequenceDefinition;
  patient: PatientInput;
  rig: RigInput | "ideal";
  durationS: number;
  seed: number;
  /** Engine wall-time budget, ms (SimOptions.wallBudgetMs). */
  wallBudgetMs: number;
}

export interface SimOutput {
  stepNames: string[];
  steps: StepInterval[];
  breaths: Breath[];
  alarms: Alarm[];
  summary: Summary;
  /** Engine wall time, ms. */
  wallMs: number;
  /** Compressed waveforms (lib/waveform/format.ts), ready for the bytea column. */
  waveform: Uint8Array;
  /** The same waveforms uncompressed, handed over (transferred) for the window cache. */
  raw: Waveforms;
}

export type FailureReason = "cancelled" | "engine" | "budget" | "worker";

export type SimOutcome =
  | { ok: true; output: SimOutput }
  | { ok: false; reason: FailureReason; error: string };

/**
 * Control block shared with the worker (SharedArrayBuffer): the engine runs synchronously, so the
 * worker cannot read messages mid-run; it polls the cancel flag and writes its progress here.
 */
export const CONTROL_BYTES = 16;
export const CANCEL_INDEX = 0; // Int32 slot: 1 = stop
export const PROGRESS_OFFSET = 8; // Float64 at byte 8: fraction done

export class RunControl {
  readonly flags: Int32Array;
  readonly progressView: Float64Array;
  constructor(readonly buffer: SharedArrayBuffer = new SharedArrayBuffer(CONTROL_BYTES)) {
    this.flags = new Int32Array(buffer, 0, 2);
    this.progressView = new Float64Array(buffer, PROGRESS_OFFSET, 1);
  }
  cancel(): void {
    Atomics.store(this.flags, CANCEL_INDEX, 1);
  }
  get cancelled(): boolean {
    return Atomics.load(this.flags, CANCEL_INDEX) === 1;
  }
  get progress(): number {
    return this.progressView[0];
  }
  set progress(fraction: number) {
    this.progressView[0] = fraction;
  }
}

export type ToWorker = { type: "run"; jobId: number; job: SimJob; control: SharedArrayBuffer };

export type FromWorker =
  | { type: "ready" }
  | { type: "done"; jobId: number; output: SimOutput }
  | { type: "failed"; jobId: number; reason: FailureReason; error: string };

/** Every distinct ArrayBuffer under the output, for a zero-copy postMessage. */
export function transferablesOf(output: SimOutput): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const a of [output.waveform, ...Object.values(output.raw)] as ArrayBufferView[]) {
    if (a.buffer instanceof ArrayBuffer) buffers.add(a.buffer);
  }
  return [...buffers];
}
