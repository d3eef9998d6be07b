import type { Metadata } from "next";
import { SequenceBreadcrumb } from "@/components/sequences/sequence-breadcrumb";
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
      <SequenceBreadcrumb project={project} className="mb-2" />
      <h1 className="mb-6 text-2xl font-semibold tracking-tight text-ink-900">New sequence</h1>
      {can(role, "sequences:edit") ? (
        <CreateSequenceForm projectId={project.id} templates={templates} defaultTemplate={preselect} />
      ) : (
        <Alert tone="info">Your role in this project can read sequences; engineers and admins create them.</Alert>
      )}
    </main>
  );
}
