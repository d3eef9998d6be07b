"use client";
/**
 * The project's sequences: name, status, latest revision (number, message, author), updated.
 * Archived sequences are hidden behind a toggle so the working set stays short.
 */
import { useState } from "react";
import Link from "next/link";
import type { SequenceListItem } from "@/lib/sequences/types";
import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { SequenceRowActions } from "./sequence-row-actions";
import { StatusBadge } from "./status-badge";
import { formatTime, shortHash } from "./format";

interface Props {
  projectId: string;
  sequences: SequenceListItem[];
  canEdit: boolean;
}

export function SequenceList({ projectId, sequences, canEdit }: Props) {
  const [showArchived, setShowArchived] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const archivedCount = sequences.filter((s) => s.status === "archived").length;
  const shown = showArchived ? sequences : sequences.filter((s) => s.status !== "archived");

  return (
    <div className="space-y-3">
      {error && <Alert tone="error">{error}</Alert>}
      {shown.length === 0 ? (
        <EmptyState title={sequences.length === 0 ? "No sequences yet" : "Only archived sequences here"}>
          {canEdit ? "Start one from a template or from a blank canvas." : "Engineers in this project create sequences."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)]">
          <table className="w-full text-sm" aria-label="Sequences">
            <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-4 py-2 font-medium">Sequence</th>
                <th className="px-4 py-2 font-medium">Status</th>
                <th className="px-4 py-2 font-medium">Latest revision</th>
                <th className="px-4 py-2 font-medium">Updated</th>
                {canEdit && (
                  <th className="px-4 py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                )}
              </tr>
            </thead>
            <tbody>
              {shown.map((s) => (
                <tr key={s.id} className="border-t border-line align-top first:border-t-0" data-testid="sequence-row">
                  <td className="px-4 py-3">
                    <Link href={`/projects/${projectId}/sequences/${s.id}`} className="font-medium text-glass-800 hover:underline">
                      {s.name}
                    </Link>
                    <div className="mt-0.5 text-xs">
                      <Link href={`/projects/${projectId}/sequences/${s.id}/history`} className="text-ink-500 hover:underline">
                        History
                      </Link>
                    </div>
                  </td>
                  <td className="px-4 py-3">
                    <StatusBadge status={s.status} />
                  </td>
                  <td className="px-4 py-3">
                    {s.latestRevision ? (
                      <>
                        <span className="font-mono text-xs text-ink-700" title={s.latestRevision.hash}>
                          r{s.latestRevision.number} · {shortHash(s.latestRevision.hash)}
                        </span>
                        <p className="line-clamp-1 text-ink-700">{s.latestRevision.message || "(no message)"}</p>
                        <p className="text-xs text-ink-500">{s.latestRevision.author.name}</p>
                      </>
                    ) : (
                      <span className="text-ink-400">none</span>
                    )}
                  </td>
                  <td className="whitespace-nowrap px-4 py-3 text-ink-600">{formatTime(s.updatedAt)}</td>
                  {canEdit && (
                    <td className="px-4 py-3">
                      <SequenceRowActions sequence={s} onError={setError} />
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {archivedCount > 0 && (
        <label className="flex items-center gap-2 text-sm text-ink-600">
          <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} className="accent-glass-700" />
          Show {archivedCount} archived
        </label>
      )}
    </div>
  );
}
