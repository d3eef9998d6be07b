/**
 * The summary figures the run view and the compare table show, in one list, so the two agree on labels,
 * units and precision.
 */
import type { Summary } from "@/lib/sim/types";

export type SummaryGroup = "pressure" | "volume" | "timing" | "trigger" | "asynchrony";

export interface SummaryField {
  key: string;
  label: string;
  /** Display unit; counts name what they count so every figure carries a unit. */
  unit: string;
  digits: number;
  group: SummaryGroup;
  /** I:E is stored as x in 1:x and shown that way. */
  kind?: "ie";
  get: (summary: Summary) => number | null;
}

export const SUMMARY_GROUP_LABELS: Record<SummaryGroup, string> = {
  pressure: "Pressure",
  volume: "Volume and flow",
  timing: "Timing",
  trigger: "Trigger latency",
  asynchrony: "Asynchrony",
};

export const SUMMARY_FIELDS: readonly SummaryField[] = [
  { key: "pip", label: "PIP", unit: "cmH2O", digits: 1, group: "pressure", get: (s) => s.pip },
  { key: "pplat", label: "Plateau", unit: "cmH2O", digits: 1, group: "pressure", get: (s) => s.pplat },
  { key: "peep", label: "PEEP achieved", unit: "cmH2O", digits: 1, group: "pressure", get: (s) => s.peep },
  { key: "vti", label: "Vt inspired", unit: "mL", digits: 0, group: "volume", get: (s) => s.vti },
  { key: "vte", label: "Vt expired", unit: "mL", digits: 0, group: "volume", get: (s) => s.vte },
  { key: "minuteVolume", label: "Minute volume", unit: "L/min", digits: 2, group: "volume", get: (s) => s.minuteVolume },
  { key: "peakFlow", label: "Peak flow", unit: "L/min", digits: 1, group: "volume", get: (s) => s.peakFlow },
  { key: "rr", label: "RR", unit: "/min", digits: 1, group: "timing", get: (s) => s.rr },
  { key: "ie", label: "I:E", unit: "ratio", digits: 1, group: "timing", kind: "ie", get: (s) => s.ie },
  { key: "breaths", label: "Breaths", unit: "breaths", digits: 0, group: "timing", get: (s) => s.breaths },
  { key: "latencyMean", label: "Latency mean", unit: "ms", digits: 0, group: "trigger", get: (s) => s.triggerLatencyMs.mean },
  { key: "latencyP95", label: "Latency p95", unit: "ms", digits: 0, group: "trigger", get: (s) => s.triggerLatencyMs.p95 },
  { key: "latencyMax", label: "Latency max", unit: "ms", digits: 0, group: "trigger", get: (s) => s.triggerLatencyMs.max },
  { key: "latencyN", label: "Triggered breaths", unit: "breaths", digits: 0, group: "trigger", get: (s) => s.triggerLatencyMs.n },
  { key: "asynchronyIndex", label: "Asynchrony index", unit: "%", digits: 1, group: "asynchrony", get: (s) => s.asynchronyIndex },
  { key: "efforts", label: "Patient efforts", unit: "efforts", digits: 0, group: "asynchrony", get: (s) => s.efforts },
  { key: "ineffectiveEfforts", label: "Ineffective efforts", unit: "efforts", digits: 0, group: "asynchrony", get: (s) => s.ineffectiveEfforts },
  { key: "doubleTriggers", label: "Double triggers", unit: "events", digits: 0, group: "asynchrony", get: (s) => s.doubleTriggers },
  { key: "autoTriggers", label: "Auto-triggers", unit: "events", digits: 0, group: "asynchrony", get: (s) => s.autoTriggers },
  { key: "shortCycles", label: "Short cycles", unit: "events", digits: 0, group: "asynchrony", get: (s) => s.shortCycles },
  { key: "prolongedCycles", label: "Prolonged cycles", unit: "events", digits: 0, group: "asynchrony", get: (s) => s.prolongedCycles },
];

export const SUMMARY_GROUPS: readonly SummaryGroup[] = ["pressure", "volume", "timing", "trigger", "asynchrony"];
