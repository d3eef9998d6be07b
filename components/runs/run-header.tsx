import { type RunDetail, waveformCsvUrl } from "./lib/api";
import { formatNumber } from "./lib/format";

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
        <h1 className="text-lg font-semibold text-slate-900">
          {run.revision.sequenceName} <span className="font-normal text-slate-500">rev {run.revision.number}</span> on {run.case.name}
        </h1>
        <p className="text-xs text-slate-600">
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
          className="rounded border border-slate-300 bg-white px-3 py-1 text-sm text-slate-800 hover:border-teal-600 hover:text-teal-800"
        >
          Download CSV <span className="text-xs text-slate-500">(waveforms, full resolution)</span>
        </a>
      ) : null}
    </header>
  );
}

export function RunCaution() {
  return (
    <p className="text-[11px] leading-snug text-slate-500" data-testid="run-caution">
      Tidewright is an engineering design and simulation aid. It is not a medical device and does not give clinical advice.
      Simulated results do not replace bench testing with a calibrated test lung, clinical evaluation, or the approval a
      ventilator needs under the medical device rules where it will be used.
    </p>
  );
}
