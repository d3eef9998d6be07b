/**
 * Two runs' waveform windows on one time axis for the compare overlay. uPlot wants one ascending x array
 * and every series the same length: the union of both time bases, with null where a run has no sample
 * (drawn with spanGaps, so each trace stays continuous).
 */
export interface TimeSeries {
  t: ArrayLike<number>;
  values: ArrayLike<number>[];
}

export interface JoinedSeries {
  t: Float64Array;
  a: (number | null)[][];
  b: (number | null)[][];
}

export function joinOnTime(a: TimeSeries, b: TimeSeries): JoinedSeries {
  const t: number[] = [];
  const outA: (number | null)[][] = a.values.map(() => []);
  const outB: (number | null)[][] = b.values.map(() => []);
  let i = 0;
  let j = 0;
  while (i < a.t.length || j < b.t.length) {
    const ta = i < a.t.length ? a.t[i] : Infinity;
    const tb = j < b.t.length ? b.t[j] : Infinity;
    const now = Math.min(ta, tb);
    t.push(now);
    const takeA = ta === now;
    const takeB = tb === now;
    a.values.forEach((series, k) => outA[k].push(takeA ? numberOrNull(series[i]) : null));
    b.values.forEach((series, k) => outB[k].push(takeB ? numberOrNull(series[j]) : null));
    if (takeA) i += 1;
    if (takeB) j += 1;
  }
  return { t: Float64Array.from(t), a: outA, b: outB };
}

function numberOrNull(value: number | undefined): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}
