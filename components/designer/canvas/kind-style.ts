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

// Hex values of the app palette (app/globals.css @theme): SVG fills and React Flow's inline styles
// cannot use Tailwind classes, so the tokens are mirrored here.
export const KIND_STYLES: Record<StepKind, KindStyle> = {
  inhale: { fill: "#e3f3ef", stroke: "#2d6a63", ink: "#13232d" }, // glass-100 / glass-700
  hold: { fill: "#e7eef0", stroke: "#435d6a", ink: "#13232d" }, // ink-100 / ink-600
  exhale: { fill: "#dfe9f2", stroke: "#3d6482", ink: "#13232d" }, // a blue-grey between ink and glass
  "wait-for-trigger": { fill: "#fbebd9", stroke: "#b9651f", ink: "#4a2a10", dashed: true }, // ember-100 / ember-600
  safe: { fill: "#f3f7f7", stroke: "#1d323e", ink: "#0c171e" }, // ink-50 / ink-800
  custom: { fill: "#f2f1ec", stroke: "#6b6656", ink: "#2d2a22" },
};

/** IEC 60601-1-8 priority colours (red / yellow / cyan) for alarm-raising steps (--color-alarm-*). */
export const ALARM_COLOURS: Record<AlarmSpec["priority"], string> = {
  high: "#d0251b",
  medium: "#e3b505",
  low: "#1aa6c4",
};

export const CANVAS_COLOURS = {
  ink: "#13232d",
  muted: "#5f7884",
  selected: "#22544f",
  /** The warm accent (ember-500): the step the live preview is in. */
  live: "#d7812e",
  error: "#b03b2b",
  warning: "#99501a",
  timer: "#435d6a",
  condition: "#2d6a63",
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
