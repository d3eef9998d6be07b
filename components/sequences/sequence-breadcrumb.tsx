/** "Project › Sequences": where every sequence page sits. Server component, links only. */
import Link from "next/link";

export function SequenceBreadcrumb({ project, className }: { project: { id: string; name: string }; className?: string }) {
  return (
    <nav aria-label="Breadcrumb" className={`text-xs text-ink-500 ${className ?? ""}`}>
      <Link href={`/projects/${project.id}`} className="hover:text-ink-800">
        {project.name}
      </Link>
      <span aria-hidden> › </span>
      <Link href={`/projects/${project.id}/sequences`} className="hover:text-ink-800">
        Sequences
      </Link>
    </nav>
  );
}
