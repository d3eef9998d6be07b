import { route } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { projectAccess } from "@/db/projects";
import { listSequences } from "@/db/queries/sequences";
import { createSequence } from "@/lib/sequences/create-sequence";
import { createSequenceBody, projectParams } from "@/lib/validation/sequences";

export const dynamic = "force-dynamic";

export const GET = route({ params: projectParams }, async ({ db, user, params }) => {
  if (!(await projectAccess(db, user, params.id))) throw notFound("That project");
  return { sequences: await listSequences(db, user, params.id) };
});

/** Role is checked against the caller's role in this project (create-sequence.ts), not the account's. */
export const POST = route(
  { params: projectParams, body: createSequenceBody, status: 201 },
  async ({ db, user, params, body }) => createSequence(db, user, params.id, body),
);
