/**
 * Rename, archive or unarchive a sequence (PATCH /api/sequences/:id). Revisions are untouched: a
 * rename changes the label, not any saved definition (their hashes stay valid for sign-offs).
 */
import "server-only";
import type { Db } from "@/db";
import { sequenceFor } from "@/db/queries/sequences-access";
import { updateSequence } from "@/db/queries/sequences";
import { can } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { conflict, forbidden, notFound } from "@/lib/errors";
import type { PatchSequenceBody } from "@/lib/validation/sequences";
import { sequenceView, type SequenceView } from "./sequence-view";

export async function patchSequence(
  db: Db,
  user: SessionUser,
  sequenceId: string,
  body: PatchSequenceBody,
): Promise<SequenceView> {
  const sequence = await sequenceFor(db, user, sequenceId);
  if (!sequence) throw notFound("That sequence");
  if (!can(sequence.role, "sequences:edit")) throw forbidden("Your role in this project can read sequences but not change them.");
  // "draft" here means unarchive; it must not quietly undo a review or a release.
  if (body.status === "draft" && sequence.status !== "archived" && sequence.status !== "draft") {
    throw conflict("Only an archived sequence can be set back to draft here.");
  }
  await updateSequence(db, sequenceId, user.id, sequence, body);
  const updated = await sequenceFor(db, user, sequenceId);
  if (!updated) throw notFound("That sequence");
  return sequenceView(db, updated);
}
