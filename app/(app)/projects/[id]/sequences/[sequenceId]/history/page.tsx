import type { Metadata } from "next";
import { listRevisions } from "@/db/queries/revisions";
import { loadSequencePage } from "@/lib/sequences/page-data";
import { SequenceHeader } from "@/components/sequences/sequence-header";
import { HistoryTable } from "@/components/sequences/history-table";

export const metadata: Metadata = { title: "Sequence history" };

export default async function SequenceHistoryPage({ params }: { params: Promise<{ id: string; sequenceId: string }> }) {
  const { id, sequenceId } = await params;
  const { db, project, sequence } = await loadSequencePage(id, sequenceId);
  const revisions = await listRevisions(db, sequence.id);
  return (
    <main>
      <SequenceHeader project={project} sequence={sequence} current="history" />
      <HistoryTable projectId={project.id} sequenceId={sequence.id} revisions={revisions} />
    </main>
  );
}
