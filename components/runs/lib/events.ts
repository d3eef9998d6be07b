/**
 * The alarm and event list: engine alarms plus the per-breath asynchrony flags, in time order, so a reviewer
 * can walk through everything notable in a run and jump the charts to it.
 */
import type { Alarm, Breath } from "@/lib/sim/types";

export type EventPriority = Alarm["priority"];

export interface RunEvent {
  id: string;
  t: number; // s
  source: "alarm" | "event";
  kind: string;
  message: string;
  /** Alarms only (IEC 60601-1-8 priority). */
  priority: EventPriority | null;
  /** Position in the breath list for breath events. */
  breathPosition: number | null;
}

const FLAG_TEXT: Record<Breath["flags"][number], string> = {
  "double-trigger": "Double trigger",
  "auto-trigger": "Auto-trigger (no effort under way)",
  "short-cycle": "Short cycle (Ti under half the mean)",
  "prolonged-cycle": "Prolonged cycle (Ti over twice the mean)",
};

export const PRIORITY_LABELS: Record<EventPriority, string> = { high: "High", medium: "Medium", low: "Low" };

export function buildEventList(alarms: readonly Alarm[], breaths: readonly Breath[]): RunEvent[] {
  const events: RunEvent[] = alarms.map((alarm, i) => ({
    id: `alarm-${i}`,
    t: alarm.t,
    source: "alarm",
    kind: alarm.kind,
    message: alarm.message,
    priority: alarm.priority,
    breathPosition: null,
  }));
  breaths.forEach((breath, position) => {
    for (const flag of breath.flags) {
      events.push({
        id: `breath-${position}-${flag}`,
        t: breath.start,
        source: "event",
        kind: flag,
        message: `${FLAG_TEXT[flag]}, breath ${breath.index}`,
        priority: null,
        breathPosition: position,
      });
    }
  });
  // Stable by time; at equal times alarms first.
  return events
    .map((event, order) => ({ event, order }))
    .sort((x, y) => x.event.t - y.event.t || rank(x.event) - rank(y.event) || x.order - y.order)
    .map(({ event }) => event);
}

function rank(event: RunEvent): number {
  return event.source === "alarm" ? 0 : 1;
}
