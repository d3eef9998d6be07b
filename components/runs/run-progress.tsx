"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type RunDetail, cancelRun } from "./lib/api";

/** Progress of a queued or running simulation, with a cancel button. */
export function RunProgress({ run }: { run: RunDetail }) {
  const queryClient = useQueryClient();
  const cancel = useMutation({
    mutationFn: () => cancelRun(run.id),
    onSettled: () => queryClient.invalidateQueries({ queryKey: ["runs", run.id, "detail"] }),
  });
  const percent = Math.round(Math.min(1, Math.max(0, run.progress)) * 100);
  return (
    <div className="rounded-md border border-slate-200 bg-white p-4" data-testid="run-progress">
      <div className="mb-2 flex items-center justify-between text-sm text-slate-700">
        <span>{run.status === "queued" ? "Waiting for a worker…" : "Simulating…"}</span>
        <span className="tabular-nums">{percent} %</span>
      </div>
      <div
        role="progressbar"
        aria-label="Simulation progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-2 overflow-hidden rounded bg-slate-100"
      >
        <div className="h-full bg-teal-600 transition-[width]" style={{ width: `${percent}%` }} />
      </div>
      <div className="mt-3 flex items-center gap-3">
        <button
          type="button"
          onClick={() => cancel.mutate()}
          disabled={cancel.isPending}
          className="rounded border border-slate-300 px-2 py-1 text-xs text-slate-700 hover:border-red-600 hover:text-red-700 disabled:opacity-40"
        >
          Cancel run
        </button>
        {cancel.isError ? (
          <span role="alert" className="text-xs text-red-700">
            {cancel.error.message}
          </span>
        ) : null}
      </div>
    </div>
  );
}
