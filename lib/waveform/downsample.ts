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
): number[] {
  const n = end - start;
  const out = new Array<number>(buckets * 2);
  for (let b = 0; b < buckets; b++) {
    const i0 = start + Math.floor((b * n) / buckets);
    const i1 = start + Math.floor(((b + 1) * n) / buckets);
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
    if (iMin <= iMax) {
      out[2 * b] = min;
      out[2 * b + 1] = max;
    } else {
      out[2 * b] = max;
      out[2 * b + 1] = min;
    }
  }
  return out;
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
    for (const s of req.signals) signals[s] = minMaxBuckets(w[s], start, end, buckets);
  }
  return { from, to, points: t.length, t, signals, steps: stepsInWindow(steps, from, to) };
}
