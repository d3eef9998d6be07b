/**
 * Project page: the latest simulation runs of the programme's revisions. Server component, links only.
 */
import Link from "next/link";
import type { RunListItem } from "@/db/queries/runs";
import { EmptyState } from "@/components/ui/empty-state";

function figure(summary: unknown, key: "pip" | "vti"): string {
  if (typeof summary !== "object" || summary === null) return "–";
  const value = (summary as Record<string, unknown>)[key];
  return typeof value === "number" ? value.toFixed(key === "pip" ? 1 : 0) : "–";
}

export function ProjectRuns({ runs }: { runs: RunListItem[] }) {
  if (runs.length === 0) {
    return (
      <EmptyState title="No runs yet">Open a sequence’s history and pick “Runs of r…” to simulate a revision.</EmptyState>
    );
  }
  return (
    <table className="w-full text-sm" data-testid="project-runs">
      <thead className="text-left text-xs uppercase tracking-wide text-ink-500">
        <tr>
          <th className="py-1.5 font-medium">Sequence</th>
          <th className="py-1.5 font-medium">Case</th>
          <th className="py-1.5 font-medium">Status</th>
          <th className="py-1.5 text-right font-medium">PIP (cmH2O)</th>
          <th className="py-1.5 text-right font-medium">Vti (mL)</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-line">
        {runs.map((r) => (
          <tr key={r.id}>
            <td className="py-2">
              <Link href={`/runs/${r.id}`} className="text-glass-800 hover:underline">
                {r.revision.sequenceName} r{r.revision.number}
              </Link>
            </td>
            <td className="py-2 text-ink-700">{r.case?.name ?? "(deleted case)"}</td>
            <td className="py-2 text-ink-700">{r.status}</td>
            <td className="py-2 text-right font-mono">{figure(r.summary, "pip")}</td>
            <td className="py-2 text-right font-mono">{figure(r.summary, "vti")}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
