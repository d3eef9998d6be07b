"use client";
/**
 * Runs of a revision or of a case, newest first, with their headline figures. Pick two to compare.
 * Refreshes while any run is still going.
 */
import { useState } from "react";
import Link from "next/link";
import { useQuery } from "@tanstack/react-query";
import { RUN_STATUS_LABELS } from "@/lib/validation/runs";
import { Alert } from "@/components/ui/alert";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { buttonClasses } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { isFinished, listRuns, type RunListEntry } from "./api";

export function runListQueryKey(filter: { revisionId?: string; caseId?: string }) {
  return ["runs", "list", filter.revisionId ?? null, filter.caseId ?? null] as const;
}

const STATUS_TONE: Record<RunListEntry["status"], BadgeTone> = {
  queued: "neutral",
  running: "glass",
  done: "glass",
  failed: "danger",
  cancelled: "ember",
};

const fig = (x: number | null | undefined, digits = 0) => (x === null || x === undefined ? "—" : x.toFixed(digits));

export function RunList({ filter }: { filter: { revisionId?: string; caseId?: string } }) {
  const [picked, setPicked] = useState<string[]>([]);
  const query = useQuery({
    queryKey: runListQueryKey(filter),
    queryFn: async () => (await listRuns(filter)).runs,
    refetchInterval: (q) => (q.state.data?.some((r) => !isFinished(r.status)) ? 1000 : false),
  });
  if (query.error) return <Alert tone="error">{query.error.message}</Alert>;
  if (query.isPending) return <p className="text-sm text-ink-500">Loading runs…</p>;
  const runs = query.data;
  if (runs.length === 0) return <EmptyState title="No runs yet" />;

  const toggle = (id: string) =>
    setPicked((p) => (p.includes(id) ? p.filter((x) => x !== id) : [...p, id].slice(-2)));

  return (
    <div className="space-y-3">
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm" aria-label="Runs" data-testid="run-list">
          <thead className="border-b border-line text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="py-2 pr-2 font-medium">
                <span className="sr-only">Compare</span>
              </th>
              <th className="py-2 pr-4 font-medium">Run</th>
              <th className="py-2 pr-4 font-medium">Case</th>
              <th className="py-2 pr-4 font-medium">Status</th>
              <th className="py-2 pr-4 text-right font-medium">Duration (s)</th>
              <th className="py-2 pr-4 text-right font-medium">PIP (cmH2O)</th>
              <th className="py-2 pr-4 text-right font-medium">Vti (mL)</th>
              <th className="py-2 pr-4 text-right font-medium">RR (/min)</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {runs.map((r) => (
              <tr key={r.id} data-testid="run-row">
                <td className="py-2 pr-2">
                  <input
                    type="checkbox"
                    aria-label={`Pick run of ${new Date(r.createdAt).toLocaleString("en-GB")} to compare`}
                    checked={picked.includes(r.id)}
                    disabled={r.status !== "done"}
                    onChange={() => toggle(r.id)}
                  />
                </td>
                <td className="py-2 pr-4">
                  <Link href={`/runs/${r.id}`} className="text-glass-800 hover:underline">
                    {r.revision.sequenceName} r{r.revision.number}
                  </Link>
                  <span className="ml-2 text-xs text-ink-500">{new Date(r.createdAt).toLocaleString("en-GB")}</span>
                </td>
                <td className="py-2 pr-4">{r.case?.name ?? "deleted case"}</td>
                <td className="py-2 pr-4">
                  <Badge tone={STATUS_TONE[r.status]}>{RUN_STATUS_LABELS[r.status]}</Badge>
                  {r.error && <span className="ml-2 text-xs text-danger-700">{r.error}</span>}
                </td>
                <td className="py-2 pr-4 text-right tabular-nums">{fig(r.durationS)}</td>
                <td className="py-2 pr-4 text-right tabular-nums">{fig(r.summary?.pip, 1)}</td>
                <td className="py-2 pr-4 text-right tabular-nums">{fig(r.summary?.vti)}</td>
                <td className="py-2 pr-4 text-right tabular-nums">{fig(r.summary?.rr, 1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex items-center gap-3">
        {picked.length === 2 ? (
          <Link href={`/runs/compare?a=${picked[0]}&b=${picked[1]}`} className={buttonClasses("secondary", "sm")} data-testid="compare-link">
            Compare the two picked runs
          </Link>
        ) : (
          <p className="text-xs text-ink-500">Tick two finished runs to compare them.</p>
        )}
      </div>
    </div>
  );
}
