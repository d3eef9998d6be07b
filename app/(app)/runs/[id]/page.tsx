import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db";
import { findVisibleRun } from "@/db/queries/runs";
import { currentUser } from "@/lib/auth/session";
import { runIdParams } from "@/lib/validation/runs";
import { runInputs } from "@/lib/runs/snapshot";
import { RunView } from "@/components/runs/run-view";
import { RunInputs } from "@/components/run-actions/run-inputs";

export const metadata: Metadata = { title: "Run" };
export const dynamic = "force-dynamic";

/**
 * Thin: checks the caller may see the run (else 404), then hands the id to the run view, and lists the
 * inputs as simulated (stored on the run) beneath it.
 */
export default async function RunPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const parsed = runIdParams.safeParse(await params);
  if (!parsed.success) notFound();
  const run = await findVisibleRun(await getDb(), user, parsed.data.id);
  if (!run) notFound();
  const inputs = runInputs(run);
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
        {inputs.caseChangedSinceRun && (
          <span className="text-ember-700" data-testid="case-changed">
            The case has been edited since this run: its current values are not the ones simulated here (those are listed below the run).
          </span>
        )}
      </nav>
      <RunView runId={run.id} />
      <RunInputs patient={inputs.patient} rig={inputs.rigProfile} rigChoice={run.rig} />
    </main>
  );
}
