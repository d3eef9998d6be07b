import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getProjectRig } from "@/db/queries/rig";
import { getRevision } from "@/db/queries/revisions";
import { loadSequencePage, revisionFromQuery } from "@/lib/sequences/page-data";
import { SequenceHeader } from "@/components/sequences/sequence-header";
import { SequenceEditor } from "@/components/designer/sequence-editor";
import { Alert } from "@/components/ui/alert";
import { formatTime } from "@/components/sequences/format";

export const metadata: Metadata = { title: "Sequence" };

/**
 * The designer on the latest revision, or `?rev=N` to open an older one read-only. Read-only too for
 * clinicians and viewers, and for an archived sequence.
 */
export default async function SequenceEditorPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string; sequenceId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { id, sequenceId } = await params;
  const { db, project, sequence } = await loadSequencePage(id, sequenceId);
  const latest = sequence.latestRevision;
  if (latest === null) notFound();
  const requested = revisionFromQuery((await searchParams).rev) ?? latest;
  const revision = await getRevision(db, sequence.id, requested);
  if (!revision) notFound();
  const { rig } = await getProjectRig(db, project.id);
  const isOld = revision.number !== latest;
  const readOnly = isOld || !sequence.canEdit;
  const base = `/projects/${project.id}/sequences/${sequence.id}`;

  return (
    <main>
      <SequenceHeader project={project} sequence={sequence} current="editor">
        <Link
          href={`/runs?revisionId=${revision.id}`}
          className="rounded-md border border-line px-3 py-1.5 text-sm text-glass-800 hover:bg-ink-100"
          data-testid="run-revision"
        >
          Run r{revision.number} on patient cases
        </Link>
      </SequenceHeader>
      {isOld && (
        <Alert tone="info" className="mb-4">
          Revision {revision.number} of {latest}, saved {formatTime(revision.createdAt)} by {revision.author.name}
          {revision.message ? ` — “${revision.message}”` : ""}. Read-only.{" "}
          <Link href={base} className="font-medium underline">
            Open the latest
          </Link>{" "}
          ·{" "}
          <Link href={`${base}/compare?a=${revision.number}&b=${latest}`} className="font-medium underline">
            Compare with r{latest}
          </Link>
        </Alert>
      )}
      {!isOld && sequence.status === "archived" && (
        <Alert tone="info" className="mb-4">
          This sequence is archived and read-only. Unarchive it from the sequence list to edit it.
        </Alert>
      )}
      <SequenceEditor
        key={revision.id}
        sequenceId={sequence.id}
        projectId={project.id}
        sequenceName={sequence.name}
        revision={{ number: revision.number, definition: revision.definition, layout: revision.layout, hash: revision.hash }}
        rig={rig}
        readOnly={readOnly}
      />
    </main>
  );
}
