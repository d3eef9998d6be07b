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
  return minMaxBucketsOf(() => series, start, end, buckets, index);
}

/**
 * minMaxBuckets over samples read through `read(a, b)` (which must make at least [a, b) readable):
 * a stored run decodes only the stretches the index does not cover.
 */
function minMaxBucketsOf(read: RangeReader, start: number, end: number, buckets: number, index?: SignalIndex): number[] {
  const n = end - start;
  const out = new Array<number>(buckets * 2);
  const e: Extremes = { min: 0, iMin: 0, max: 0, iMax: 0 };
  for (let b = 0; b < buckets; b++) {
    const i0 = start + Math.floor((b * n) / buckets);
    const i1 = start + Math.floor(((b + 1) * n) / buckets);
    rangeExtremes(read, index, i0, i1, e);
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

type RangeReader = (a: number, b: number) => ArrayLike<number>;

/**
 * Block min–max index: per block of `block` samples (from sample 0), the minimum and maximum of each
 * signal and where they occur. A bucket spanning whole blocks then reads the blocks instead of every
 * sample, with the exact same result as the plain scan (first occurrence wins ties in both). Built once
 * per cached run, or stored with the run (format v2's overview) so a cold window need not inflate a
 * signal whose buckets fall on block edges. 50 samples = 50 ms at 1 kHz: a whole 10-minute run in 1000
 * buckets (600 samples each) is then served from the blocks alone.
 */
export const INDEX_BLOCK = 50;

export interface SignalIndex {
  block: number;
  min: Float32Array;
  max: Float32Array;
  iMin: Uint32Array;
  iMax: Uint32Array;
}
export type MinMaxIndex = Partial<Record<WaveformSignal, SignalIndex>>;

export function buildSignalIndex(series: ArrayLike<number>, block = INDEX_BLOCK): SignalIndex {
  const n = series.length;
  const blocks = Math.ceil(n / block);
  const out: SignalIndex = {
    block,
    min: new Float32Array(blocks),
    max: new Float32Array(blocks),
    iMin: new Uint32Array(blocks),
    iMax: new Uint32Array(blocks),
  };
  for (let b = 0; b < blocks; b++) {
    const i0 = b * block;
    const i1 = Math.min(n, i0 + block);
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

/**
 * Min and max of series[i0, i1) (i1 > i0), through the index where whole blocks are covered: a raw
 * head [i0, first block), the blocks, a raw tail. Same visiting order as the plain scan, so the same
 * result; raw samples are read only for a non-empty head or tail.
 */
function rangeExtremes(read: RangeReader, index: SignalIndex | undefined, i0: number, i1: number, out: Extremes): void {
  const block = index?.block ?? 1;
  const firstBlock = index ? Math.ceil(i0 / block) : 0;
  const lastBlock = index ? Math.floor(i1 / block) : 0; // exclusive; the last block may be short only at n
  if (!index || lastBlock - firstBlock < 1) {
    const series = read(i0, i1);
    out.min = series[i0];
    out.max = out.min;
    out.iMin = i0;
    out.iMax = i0;
    scanInto(series, i0 + 1, i1, out);
    return;
  }
  let b0 = firstBlock;
  const headEnd = firstBlock * block;
  if (headEnd > i0) {
    const series = read(i0, headEnd);
    out.min = series[i0];
    out.max = out.min;
    out.iMin = i0;
    out.iMax = i0;
    scanInto(series, i0 + 1, headEnd, out);
  } else {
    out.min = index.min[b0];
    out.iMin = index.iMin[b0];
    out.max = index.max[b0];
    out.iMax = index.iMax[b0];
    b0++;
  }
  for (let b = b0; b < lastBlock; b++) {
    if (index.min[b] < out.min) {
      out.min = index.min[b];
      out.iMin = index.iMin[b];
    }
    if (index.max[b] > out.max) {
      out.max = index.max[b];
      out.iMax = index.iMax[b];
    }
  }
  const tailStart = lastBlock * block;
  if (i1 > tailStart) scanInto(read(tailStart, i1), tailStart, i1, out);
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

/**
 * What a window reads: sample times, signal values and (optionally) a block index per signal. Either
 * decoded arrays (arraySource) or a stored run decoded on demand (lib/waveform/codec.ts).
 */
export interface WaveformSource {
  readonly length: number;
  time(i: number): number;
  /** The signal's values, with at least samples [start, end) readable (indexed from sample 0). */
  values(signal: WaveformSignal, start: number, end: number): ArrayLike<number>;
  index(signal: WaveformSignal): SignalIndex | undefined;
}

export function arraySource(w: Waveforms, index?: MinMaxIndex): WaveformSource {
  return {
    length: w.t.length,
    time: (i) => w.t[i],
    values: (s) => w[s],
    index: (s) => index?.[s],
  };
}

function lowerBoundBy(src: WaveformSource, x: number): number {
  let lo = 0;
  let hi = src.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (src.time(mid) < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function upperBoundBy(src: WaveformSource, x: number): number {
  let lo = 0;
  let hi = src.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (src.time(mid) <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
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
  return sourceWindow(arraySource(w, index), steps, req);
}

export function sourceWindow(src: WaveformSource, steps: readonly StepInterval[], req: WindowRequest): WaveformWindow {
  const n = src.length;
  const tEnd = n > 0 ? src.time(n - 1) : 0;
  const from = Math.max(0, Math.min(req.from ?? 0, tEnd));
  const to = Math.max(from, Math.min(req.to ?? tEnd, tEnd));
  const start = lowerBoundBy(src, from);
  const end = upperBoundBy(src, to);
  const count = Math.max(0, end - start);
  const signals: Partial<Record<WaveformSignal, number[]>> = {};
  let t: number[];

  if (count <= req.points) {
    t = new Array<number>(count);
    for (let i = start; i < end; i++) t[i - start] = src.time(i);
    for (const s of req.signals) signals[s] = count > 0 ? copyRange(src.values(s, start, end), start, end) : [];
  } else {
    const buckets = Math.max(1, Math.floor(req.points / 2));
    t = new Array<number>(buckets * 2);
    for (let b = 0; b < buckets; b++) {
      const i0 = start + Math.floor((b * count) / buckets);
      const i1 = start + Math.floor(((b + 1) * count) / buckets);
      t[2 * b] = src.time(i0);
      t[2 * b + 1] = src.time(i1 - 1);
    }
    for (const s of req.signals) {
      signals[s] = minMaxBucketsOf((a, b) => src.values(s, a, b), start, end, buckets, src.index(s));
    }
  }
  return { from, to, points: t.length, t, signals, steps: stepsInWindow(steps, from, to) };
}
