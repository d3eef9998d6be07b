/** Geometry of the pressure–volume and flow–volume loops (drawn as SVG). */
import { niceTicks } from "./format";

export interface LoopPoint {
  x: number;
  y: number;
}

export interface Extent {
  min: number;
  max: number;
}

export function loopPoints(xs: ArrayLike<number> | undefined, ys: ArrayLike<number> | undefined): LoopPoint[] {
  if (!xs || !ys) return [];
  const n = Math.min(xs.length, ys.length);
  const points: LoopPoint[] = [];
  for (let i = 0; i < n; i += 1) {
    const x = xs[i];
    const y = ys[i];
    if (Number.isFinite(x) && Number.isFinite(y)) points.push({ x, y });
  }
  return points;
}

/** Extent of the values, padded 5 % and widened to round ticks; includes zero so the origin is on the plot. */
export function paddedExtent(values: number[], includeZero = true): Extent {
  let min = includeZero ? 0 : Infinity;
  let max = includeZero ? 0 : -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!Number.isFinite(min) || !Number.isFinite(max)) return { min: 0, max: 1 };
  if (min === max) return { min: min - 1, max: max + 1 };
  const pad = (max - min) * 0.05;
  const ticks = niceTicks(min - pad, max + pad, 5);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : max - min;
  return {
    min: Math.min(min - pad, Math.floor((min - pad) / step) * step),
    max: Math.max(max + pad, Math.ceil((max + pad) / step) * step),
  };
}

export interface PlotBox {
  left: number;
  top: number;
  width: number;
  height: number;
}

export function scaleLinear(domain: Extent, start: number, end: number): (v: number) => number {
  const span = domain.max - domain.min || 1;
  return (v) => start + ((v - domain.min) / span) * (end - start);
}

/**
 * SVG path through the points in time order. Left open: a breath that does not return to its start
 * (incomplete exhalation, a leak) should show the gap, not a drawn closing segment.
 */
export function loopPath(points: readonly LoopPoint[], x: (v: number) => number, y: (v: number) => number): string {
  if (points.length === 0) return "";
  const parts = points.map((p, i) => `${i === 0 ? "M" : "L"}${x(p.x).toFixed(1)},${y(p.y).toFixed(1)}`);
  return parts.join("");
}
