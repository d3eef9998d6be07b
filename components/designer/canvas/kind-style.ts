/**
 * The canvas's visual language (Tidewright's own): ink and sea-glass tones, one warm accent for
 * "waiting on the patient", and IEC 60601-1-8 alarm priority colours reserved for steps that raise
 * alarms (high red, medium amber, low cyan) so a colour on the canvas never means two things.
 */
import type { AlarmSpec, StepKind } from "@/machines/schema";

export interface KindStyle {
  fill: string;
  stroke: string;
  ink: string;
  dashed?: boolean;
}

export const KIND_STYLES: Record<StepKind, KindStyle> = {
  inhale: { fill: "#dcefe9", stroke: "#2e7d6f", ink: "#123c35" },
  hold: { fill: "#e7ebef", stroke: "#566474", ink: "#1f2a35" },
  exhale: { fill: "#dfe8f1", stroke: "#3f6486", ink: "#16304a" },
  "wait-for-trigger": { fill: "#f7e8da", stroke: "#b4622d", ink: "#4a2410", dashed: true },
  safe: { fill: "#eef0f2", stroke: "#2b3440", ink: "#1b222b" },
  custom: { fill: "#f2f1ec", stroke: "#6b6656", ink: "#2d2a22" },
};

/** IEC 60601-1-8 priority colours (red / yellow / cyan) for alarm-raising steps. */
export const ALARM_COLOURS: Record<AlarmSpec["priority"], string> = {
  high: "#c62828",
  medium: "#e0a100",
  low: "#0097b2",
};

export const CANVAS_COLOURS = {
  ink: "#1b222b",
  muted: "#5f6b78",
  selected: "#0f5c7a",
  /** The warm accent: the step the live preview is in. */
  live: "#e2703a",
  error: "#c62828",
  warning: "#b7791f",
  timer: "#566474",
  condition: "#1f6f66",
  event: "#6a4c93",
  added: "#2f8f4e",
  removed: "#b0413e",
  changed: "#2d6cb5",
} as const;

const RANK: Record<AlarmSpec["priority"], number> = { high: 3, medium: 2, low: 1 };

export function highestAlarm(alarms: readonly AlarmSpec[]): AlarmSpec["priority"] | null {
  let best: AlarmSpec["priority"] | null = null;
  for (const a of alarms) if (!best || RANK[a.priority] > RANK[best]) best = a.priority;
  return best;
}

/** The stroke a step is drawn with: its highest entry alarm's priority colour, else its kind's. */
export function stepStroke(kind: StepKind, alarms: readonly AlarmSpec[]): string {
  const alarm = highestAlarm(alarms);
  return alarm ? ALARM_COLOURS[alarm] : KIND_STYLES[kind].stroke;
}
