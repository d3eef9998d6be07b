import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getRevision } from "@/db/queries/revisions";
import { loadSequencePage, revisionFromQuery } from "@/lib/sequences/page-data";
import { SequenceHeader } from "@/components/sequences/sequence-header";
import { RevisionCompare } from "@/components/designer/revision-compare";
import { formatTime, shortHash } from "@/components/sequences/format";
import type { RevisionDetail } from "@/lib/sequences/types";

export const metadata: Metadata = { title: "Compare revisions" };

function Side({ label, revision }: { label: string; revision: RevisionDetail }) {
  return (
    <div className="text-sm">
      <span className="text-xs uppercase tracking-wide text-ink-500">{label}</span>
      <p className="font-medium text-ink-900">
        r{revision.number} · <code className="font-mono text-xs" title={revision.hash}>{shortHash(revision.hash)}</code>
      </p>
      <p className="text-ink-600">
        {revision.author.name}, {formatTime(revision.createdAt)}
      </p>
      {revision.message && <p className="text-ink-700">“{revision.message}”</p>}
    </div>
  );
}

/** `?a=1&b=3`: a is drawn on the left (older by convention), b on the right. Defaults: previous vs latest. */
export default async function CompareRevisionsPage({
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
  const query = await searchParams;
  const b = revisionFromQuery(query.b) ?? latest;
  const a = revisionFromQuery(query.a) ?? Math.max(1, b - 1);
  const [left, right] = await Promise.all([getRevision(db, sequence.id, a), getRevision(db, sequence.id, b)]);
  if (!left || !right) notFound();
  const base = `/projects/${project.id}/sequences/${sequence.id}`;

  return (
    <main>
      <SequenceHeader project={project} sequence={sequence} current="compare" />
      <section className="mb-6 flex flex-wrap items-start gap-8 rounded-[var(--radius-card)] border border-line bg-surface px-5 py-4 shadow-[var(--shadow-card)]">
        <Side label="Left" revision={left} />
        <Side label="Right" revision={right} />
        <Link href={`${base}/compare?a=${b}&b=${a}`} className="ml-auto self-center text-sm text-glass-800 hover:underline">
          Swap sides
        </Link>
      </section>
      <RevisionCompare
        a={{ number: left.number, definition: left.definition, layout: left.layout }}
        b={{ number: right.number, definition: right.definition, layout: right.layout }}
      />
    </main>
  );
}
