import { type RunDetail, caseName, waveformCsvUrl } from "./lib/api";
import { formatNumber } from "./lib/format";
import { buttonClasses } from "@/components/ui/button";

const STATUS_TEXT: Record<RunDetail["status"], string> = {
  queued: "Queued",
  running: "Running",
  done: "Done",
  failed: "Failed",
  cancelled: "Cancelled",
};

/** Which revision on which case, how it was run, and the full-resolution CSV. */
export function RunHeader({ run }: { run: RunDetail }) {
  const created = new Date(run.createdAt);
  return (
    <header className="flex flex-wrap items-start justify-between gap-3" data-testid="run-header">
      <div>
        <h1 className="text-lg font-semibold text-ink-900">
          {run.revision.sequenceName} <span className="font-normal text-ink-500">rev {run.revision.number}</span> on {caseName(run)}
        </h1>
        <p className="text-xs text-ink-600">
          <span data-testid="run-status" data-status={run.status}>
            {STATUS_TEXT[run.status]}
          </span>
          {" · "}
          {formatNumber(run.durationS, 0)} s simulated
          {run.rig ? ` · rig: ${run.rig}` : ""}
          {run.seed !== null && run.seed !== undefined ? ` · seed ${run.seed}` : ""}
          {run.wallMs !== null && run.wallMs !== undefined ? ` · computed in ${formatNumber(run.wallMs, 0)} ms` : ""}
          {Number.isNaN(created.getTime()) ? "" : ` · ${created.toLocaleString()}`}
        </p>
      </div>
      {run.status === "done" ? (
        <a
          href={waveformCsvUrl(run.id)}
          download
          data-testid="waveform-csv-link"
          className={buttonClasses("secondary", "sm")}
        >
          Download CSV <span className="text-xs font-normal text-ink-500">waveforms, full resolution</span>
        </a>
      ) : null}
    </header>
  );
}
