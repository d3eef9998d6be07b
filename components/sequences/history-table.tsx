"use client";
/**
 * Revision history: number, message, author, time, hash; open any revision read-only, or tick two and
 * compare them. The two newest are ticked to start, the usual question being "what did I just change".
 */
import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import type { RevisionSummary } from "@/lib/sequences/types";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { formatTime, shortHash } from "./format";

interface Props {
  projectId: string;
  sequenceId: string;
  revisions: RevisionSummary[];
}

export function HistoryTable({ projectId, sequenceId, revisions }: Props) {
  const router = useRouter();
  const [picked, setPicked] = useState<number[]>(revisions.slice(0, 2).map((r) => r.number));
  const base = `/projects/${projectId}/sequences/${sequenceId}`;
  const latest = revisions[0]?.number;

  function toggle(number: number) {
    setPicked((current) => {
      if (current.includes(number)) return current.filter((n) => n !== number);
      // Keep the most recent pick and the new one: ticking a third replaces the older pick.
      return [...current.slice(-1), number];
    });
  }

  if (revisions.length === 0) return <EmptyState title="No revisions yet" />;
  const [a, b] = [...picked].sort((x, y) => x - y);

  return (
    <div className="space-y-3">
      <div className="flex items-center justify-between gap-4">
        <p className="text-sm text-ink-500">Tick two revisions to compare them side by side.</p>
        <Button
          variant="secondary"
          disabled={picked.length !== 2}
          onClick={() => router.push(`${base}/compare?a=${a}&b=${b}`)}
          data-testid="compare-revisions"
        >
          {picked.length === 2 ? `Compare r${a} with r${b}` : "Compare"}
        </Button>
      </div>
      <div className="overflow-x-auto rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)]">
        <table className="w-full text-sm" aria-label="Revisions">
          <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="w-10 px-4 py-2">
                <span className="sr-only">Compare</span>
              </th>
              <th className="px-4 py-2 font-medium">Revision</th>
              <th className="px-4 py-2 font-medium">Message</th>
              <th className="px-4 py-2 font-medium">Author</th>
              <th className="px-4 py-2 font-medium">Saved</th>
              <th className="px-4 py-2 font-medium">Hash (SHA-256)</th>
              <th className="px-4 py-2 font-medium">Simulation</th>
            </tr>
          </thead>
          <tbody>
            {revisions.map((r) => (
              <tr key={r.id} className="border-t border-line first:border-t-0" data-testid="revision-row">
                <td className="px-4 py-2">
                  <input
                    type="checkbox"
                    className="accent-glass-700"
                    aria-label={`Pick revision ${r.number} to compare`}
                    checked={picked.includes(r.number)}
                    onChange={() => toggle(r.number)}
                  />
                </td>
                <td className="whitespace-nowrap px-4 py-2">
                  <Link
                    href={r.number === latest ? base : `${base}?rev=${r.number}`}
                    className="font-medium text-glass-800 hover:underline"
                  >
                    r{r.number}
                  </Link>
                  {r.number === latest && <span className="ml-2 text-xs text-ink-500">latest</span>}
                </td>
                <td className="px-4 py-2 text-ink-800">{r.message || <span className="text-ink-400">(no message)</span>}</td>
                <td className="whitespace-nowrap px-4 py-2 text-ink-600">{r.author.name}</td>
                <td className="whitespace-nowrap px-4 py-2 text-ink-600">{formatTime(r.createdAt)}</td>
                <td className="px-4 py-2">
                  <code className="font-mono text-xs text-ink-700" title={r.hash}>
                    {shortHash(r.hash)}
                  </code>
                </td>
                <td className="whitespace-nowrap px-4 py-2">
                  <Link href={`/runs?revisionId=${r.id}`} className="text-glass-800 hover:underline" data-testid="revision-runs">
                    Runs of r{r.number}
                  </Link>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
