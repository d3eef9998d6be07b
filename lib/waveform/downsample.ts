/**
 * Windowing and peak-keeping downsampling of full-resolution waveforms. Pure.
 *
 * Method: min–max per bucket. The window's samples are split into ⌊points/2⌋ buckets of equal sample
 * count; each bucket gives two output points. All signals share one time axis, so the two output times
 * of a bucket are the times of its first and last samples; per signal the two values are the bucket's
 * minimum and maximum, in the order they occur. Every sample's value therefore lies within the drawn
 * envelope, and the window's true maximum and minimum are output exactly (their times are displaced by
 * less than one bucket). A window with no more samples than `points` is returned as is.
 */
import type { StepInterval, Waveforms } from "@/lib/sim/types";
import type { WaveformSignal } from "@/lib/validation/runs";

export interface WindowRequest {
  from?: number;
  to?: number;
  points: number;
  signals: readonly WaveformSignal[];
}

export interface WaveformWindow {
  from: number;
  to: number;
  points: number;
  t: number[];
  signals: Partial<Record<WaveformSignal, number[]>>;
  steps: StepInterval[];
}

/** First index i with t[i] ≥ x (t ascending). */
export function lowerBound(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index i with t[i] > x (t ascending). */
export function upperBound(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Step intervals overlapping [from, to], clipped to it. */
export function stepsInWindow(steps: readonly StepInterval[], from: number, to: number): StepInterval[] {
  const out: StepInterval[] = [];
  for (const s of steps) {
    if (s.to < from || s.from > to) continue;
    out.push({ step: s.step, from: Math.max(s.from, from), to: Math.min(s.to, to) });
  }
  return out;
}

/**
 * Min–max reduction of samples [start, end) of `series` into `buckets` equal-count buckets: two values
 * per bucket (its minimum and maximum, in the order they occur).
 */
export function minMaxBuckets(
  series: ArrayLike<number>,
  start: number,
  end: number,
  buckets: number,
  index?: SignalIndex,
): number[] {
  const n = end - start;
  const out = new Array<number>(buckets * 2);
  const e: Extremes = { min: 0, iMin: 0, max: 0, iMax: 0 };
  for (let b = 0; b < buckets; b++) {
    const i0 = start + Math.floor((b * n) / buckets);
    const i1 = start + Math.floor(((b + 1) * n) / buckets);
    rangeExtremes(series, index, i0, i1, e);
    if (e.iMin <= e.iMax) {
      out[2 * b] = e.min;
      out[2 * b + 1] = e.max;
    } else {
      out[2 * b] = e.max;
      out[2 * b + 1] = e.min;
    }
  }
  return out;
}

/**
 * Block min–max index: per block of BLOCK samples, the minimum and maximum of each signal and where
 * they occur. A bucket spanning many blocks then reads the blocks instead of every sample, with the
 * exact same result as the plain scan (first occurrence wins ties in both). Built once per cached run.
 */
export const INDEX_BLOCK = 64;

export interface SignalIndex {
  min: Float32Array;
  max: Float32Array;
  iMin: Uint32Array;
  iMax: Uint32Array;
}
export type MinMaxIndex = Partial<Record<WaveformSignal, SignalIndex>>;

export function buildSignalIndex(series: ArrayLike<number>): SignalIndex {
  const n = series.length;
  const blocks = Math.ceil(n / INDEX_BLOCK);
  const out: SignalIndex = {
    min: new Float32Array(blocks),
    max: new Float32Array(blocks),
    iMin: new Uint32Array(blocks),
    iMax: new Uint32Array(blocks),
  };
  for (let b = 0; b < blocks; b++) {
    const i0 = b * INDEX_BLOCK;
    const i1 = Math.min(n, i0 + INDEX_BLOCK);
    let min = series[i0];
    let max = min;
    let iMin = i0;
    let iMax = i0;
    for (let i = i0 + 1; i < i1; i++) {
      const v = series[i];
      if (v < min) {
        min = v;
        iMin = i;
      } else if (v > max) {
        max = v;
        iMax = i;
      }
    }
    out.min[b] = min;
    out.max[b] = max;
    out.iMin[b] = iMin;
    out.iMax[b] = iMax;
  }
  return out;
}

interface Extremes {
  min: number;
  iMin: number;
  max: number;
  iMax: number;
}

/** Min and max of series[i0, i1) (i1 > i0), through the index where whole blocks are covered. */
function rangeExtremes(series: ArrayLike<number>, index: SignalIndex | undefined, i0: number, i1: number, out: Extremes): void {
  out.min = series[i0];
  out.max = out.min;
  out.iMin = i0;
  out.iMax = i0;
  const firstBlock = index ? Math.ceil((i0 + 1) / INDEX_BLOCK) : 0;
  const lastBlock = index ? Math.floor(i1 / INDEX_BLOCK) : 0; // exclusive
  if (!index || lastBlock - firstBlock < 2) {
    scanInto(series, i0 + 1, i1, out);
    return;
  }
  scanInto(series, i0 + 1, firstBlock * INDEX_BLOCK, out);
  for (let b = firstBlock; b < lastBlock; b++) {
    if (index.min[b] < out.min) {
      out.min = index.min[b];
      out.iMin = index.iMin[b];
    }
    if (index.max[b] > out.max) {
      out.max = index.max[b];
      out.iMax = index.iMax[b];
    }
  }
  scanInto(series, lastBlock * INDEX_BLOCK, i1, out);
}

/** Extend `out` with samples [a, b); first occurrence wins ties. */
function scanInto(series: ArrayLike<number>, a: number, b: number, out: Extremes): void {
  let min = out.min;
  let max = out.max;
  let iMin = out.iMin;
  let iMax = out.iMax;
  for (let i = a; i < b; i++) {
    const v = series[i];
    if (v < min) {
      min = v;
      iMin = i;
    } else if (v > max) {
      max = v;
      iMax = i;
    }
  }
  out.min = min;
  out.max = max;
  out.iMin = iMin;
  out.iMax = iMax;
}

function copyRange(a: ArrayLike<number>, start: number, end: number): number[] {
  const out = new Array<number>(end - start);
  for (let i = start; i < end; i++) out[i - start] = a[i];
  return out;
}

export function waveformWindow(
  w: Waveforms,
  steps: readonly StepInterval[],
  req: WindowRequest,
  index?: MinMaxIndex,
): WaveformWindow {
  const n = w.t.length;
  const tEnd = n > 0 ? w.t[n - 1] : 0;
  const from = Math.max(0, Math.min(req.from ?? 0, tEnd));
  const to = Math.max(from, Math.min(req.to ?? tEnd, tEnd));
  const start = lowerBound(w.t, from);
  const end = upperBound(w.t, to);
  const count = Math.max(0, end - start);
  const signals: Partial<Record<WaveformSignal, number[]>> = {};
  let t: number[];

  if (count <= req.points) {
    t = copyRange(w.t, start, end);
    for (const s of req.signals) signals[s] = copyRange(w[s], start, end);
  } else {
    const buckets = Math.max(1, Math.floor(req.points / 2));
    t = new Array<number>(buckets * 2);
    for (let b = 0; b < buckets; b++) {
      const i0 = start + Math.floor((b * count) / buckets);
      const i1 = start + Math.floor(((b + 1) * count) / buckets);
      t[2 * b] = w.t[i0];
      t[2 * b + 1] = w.t[i1 - 1];
    }
    for (const s of req.signals) signals[s] = minMaxBuckets(w[s], start, end, buckets, index?.[s]);
  }
  return { from, to, points: t.length, t, signals, steps: stepsInWindow(steps, from, to) };
}
