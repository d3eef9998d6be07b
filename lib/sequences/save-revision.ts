/**
 * Save = a new immutable revision (issue 4 §6). The order matters:
 *   visible? (404) → may edit? (403) → archived? (409) → stale base? (409) → format, compile, checks (422)
 *   → insert as latest + 1 in one short transaction (409 if someone got there first) → 201.
 * The CPU work (compile, checks, hash) happens before the transaction so it never holds the database.
 */
import "server-only";
import type { Db } from "@/db";
import { sequenceFor } from "@/db/queries/sequences-access";
import { insertRevision, latestRevisionNumber } from "@/db/queries/revisions";
import { can } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { forbidden, notFound } from "@/lib/errors";
import { sequenceLayout } from "@/machines/schema";
import type { Problem } from "@/machines/checks/types";
import type { SaveRevisionBody } from "@/lib/validation/sequences";
import { assessDefinition } from "./assess-definition";

export type SaveOutcome =
  | { kind: "created"; id: string; number: number; hash: string; problems: Problem[] }
  | { kind: "stale"; latestRevision: number }
  | { kind: "archived"; latestRevision: number }
  | { kind: "invalid"; problems: Problem[] };

export async function saveRevision(
  db: Db,
  user: SessionUser,
  sequenceId: string,
  body: SaveRevisionBody,
): Promise<SaveOutcome> {
  const sequence = await sequenceFor(db, user, sequenceId);
  if (!sequence) throw notFound("That sequence");
  if (!can(sequence.role, "sequences:edit")) {
    throw forbidden("Your role in this project can read sequences but not save them.");
  }

  const latest = (await latestRevisionNumber(db, sequenceId)) ?? 0;
  if (sequence.status === "archived") return { kind: "archived", latestRevision: latest };
  // Checked again inside the insert; this early answer spares the author fixing problems in a stale copy.
  if (body.baseRevision !== latest) return { kind: "stale", latestRevision: latest };

  const assessment = assessDefinition(body.definition);
  if (!assessment.ok) return { kind: "invalid", problems: assessment.problems };

  const layout = sequenceLayout.safeParse(body.layout);
  const inserted = await insertRevision(db, {
    sequenceId,
    baseRevision: body.baseRevision,
    authorId: user.id,
    message: body.message,
    definition: assessment.definition,
    // Positions only; a malformed layout is dropped and the canvas auto-lays-out, not a failed save.
    layout: layout.success ? layout.data : { nodes: {} },
    hash: assessment.hash,
  });
  if (inserted.kind === "stale") return inserted;
  return { kind: "created", id: inserted.id, number: inserted.number, hash: assessment.hash, problems: assessment.warnings };
}
