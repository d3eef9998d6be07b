/**
 * One revision with its body and the static checks' findings (GET /api/sequences/:id/revisions/:n),
 * also the props of the read-only editor and the compare page.
 */
import "server-only";
import type { Db } from "@/db";
import { getRevision } from "@/db/queries/revisions";
import { runStaticChecks } from "@/machines/checks";
import type { RevisionView } from "./types";

export type { RevisionView };

export async function revisionView(db: Db, sequenceId: string, number: number): Promise<RevisionView | null> {
  const revision = await getRevision(db, sequenceId, number);
  if (!revision) return null;
  // Recomputed rather than stored: checks improve over time and old revisions should show today's findings.
  return { ...revision, problems: runStaticChecks(revision.definition) };
}
