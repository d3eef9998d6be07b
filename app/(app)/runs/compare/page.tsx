import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { z } from "zod";
import { getDb } from "@/db";
import { findVisibleRun } from "@/db/queries/runs";
import { currentUser } from "@/lib/auth/session";
import { RunCompare } from "@/components/runs/run-compare";
import { EmptyState } from "@/components/ui/empty-state";

export const metadata: Metadata = { title: "Compare runs" };
export const dynamic = "force-dynamic";

const compareQuery = z.object({ a: z.uuid(), b: z.uuid() });

/** Thin: both runs must be visible to the caller (else 404); the comparison itself is runs-ui's. */
export default async function CompareRunsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const raw = await searchParams;
  if (raw.a === undefined && raw.b === undefined) {
    return (
      <main>
        <EmptyState title="Pick two runs to compare">Tick two finished runs in a run list, then choose “Compare”.</EmptyState>
      </main>
    );
  }
  const parsed = compareQuery.safeParse(raw);
  if (!parsed.success) notFound();
  const db = await getDb();
  const [a, b] = await Promise.all([findVisibleRun(db, user, parsed.data.a), findVisibleRun(db, user, parsed.data.b)]);
  if (!a || !b) notFound();
  return (
    <main>
      <RunCompare aId={a.id} bId={b.id} />
    </main>
  );
}
