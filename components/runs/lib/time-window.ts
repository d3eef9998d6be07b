/** Time windows of the charts (seconds): clamping, zoom, pan, and mapping breaths and events to windows. */
import type { Breath } from "@/lib/sim/types";

export interface TimeWindow {
  from: number;
  to: number;
}

/** Narrowest window the charts zoom to; a few scan periods at the default 10 ms scan. */
export const MIN_WINDOW_S = 0.05;

export function clampWindow(window: TimeWindow, durationS: number, minWidthS = MIN_WINDOW_S): TimeWindow {
  const total = Math.max(durationS, minWidthS);
  let from = Math.min(window.from, window.to);
  let to = Math.max(window.from, window.to);
  let width = Math.min(Math.max(to - from, minWidthS), total);
  if (!Number.isFinite(width)) width = total;
  if (from < 0) from = 0;
  to = from + width;
  if (to > total) {
    to = total;
    from = Math.max(0, to - width);
  }
  return { from, to };
}

export function fullWindow(durationS: number): TimeWindow {
  return { from: 0, to: Math.max(durationS, MIN_WINDOW_S) };
}

/** factor < 1 zooms in, > 1 zooms out, about the window's centre. */
export function zoomWindow(window: TimeWindow, factor: number, durationS: number): TimeWindow {
  const centre = (window.from + window.to) / 2;
  const half = ((window.to - window.from) * factor) / 2;
  return clampWindow({ from: centre - half, to: centre + half }, durationS);
}

/** Moves by a fraction of the window's width: −0.5 is half a window back in time. */
export function panWindow(window: TimeWindow, fraction: number, durationS: number): TimeWindow {
  const shift = (window.to - window.from) * fraction;
  return clampWindow({ from: window.from + shift, to: window.to + shift }, durationS);
}

export function windowAround(t: number, widthS: number, durationS: number): TimeWindow {
  return clampWindow({ from: t - widthS / 2, to: t + widthS / 2 }, durationS);
}

/** Index into `breaths` (sorted by start) of the breath under time t, or -1 before the first. */
export function breathAtTime(breaths: readonly Breath[], t: number): number {
  let lo = 0;
  let hi = breaths.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (breaths[mid].start <= t) {
      found = mid;
      lo = mid + 1;
    } else {
      hi = mid - 1;
    }
  }
  return found;
}

/** From the breath's start to its end (next breath's start, or start + Ti + Te). */
export function breathSpan(breaths: readonly Breath[], position: number, durationS: number): TimeWindow | null {
  const breath = breaths[position];
  if (!breath) return null;
  const next = breaths[position + 1];
  const end = next ? next.start : Math.min(durationS, breath.start + breath.ti + breath.te);
  const to = end > breath.start ? end : breath.start + Math.max(breath.ti + breath.te, MIN_WINDOW_S);
  return { from: breath.start, to };
}

/**
 * The chart window that shows one breath whole: its span, the effort onset before it when the patient
 * triggered it, and a margin of 15 % each side.
 */
export function breathWindow(breaths: readonly Breath[], position: number, durationS: number): TimeWindow | null {
  const span = breathSpan(breaths, position, durationS);
  if (!span) return null;
  const onset = breaths[position].effortOnset;
  const from = onset !== null && onset < span.from ? onset : span.from;
  const margin = (span.to - from) * 0.15;
  return clampWindow({ from: from - margin, to: span.to + margin }, durationS);
}

export function sameWindow(a: TimeWindow, b: TimeWindow, toleranceS = 1e-6): boolean {
  return Math.abs(a.from - b.from) <= toleranceS && Math.abs(a.to - b.to) <= toleranceS;
}
