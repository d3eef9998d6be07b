/**
 * Create a sequence in a project (POST /api/projects/:id/sequences): visible project (404),
 * engineer/admin there (403), then the sequence and its revision 1 in one transaction.
 */
import "server-only";
import type { Db } from "@/db";
import { projectAccess } from "@/db/projects";
import { createSequenceWithRevision } from "@/db/queries/sequences";
import { can } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { forbidden, notFound } from "@/lib/errors";
import type { CreateSequenceBody } from "@/lib/validation/sequences";
import { firstRevision } from "./first-revision";

export async function createSequence(
  db: Db,
  user: SessionUser,
  projectId: string,
  body: CreateSequenceBody,
): Promise<{ id: string }> {
  const access = await projectAccess(db, user, projectId);
  if (!access) throw notFound("That project");
  if (!can(access.role, "sequences:edit")) throw forbidden("Your role in this project can read sequences but not create them.");
  const first = await firstRevision(body.name, body.template);
  return createSequenceWithRevision(db, {
    projectId,
    name: body.name,
    actorId: user.id,
    first,
    origin: body.template ? { template: body.template } : { template: null },
  });
}
