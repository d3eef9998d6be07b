import type { Metadata } from "next";
import Link from "next/link";
import { can } from "@/lib/auth/roles";
import { listSequences } from "@/db/queries/sequences";
import { loadProjectPage } from "@/lib/sequences/page-data";
import { templateSummaries } from "@/lib/sequences/template-summaries";
import { SequenceList } from "@/components/sequences/sequence-list";
import { CreateSequenceDialog } from "@/components/sequences/create-sequence-dialog";

export const metadata: Metadata = { title: "Sequences" };

export default async function SequencesPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { db, user, project, role } = await loadProjectPage(id);
  const sequences = await listSequences(db, user, project.id);
  const canEdit = can(role, "sequences:edit");
  return (
    <main>
      <nav aria-label="Breadcrumb" className="mb-2 text-xs text-ink-500">
        <Link href={`/projects/${project.id}`} className="hover:text-ink-800">
          {project.name}
        </Link>
      </nav>
      <div className="mb-6 flex items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight text-ink-900">Sequences</h1>
          <p className="mt-1 text-sm text-ink-500">
            Breath-cycle statecharts of this build. Every save is a new, immutable revision.{" "}
            <Link href={`/projects/${project.id}/rig`} className="text-glass-800 hover:underline">
              Rig profile
            </Link>
          </p>
        </div>
        {canEdit && <CreateSequenceDialog projectId={project.id} templates={templateSummaries()} />}
      </div>
      <SequenceList projectId={project.id} sequences={sequences} canEdit={canEdit} />
    </main>
  );
}
