import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db";
import { findVisibleRun } from "@/db/queries/runs";
import { currentUser } from "@/lib/auth/session";
import { runIdParams } from "@/lib/validation/runs";
import { RunView } from "@/components/runs/run-view";

export const metadata: Metadata = { title: "Run" };
export const dynamic = "force-dynamic";

/** Thin: checks the caller may see the run (else 404), then hands the id to the run view. */
export default async function RunPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const parsed = runIdParams.safeParse(await params);
  if (!parsed.success) notFound();
  const run = await findVisibleRun(await getDb(), user, parsed.data.id);
  if (!run) notFound();
  return (
    <main className="space-y-4">
      <nav className="flex flex-wrap gap-4 text-xs text-ink-500">
        <Link href={`/runs?revisionId=${run.revision.id}`} className="hover:text-ink-800">
          ← Runs of {run.revision.sequenceName} r{run.revision.number}
        </Link>
        {run.case && (
          <Link href={`/cases/${run.case.id}`} className="hover:text-ink-800">
            Case: {run.case.name}
          </Link>
        )}
        {run.case && run.case.updatedAt > run.createdAt && (
          <span className="text-ember-700" data-testid="case-changed">
            The case has been edited since this run: its current values are not the ones simulated here.
          </span>
        )}
      </nav>
      <RunView runId={run.id} />
    </main>
  );
}
