"use client";

import Link from "next/link";
import { useQuery } from "@tanstack/react-query";
import type { ProjectSummary } from "@/lib/validation/projects";
import { apiFetch } from "@/components/ui/api-client";
import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";

export const projectsQueryKey = ["projects"] as const;

export function ProjectList({ initialProjects }: { initialProjects: ProjectSummary[] }) {
  const query = useQuery({
    queryKey: projectsQueryKey,
    queryFn: async () => (await apiFetch<{ projects: ProjectSummary[] }>("/api/projects")).projects,
    initialData: initialProjects,
  });
  if (query.error) return <Alert tone="error">{query.error.message}</Alert>;
  const projects = query.data;
  if (projects.length === 0) {
    return <EmptyState title="No projects yet">Projects you are a member of appear here.</EmptyState>;
  }
  return (
    <ul className="grid gap-4 sm:grid-cols-2" aria-label="Projects">
      {projects.map((p) => (
        <li key={p.id}>
          <Link
            href={`/projects/${p.id}`}
            className="block h-full rounded-[var(--radius-card)] border border-line bg-surface p-5 shadow-[var(--shadow-card)] transition-colors hover:border-glass-400"
          >
            <h2 className="font-semibold text-ink-900">{p.name}</h2>
            {p.description && <p className="mt-1 line-clamp-3 text-sm text-ink-600">{p.description}</p>}
            <p className="mt-3 text-xs text-ink-500">
              {p.memberCount} member{p.memberCount === 1 ? "" : "s"} · created {new Date(p.createdAt).toLocaleDateString("en-GB")}
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
