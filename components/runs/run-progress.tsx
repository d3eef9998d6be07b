"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type RunDetail, cancelRun } from "./lib/api";
import { PANEL } from "./panel";
import { buttonClasses } from "@/components/ui/button";

/** Progress of a queued or running simulation, with a cancel button. */
export function RunProgress({ run, canCancel = true }: { run: RunDetail; canCancel?: boolean }) {
  const queryClient = useQueryClient();
  const cancel = useMutation({
    mutationFn: () => cancelRun(run.id),
    onSettled: () => queryClient.invalidateQueries({ queryKey: ["runs", run.id, "detail"] }),
  });
  const percent = Math.round(Math.min(1, Math.max(0, run.progress)) * 100);
  return (
    <div className={`${PANEL} p-4`} data-testid="run-progress">
      <div className="mb-2 flex items-center justify-between text-sm text-ink-700">
        <span>{run.status === "queued" ? "Waiting for a worker…" : "Simulating…"}</span>
        <span className="tabular-nums">{percent} %</span>
      </div>
      <div
        role="progressbar"
        aria-label="Simulation progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-2 overflow-hidden rounded bg-ink-100"
      >
        <div className="h-full bg-glass-600 transition-[width]" style={{ width: `${percent}%` }} />
      </div>
      {canCancel ? (
        <div className="mt-3 flex items-center gap-3">
          <button
            type="button"
            onClick={() => cancel.mutate()}
            disabled={cancel.isPending}
            className={buttonClasses("danger", "sm")}
          >
            Cancel run
          </button>
          {cancel.isError ? (
            <span role="alert" className="text-xs text-danger-700">
              {cancel.error.message}
            </span>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
