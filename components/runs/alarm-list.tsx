import type { Alarm, Breath } from "@/lib/sim/types";
import { type EventPriority, PRIORITY_LABELS, type RunEvent, buildEventList } from "./lib/events";
import { formatNumber } from "./lib/format";
import { PANEL } from "./panel";

/** IEC 60601-1-8 priority colours (high red, medium yellow, low cyan), always with the priority in words. */
const PRIORITY_CLASSES: Record<EventPriority, string> = {
  high: "bg-alarm-high text-white",
  medium: "bg-alarm-medium text-ink-950",
  low: "bg-alarm-low text-ink-950",
};

interface AlarmListProps {
  alarms: readonly Alarm[];
  breaths: readonly Breath[];
  onJump: (event: RunEvent) => void;
  /** Id of the event last jumped to. */
  activeId?: string | null;
}

/** Alarms and breath events in time order; a click jumps the charts to that time. */
export function AlarmList({ alarms, breaths, onJump, activeId }: AlarmListProps) {
  const events = buildEventList(alarms, breaths);
  return (
    <section aria-labelledby="run-events-heading" data-testid="alarm-list" className={`${PANEL} p-3`}>
      <h2 id="run-events-heading" className="mb-2 text-sm font-semibold text-ink-800">
        Alarms and events <span className="font-normal text-ink-500">({events.length})</span>
      </h2>
      {events.length === 0 ? (
        <p className="text-xs text-ink-500">No alarms or asynchrony events in this run.</p>
      ) : (
        <ol className="max-h-72 overflow-y-auto text-xs">
          {events.map((event) => (
            <li key={event.id}>
              <button
                type="button"
                onClick={() => onJump(event)}
                aria-current={event.id === activeId ? "true" : undefined}
                data-testid="alarm-row"
                data-t={event.t}
                className={
                  "flex w-full items-baseline gap-2 rounded px-1 py-1 text-left hover:bg-glass-50 " +
                  (event.id === activeId ? "bg-glass-50" : "")
                }
              >
                <span className="w-16 shrink-0 text-right tabular-nums text-ink-600">{formatNumber(event.t, 2)} s</span>
                {event.priority ? (
                  <span className={`shrink-0 rounded px-1 text-[10px] font-semibold uppercase ${PRIORITY_CLASSES[event.priority]}`}>
                    {PRIORITY_LABELS[event.priority]}
                  </span>
                ) : (
                  <span className="shrink-0 rounded border border-ink-300 px-1 text-[10px] uppercase text-ink-600">Event</span>
                )}
                <span className="text-ink-800">{event.message}</span>
              </button>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
