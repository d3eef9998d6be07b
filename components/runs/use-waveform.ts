"use client";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { type SignalKey, type WaveformWindow, fetchWaveform, roundMs } from "./lib/api";
import type { TimeWindow } from "./lib/time-window";

/** Points asked of the server for a chart this wide: two per pixel (min and max), in steps of 100. */
export function pointsForWidth(widthPx: number): number {
  return Math.min(4000, Math.max(200, Math.round((widthPx * 2) / 100) * 100));
}

/**
 * A window of a run's waveforms. While a finer window loads, the previous one stays on screen (the chart is
 * already zoomed to the new range), so zoom and pan never blank the traces.
 */
export function useWaveform(
  runId: string,
  window: TimeWindow,
  points: number,
  signals: readonly SignalKey[],
  enabled = true,
) {
  const from = roundMs(window.from);
  const to = roundMs(window.to);
  return useQuery<WaveformWindow>({
    queryKey: ["runs", runId, "waveform", from, to, points, signals.join(",")],
    queryFn: ({ signal }) => fetchWaveform(runId, { from, to, points, signals }, signal),
    placeholderData: keepPreviousData,
    staleTime: Infinity,
    enabled,
  });
}
