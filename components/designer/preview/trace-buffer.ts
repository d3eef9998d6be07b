/**
 * A sliding window of trace samples in typed arrays (what uPlot wants), appended to every frame
 * without reallocating: when the arrays fill up, the newest part is moved to the front.
 * Also keeps the step changes inside the window, for the markers.
 */
export interface StepMark {
  t: number;
  step: string;
}

export class TraceBuffer {
  readonly t: Float64Array;
  readonly paw: Float64Array;
  readonly flow: Float64Array;
  length = 0;
  marks: StepMark[] = [];
  private lastStep: string | null = null;
  private lastKeptT = -Infinity;

  constructor(
    private readonly capacity: number,
    /** Seconds of history kept when compacting. */
    private readonly windowS: number,
    /** Minimum spacing of kept samples, s: the engine records every physics step (1 ms). */
    private readonly minDtS: number,
  ) {
    this.t = new Float64Array(capacity);
    this.paw = new Float64Array(capacity);
    this.flow = new Float64Array(capacity);
  }

  push(samples: { t: number[]; paw: number[]; flow: number[]; step: string[] }): void {
    for (let i = 0; i < samples.t.length; i++) {
      const t = samples.t[i];
      const step = samples.step[i];
      if (step !== this.lastStep) {
        this.marks.push({ t, step });
        this.lastStep = step;
      } else if (t - this.lastKeptT < this.minDtS) continue;
      if (this.length === this.capacity) this.compact(t);
      this.t[this.length] = t;
      this.paw[this.length] = samples.paw[i];
      this.flow[this.length] = samples.flow[i];
      this.length++;
      this.lastKeptT = t;
    }
  }

  private compact(now: number): void {
    const from = now - this.windowS;
    let start = 0;
    while (start < this.length && this.t[start] < from) start++;
    // Never keep more than half, so compaction stays rare.
    start = Math.max(start, this.length >> 1);
    this.t.copyWithin(0, start, this.length);
    this.paw.copyWithin(0, start, this.length);
    this.flow.copyWithin(0, start, this.length);
    this.length -= start;
    const first = this.t[0];
    this.marks = this.marks.filter((m, i, all) => m.t >= first || all[i + 1]?.t > first);
  }

  /** The filled part, as views (no copies). */
  view(): [Float64Array, Float64Array, Float64Array] {
    return [this.t.subarray(0, this.length), this.paw.subarray(0, this.length), this.flow.subarray(0, this.length)];
  }

  clear(): void {
    this.length = 0;
    this.marks = [];
    this.lastStep = null;
    this.lastKeptT = -Infinity;
  }
}
