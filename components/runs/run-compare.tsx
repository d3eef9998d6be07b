"use client";
/**
 * Two runs compared: both overlaid on the same axes (pressure, flow, volume) and a table of differences in
 * the summary figures. Typical pairs: two revisions on one case, one revision on two cases, a timed-only
 * sequence against a triggered one.
 */
import { useQueries } from "@tanstack/react-query";
import { CompareOverlay } from "./charts/compare-overlay";
import { type RunDetail, caseName, fetchRun, isFinished } from "./lib/api";
import { formatNumber } from "./lib/format";
import { runQueryKey } from "./run-view";
import { SummaryDiffTable } from "./summary-diff-table";

const POLL_MS = 500;

export function runLabel(run: RunDetail): string {
  return `${run.revision.sequenceName} rev ${run.revision.number} on ${caseName(run)}`;
}

function RunBadge({ which, run }: { which: "A" | "B"; run: RunDetail }) {
  return (
    <div className="flex items-baseline gap-2 text-sm" data-testid={`compare-run-${which.toLowerCase()}`}>
      <span
        className={`inline-flex w-14 shrink-0 items-center gap-1 text-xs font-semibold ${which === "A" ? "text-ink-800" : "text-ember-600"}`}
      >
        <svg width="22" height="6" aria-hidden="true">
          <line x1="0" y1="3" x2="22" y2="3" stroke="currentColor" strokeWidth="2" strokeDasharray={which === "B" ? "6 4" : undefined} />
        </svg>
        {which}
      </span>
      <span className="text-ink-900">{runLabel(run)}</span>
      <span className="text-xs text-ink-500">
        {formatNumber(run.durationS, 0)} s · {run.status}
      </span>
    </div>
  );
}

export function RunCompare({ aId, bId }: { aId: string; bId: string }) {
  const [qa, qb] = useQueries({
    queries: [aId, bId].map((id) => ({
      queryKey: runQueryKey(id),
      queryFn: ({ signal }: { signal: AbortSignal }) => fetchRun(id, signal),
      refetchInterval: (query: { state: { data?: RunDetail } }) => {
        const status = query.state.data?.status;
        return status && isFinished(status) ? false : POLL_MS;
      },
    })),
  });
  const a = qa.data;
  const b = qb.data;
  const error = qa.error ?? qb.error;
  const bothDone = a?.status === "done" && b?.status === "done";
  return (
    <section className="flex flex-col gap-4" data-testid="run-compare" data-state={bothDone ? "ready" : "loading"}>
      <header className="flex flex-col gap-1">
        <h1 className="text-lg font-semibold text-ink-900">Compare runs</h1>
        {a ? <RunBadge which="A" run={a} /> : null}
        {b ? <RunBadge which="B" run={b} /> : null}
      </header>
      {error ? (
        <p role="alert" className="rounded-md border border-danger-600/30 bg-danger-100 p-3 text-sm text-danger-700">
          Could not load a run: {error.message}
        </p>
      ) : null}
      {!error && (!a || !b) ? <p className="text-sm text-ink-500">Loading runs…</p> : null}
      {a && b && !bothDone ? (
        <p className="rounded-md border border-line bg-ink-50 p-3 text-sm text-ink-700" data-testid="compare-not-ready">
          Both runs must have finished to compare them (A: {a.status}, B: {b.status}).
        </p>
      ) : null}
      {a && b && bothDone ? (
        <>
          {a.durationS !== b.durationS ? (
            <p className="text-xs text-ink-500">
              The runs differ in length ({formatNumber(a.durationS, 0)} s and {formatNumber(b.durationS, 0)} s); the shorter trace ends early.
            </p>
          ) : null}
          <CompareOverlay aId={a.id} bId={b.id} durationS={Math.max(a.durationS, b.durationS)} />
          {a.summary && b.summary ? <SummaryDiffTable a={a.summary} b={b.summary} labelA={runLabel(a)} labelB={runLabel(b)} /> : null}
        </>
      ) : null}
    </section>
  );
}
