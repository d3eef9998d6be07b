/**
 * What the chart plugins draw over the traces. Held in a ref the plugins read on every redraw, so steps,
 * breaths and the focus line update without rebuilding the charts.
 */
import type { Breath, StepInterval } from "@/lib/sim/types";

export interface ChartOverlay {
  steps: readonly StepInterval[];
  stepNames: readonly string[];
  breaths: readonly Breath[];
  /** Position in `breaths` of the chosen breath (loops, table selection). */
  selectedBreath: number | null;
  /** A time the charts jumped to (an alarm or event), drawn as a line. */
  focusT: number | null;
}

export type OverlaySource = () => ChartOverlay;

export const EMPTY_OVERLAY: ChartOverlay = { steps: [], stepNames: [], breaths: [], selectedBreath: null, focusT: null };

/** Visible x range of a chart, or null before the scale is set. */
export function xRangeOf(u: { scales: Record<string, { min?: number | null; max?: number | null }> }): {
  min: number;
  max: number;
} | null {
  const { min, max } = u.scales.x ?? {};
  return typeof min === "number" && typeof max === "number" ? { min, max } : null;
}
