"use client";
/**
 * A run: progress while it is queued or running (polled), its error when it failed, then the review view:
 * stacked waveforms first, the numbers beside them (summary, loops, alarms and events), the breath table
 * beneath, CSV behind both. Jumps from the table, the event list and chart clicks move one shared window.
 */
import { useQuery } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import type { Breath } from "@/lib/sim/types";
import { AlarmList } from "./alarm-list";
import { BreathLoops, defaultLoopBreath } from "./breath-loops";
import { BreathTable } from "./breath-table";
import { ChartLegend } from "./charts/chart-legend";
import type { ChartOverlay } from "./charts/overlay";
import { StackedWaveforms } from "./charts/stacked-waveforms";
import { type RunDetail, fetchRun, isFinished } from "./lib/api";
import type { RunEvent } from "./lib/events";
import { stepNamesOf } from "./lib/steps";
import { type TimeWindow, breathAtTime, breathWindow, fullWindow, windowAround } from "./lib/time-window";
import { RunHeader } from "./run-header";
import { RunProgress } from "./run-progress";
import { SummaryPanel } from "./summary-panel";

/** Poll period while a run is queued or running, ms. */
const POLL_MS = 500;
/** Width of the window an alarm or event jump shows, s. */
const EVENT_WINDOW_S = 8;

export function runQueryKey(runId: string) {
  return ["runs", runId, "detail"] as const;
}

export function useRun(runId: string) {
  return useQuery<RunDetail>({
    queryKey: runQueryKey(runId),
    queryFn: ({ signal }) => fetchRun(runId, signal),
    refetchInterval: (query) => {
      const status = query.state.data?.status;
      return status && isFinished(status) ? false : POLL_MS;
    },
  });
}

export function RunView({ runId }: { runId: string }) {
  const query = useRun(runId);
  const run = query.data;
  return (
    <section className="flex flex-col gap-4" data-testid="run-view" data-run-id={runId} data-status={run?.status ?? "loading"}>
      {query.isPending ? (
        <p className="text-sm text-ink-500" data-testid="run-loading">
          Loading run…
        </p>
      ) : null}
      {query.isError && !run ? (
        <p role="alert" className="rounded-md border border-danger-600/30 bg-danger-100 p-3 text-sm text-danger-700" data-testid="run-load-error">
          Could not load this run: {query.error.message}
        </p>
      ) : null}
      {run ? <RunHeader run={run} /> : null}
      {run && (run.status === "queued" || run.status === "running") ? <RunProgress run={run} canCancel={run.canRun !== false} /> : null}
      {run?.status === "failed" ? (
        <div role="alert" className="rounded-md border border-danger-600/30 bg-danger-100 p-3 text-sm text-danger-700" data-testid="run-error">
          <p className="font-medium">The simulation failed.</p>
          <p className="mt-1 whitespace-pre-wrap font-mono text-xs">{run.error ?? "No error message was stored."}</p>
        </div>
      ) : null}
      {run?.status === "cancelled" ? (
        <p className="rounded-md border border-line bg-ink-50 p-3 text-sm text-ink-700" data-testid="run-cancelled">
          This run was cancelled{run.error ? `: ${run.error}` : "."}
        </p>
      ) : null}
      {run?.status === "done" ? <RunResults run={run} /> : null}
    </section>
  );
}

const NO_BREATHS: Breath[] = [];

function RunResults({ run }: { run: RunDetail }) {
  const breaths = run.breaths ?? NO_BREATHS;
  const [view, setView] = useState<TimeWindow>(() => fullWindow(run.durationS));
  const [selectedBreath, setSelectedBreath] = useState<number | null>(null);
  const [focus, setFocus] = useState<{ t: number; id: string } | null>(null);
  const loopBreath = selectedBreath ?? defaultLoopBreath(breaths);

  const stepNames = useMemo(() => stepNamesOf(run.steps ?? [], run.stepNames), [run.steps, run.stepNames]);
  const overlay = useMemo<ChartOverlay>(
    () => ({ steps: run.steps ?? [], stepNames, breaths, selectedBreath, focusT: focus?.t ?? null }),
    [run.steps, stepNames, breaths, selectedBreath, focus],
  );

  const jumpToBreath = (position: number) => {
    const next = breathWindow(breaths, position, run.durationS);
    setSelectedBreath(position);
    setFocus(null);
    if (next) setView(next);
  };
  const jumpToEvent = (event: RunEvent) => {
    setFocus({ t: event.t, id: event.id });
    setView(windowAround(event.t, Math.min(EVENT_WINDOW_S, run.durationS), run.durationS));
    if (event.breathPosition !== null) setSelectedBreath(event.breathPosition);
  };
  const pickTime = (t: number) => {
    const position = breathAtTime(breaths, t);
    if (position >= 0) setSelectedBreath(position);
  };

  return (
    <div className="grid grid-cols-1 gap-4 xl:grid-cols-[minmax(0,1fr)_24rem]">
      <div className="flex min-w-0 flex-col gap-3">
        <StackedWaveforms
          runId={run.id}
          durationS={run.durationS}
          view={view}
          onViewChange={setView}
          overlay={overlay}
          onPickTime={pickTime}
        />
        <ChartLegend stepNames={stepNames} />
        <BreathTable breaths={breaths} selected={selectedBreath} onSelect={jumpToBreath} csvName={`run-${run.id}-breaths.csv`} />
      </div>
      <aside className="flex min-w-0 flex-col gap-3">
        {run.summary ? <SummaryPanel summary={run.summary} /> : null}
        {breaths.length > 0 ? (
          <BreathLoops runId={run.id} breaths={breaths} durationS={run.durationS} selected={loopBreath} onSelect={jumpToBreath} />
        ) : null}
        <AlarmList alarms={run.alarms ?? []} breaths={breaths} onJump={jumpToEvent} activeId={focus?.id ?? null} />
      </aside>
    </div>
  );
}
