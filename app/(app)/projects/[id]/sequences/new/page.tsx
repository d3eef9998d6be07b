import type { Metadata } from "next";
import Link from "next/link";
import { can } from "@/lib/auth/roles";
import { loadProjectPage } from "@/lib/sequences/page-data";
import { templateSummaries } from "@/lib/sequences/template-summaries";
import { CreateSequenceForm } from "@/components/sequences/create-sequence-form";
import { Alert } from "@/components/ui/alert";

export const metadata: Metadata = { title: "New sequence" };

/** `?template=assist-volume` preselects a template (links from docs and the project page). */
export default async function NewSequencePage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { id } = await params;
  const { project, role } = await loadProjectPage(id);
  const templates = templateSummaries();
  const requested = (await searchParams).template;
  const preselect = typeof requested === "string" && templates.some((t) => t.id === requested) ? requested : undefined;
  return (
    <main className="max-w-3xl">
      <nav aria-label="Breadcrumb" className="mb-2 text-xs text-ink-500">
        <Link href={`/projects/${project.id}`} className="hover:text-ink-800">
          {project.name}
        </Link>
        <span aria-hidden> › </span>
        <Link href={`/projects/${project.id}/sequences`} className="hover:text-ink-800">
          Sequences
        </Link>
      </nav>
      <h1 className="mb-6 text-2xl font-semibold tracking-tight text-ink-900">New sequence</h1>
      {can(role, "sequences:edit") ? (
        <CreateSequenceForm projectId={project.id} templates={templates} defaultTemplate={preselect} />
      ) : (
        <Alert tone="info">Your role in this project can read sequences; engineers and admins create them.</Alert>
      )}
    </main>
  );
}
