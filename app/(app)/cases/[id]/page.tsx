import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db";
import { getCase } from "@/db/queries/cases";
import { currentUser } from "@/lib/auth/session";
import { canEditCases, caseIdParams } from "@/lib/validation/cases";
import { CaseForm } from "@/components/cases/case-form";
import { effortText, leakText, mechanicsText } from "@/components/cases/case-summary";
import { RunList } from "@/components/run-actions/run-list";
import { Badge } from "@/components/ui/badge";
import { Card, CardBody, CardHeader } from "@/components/ui/card";

export const metadata: Metadata = { title: "Patient case" };
export const dynamic = "force-dynamic";

export default async function CasePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const parsed = caseIdParams.safeParse(await params);
  if (!parsed.success) notFound();
  const c = await getCase(await getDb(), parsed.data.id);
  if (!c) notFound();
  const editable = canEditCases(user.role) && !c.seeded && c.patient !== null;
  const canCopy = canEditCases(user.role) && c.patient !== null;

  return (
    <main className="space-y-6">
      <Link href="/cases" className="text-xs text-ink-500 hover:text-ink-800">
        ← All patient cases
      </Link>
      <header>
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-2xl font-semibold tracking-tight" data-testid="case-name">
            {c.name}
          </h1>
          {c.seeded && <Badge tone="glass">reference</Badge>}
        </div>
        {c.description && <p className="mt-1 max-w-3xl text-sm text-ink-600">{c.description}</p>}
        <p className="mt-2 max-w-3xl text-xs text-ink-500" data-testid="case-source">
          Source: {c.source || "not given"}
        </p>
      </header>

      {c.patient && (
        <Card>
          <CardBody>
            <dl className="grid gap-3 text-sm sm:grid-cols-3">
              <div>
                <dt className="text-xs uppercase tracking-wide text-ink-500">Lung mechanics</dt>
                <dd className="tabular-nums">{mechanicsText(c.patient)}</dd>
              </div>
              <div>
                <dt className="text-xs uppercase tracking-wide text-ink-500">Effort</dt>
                <dd>{effortText(c.patient)}</dd>
              </div>
              <div>
                <dt className="text-xs uppercase tracking-wide text-ink-500">Leak</dt>
                <dd>{leakText(c.patient)}</dd>
              </div>
            </dl>
          </CardBody>
        </Card>
      )}

      {editable && c.patient && (
        <Card>
          <CardHeader title="Edit" description="Runs already made were simulated with the earlier values; their pages say that the case has changed since." />
          <CardBody>
            <CaseForm caseId={c.id} initial={{ name: c.name, description: c.description, source: c.source, patient: c.patient }} />
          </CardBody>
        </Card>
      )}
      {!editable && canCopy && c.patient && (
        <Card>
          <CardHeader title="New case from this one" />
          <CardBody>
            <CaseForm initial={{ name: `${c.name} (variant)`, description: c.description, source: `Based on “${c.name}”: ${c.source}`.slice(0, 500), patient: c.patient }} />
          </CardBody>
        </Card>
      )}

      <Card>
        <CardHeader title="Runs on this case" description="Runs in projects you can see." />
        <CardBody>
          <RunList filter={{ caseId: c.id }} />
        </CardBody>
      </Card>
    </main>
  );
}
