import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getDb } from "@/db";
import { listCases } from "@/db/queries/cases";
import { currentUser } from "@/lib/auth/session";
import { canEditCases } from "@/lib/validation/cases";
import { CaseForm } from "@/components/cases/case-form";
import { CaseList } from "@/components/cases/case-list";
import { Card, CardBody, CardHeader } from "@/components/ui/card";

export const metadata: Metadata = { title: "Patient cases" };
export const dynamic = "force-dynamic";

export default async function CasesPage() {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const cases = await listCases(await getDb());
  return (
    <main className="space-y-6">
      <header>
        <h1 className="text-2xl font-semibold tracking-tight">Patient cases</h1>
        <p className="mt-1 text-sm text-ink-600">
          Lung mechanics, spontaneous effort and leak to run sequences against. Reference cases carry their source and cannot
          be changed; make a new case from one to vary it.
        </p>
      </header>
      <Card>
        <CardBody>
          <CaseList cases={cases} />
        </CardBody>
      </Card>
      {canEditCases(user.role) && (
        <Card>
          <CardHeader title="New patient case" />
          <CardBody>
            <CaseForm />
          </CardBody>
        </Card>
      )}
    </main>
  );
}
