/**
 * Duplicate a sequence (POST /api/sequences/:id/duplicate): the copy starts at revision 1 holding the
 * source's latest definition and layout, so its history is its own and the hash matches the source's.
 */
import "server-only";
import type { Db } from "@/db";
import { sequenceFor } from "@/db/queries/sequences-access";
import { getRevision, latestRevisionNumber } from "@/db/queries/revisions";
import { createSequenceWithRevision } from "@/db/queries/sequences";
import { can } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { conflict, forbidden, notFound } from "@/lib/errors";
import type { DuplicateSequenceBody } from "@/lib/validation/sequences";

/** "Copy of X", trimmed so it still fits the 120-character name limit. */
export function copyName(name: string): string {
  return `Copy of ${name}`.slice(0, 120);
}

export async function duplicateSequence(
  db: Db,
  user: SessionUser,
  sequenceId: string,
  body: DuplicateSequenceBody,
): Promise<{ id: string }> {
  const source = await sequenceFor(db, user, sequenceId);
  if (!source) throw notFound("That sequence");
  if (!can(source.role, "sequences:edit")) throw forbidden("Your role in this project can read sequences but not copy them.");
  const latest = await latestRevisionNumber(db, sequenceId);
  const revision = latest === null ? null : await getRevision(db, sequenceId, latest);
  if (!revision) throw conflict("That sequence has no saved revision to copy yet.");
  const name = body.name ?? copyName(source.name);
  return createSequenceWithRevision(db, {
    projectId: source.projectId,
    name,
    actorId: user.id,
    first: {
      definition: revision.definition,
      layout: revision.layout,
      hash: revision.hash,
      message: `Copied from “${source.name}” revision ${revision.number}`,
    },
    origin: { duplicatedFrom: { sequenceId, revision: revision.number } },
  });
}
