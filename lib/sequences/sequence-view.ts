/**
 * The JSON shape of one sequence (GET /api/sequences/:id), also what the pages receive as props.
 * `canEdit` folds the role and the status together: an archived sequence is read-only to everyone
 * until it is unarchived.
 */
import "server-only";
import type { Db } from "@/db";
import type { VisibleSequence } from "@/db/queries/sequences-access";
import { latestRevisionNumber } from "@/db/queries/revisions";
import { can } from "@/lib/auth/roles";
import type { SequenceView } from "./types";

export type { SequenceView };

export function mayEdit(sequence: Pick<VisibleSequence, "role" | "status">): boolean {
  return can(sequence.role, "sequences:edit") && sequence.status !== "archived";
}

export async function sequenceView(db: Db, sequence: VisibleSequence): Promise<SequenceView> {
  return {
    id: sequence.id,
    projectId: sequence.projectId,
    name: sequence.name,
    status: sequence.status,
    createdAt: sequence.createdAt.toISOString(),
    updatedAt: sequence.updatedAt.toISOString(),
    latestRevision: await latestRevisionNumber(db, sequence.id),
    canEdit: mayEdit(sequence),
  };
}
