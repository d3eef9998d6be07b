import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { z } from "zod";
import { getDb } from "@/db";
import { findVisibleRevision } from "@/db/queries/runs";
import { getCase } from "@/db/queries/cases";
import { canRunSimulations } from "@/lib/auth/roles";
import { currentUser } from "@/lib/auth/session";
import { warmSimulationPool } from "@/lib/runs/pool";
import { RunLauncher } from "@/components/run-actions/run-launcher";
import { RunList } from "@/components/run-actions/run-list";
import { Card, CardBody, CardHeader } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata: Metadata = { title: "Runs" };
export const dynamic = "force-dynamic";

const runsPageQuery = z.object({ revisionId: z.uuid().optional(), caseId: z.uuid().optional() });

/**
 * Runs of one revision (`?revisionId=`: with the run action) or of one case (`?caseId=`). The sequence
 * pages link here; the designer-server pages may also embed RunLauncher and RunList directly.
 */
export default async function RunsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const parsed = runsPageQuery.safeParse(await searchParams);
  if (!parsed.success) notFound();
  const { revisionId, caseId } = parsed.data;
  const db = await getDb();

  if (revisionId) {
    const revision = await findVisibleRevision(db, user, revisionId);
    if (!revision) notFound();
    // The launcher is on this page: have the simulation workers up before the first run.
    if (canRunSimulations(revision.role)) warmSimulationPool();
    return (
      <main className="space-y-6">
        <Link href={`/projects/${revision.projectId}`} className="text-xs text-ink-500 hover:text-ink-800">
          ← Project
        </Link>
        <h1 className="text-2xl font-semibold tracking-tight">
          Runs of {revision.sequenceName}, revision {revision.number}
        </h1>
        {canRunSimulations(revision.role) && (
          <Card>
            <CardHeader title="Run this revision" description="Simulated on the server; each run is stored with its waveforms." />
            <CardBody>
              <RunLauncher revisionId={revision.id} />
            </CardBody>
          </Card>
        )}
        <Card>
          <CardBody>
            <RunList filter={{ revisionId: revision.id }} />
          </CardBody>
        </Card>
      </main>
    );
  }

  if (caseId) {
    const c = await getCase(db, caseId);
    if (!c) notFound();
    return (
      <main className="space-y-6">
        <h1 className="text-2xl font-semibold tracking-tight">Runs on {c.name}</h1>
        <Card>
          <CardBody>
            <RunList filter={{ caseId: c.id }} />
          </CardBody>
        </Card>
      </main>
    );
  }

  return (
    <main>
      <EmptyState title="Open a sequence revision to see its runs">
        Or browse the <Link href="/cases" className="underline">patient cases</Link>.
      </EmptyState>
    </main>
  );
}
