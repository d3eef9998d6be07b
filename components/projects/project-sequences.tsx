/**
 * Project page: the sequences of the programme with their latest revision. Server component, links only.
 */
import Link from "next/link";
import type { SequenceListItem } from "@/lib/sequences/types";
import { StatusBadge } from "@/components/sequences/status-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { formatTime } from "@/components/sequences/format";

export function ProjectSequences({ projectId, sequences }: { projectId: string; sequences: SequenceListItem[] }) {
  const live = sequences.filter((s) => s.status !== "archived");
  if (live.length === 0) {
    return (
      <EmptyState title="No sequences yet">
        <Link href={`/projects/${projectId}/sequences`} className="underline">
          Start one from a template
        </Link>
      </EmptyState>
    );
  }
  return (
    <ul className="divide-y divide-line text-sm" data-testid="project-sequences">
      {live.map((s) => (
        <li key={s.id} className="flex flex-wrap items-center justify-between gap-3 py-2">
          <div className="flex items-center gap-3">
            <Link href={`/projects/${projectId}/sequences/${s.id}`} className="font-medium text-glass-800 hover:underline">
              {s.name}
            </Link>
            <StatusBadge status={s.status} />
          </div>
          {s.latestRevision && (
            <span className="text-xs text-ink-500">
              r{s.latestRevision.number} · {s.latestRevision.author.name} · {formatTime(s.latestRevision.createdAt)} ·{" "}
              <Link href={`/projects/${projectId}/sequences/${s.id}/history`} className="underline">
                history and runs
              </Link>
            </span>
          )}
        </li>
      ))}
    </ul>
  );
}
