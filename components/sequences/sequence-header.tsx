/**
 * Title block of every sequence page: where you are (project › sequences › name), the status, and
 * the Editor / History tabs. Server component: links only.
 */
import Link from "next/link";
import type { ReactNode } from "react";
import type { SequenceView } from "@/lib/sequences/types";
import { cn } from "@/components/ui/cn";
import { StatusBadge } from "./status-badge";
import { SequenceBreadcrumb } from "./sequence-breadcrumb";

interface Props {
  project: { id: string; name: string };
  sequence: Pick<SequenceView, "id" | "name" | "status" | "latestRevision">;
  current: "editor" | "history" | "compare";
  children?: ReactNode;
}

export function SequenceHeader({ project, sequence, current, children }: Props) {
  const base = `/projects/${project.id}/sequences/${sequence.id}`;
  const tabs = [
    { id: "editor", label: "Editor", href: base },
    { id: "history", label: "History", href: `${base}/history` },
  ] as const;
  return (
    <header className="mb-6 space-y-3">
      <SequenceBreadcrumb project={project} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex items-center gap-3">
          <h1 className="text-2xl font-semibold tracking-tight text-ink-900">{sequence.name}</h1>
          <StatusBadge status={sequence.status} />
        </div>
        {children}
      </div>
      <nav aria-label="Sequence views" className="flex gap-1 border-b border-line">
        {tabs.map((tab) => (
          <Link
            key={tab.id}
            href={tab.href}
            aria-current={current === tab.id ? "page" : undefined}
            className={cn(
              "-mb-px border-b-2 px-3 py-2 text-sm",
              current === tab.id ? "border-glass-700 font-medium text-ink-900" : "border-transparent text-ink-500 hover:text-ink-800",
            )}
          >
            {tab.label}
          </Link>
        ))}
      </nav>
    </header>
  );
}
