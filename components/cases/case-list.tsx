import Link from "next/link";
import type { Patient } from "@/lib/sim/types";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import { effortText, leakText, mechanicsText } from "./case-summary";

export interface CaseListItem {
  id: string;
  name: string;
  description: string;
  source: string;
  seeded: boolean;
  patient: Patient | null;
}

/** The case library as a table: name, mechanics, effort, leak and source, every figure with its unit. */
export function CaseList({ cases }: { cases: CaseListItem[] }) {
  if (cases.length === 0) return <EmptyState title="No patient cases yet">Create one with the form.</EmptyState>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" aria-label="Patient cases" data-testid="case-list">
        <thead className="border-b border-line text-xs uppercase tracking-wide text-ink-500">
          <tr>
            <th className="py-2 pr-4 font-medium">Case</th>
            <th className="py-2 pr-4 font-medium">Lung mechanics</th>
            <th className="py-2 pr-4 font-medium">Effort</th>
            <th className="py-2 pr-4 font-medium">Leak</th>
            <th className="py-2 font-medium">Source</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {cases.map((c) => (
            <tr key={c.id} data-testid="case-row" className="align-top">
              <td className="py-2 pr-4">
                <Link href={`/cases/${c.id}`} className="font-medium text-glass-800 hover:underline">
                  {c.name}
                </Link>
                {c.seeded && (
                  <Badge tone="glass" className="ml-2">
                    reference
                  </Badge>
                )}
              </td>
              {c.patient ? (
                <>
                  <td className="py-2 pr-4 tabular-nums text-ink-700">{mechanicsText(c.patient)}</td>
                  <td className="py-2 pr-4 text-ink-700">{effortText(c.patient)}</td>
                  <td className="py-2 pr-4 text-ink-700">{leakText(c.patient)}</td>
                </>
              ) : (
                <td colSpan={3} className="py-2 pr-4 text-danger-700">
                  The stored values are not valid any more; edit the case to fix them.
                </td>
              )}
              <td className="max-w-xs py-2 text-xs text-ink-500">{c.source || "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
