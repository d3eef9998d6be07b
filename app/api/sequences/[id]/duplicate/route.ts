import { route } from "@/lib/api/handler";
import { duplicateSequence } from "@/lib/sequences/duplicate-sequence";
import { duplicateSequenceBody, sequenceParams } from "@/lib/validation/sequences";

export const dynamic = "force-dynamic";

export const POST = route(
  // An empty body is allowed: the copy is then named "Copy of …".
  { params: sequenceParams, body: duplicateSequenceBody.optional().transform((b) => b ?? {}), status: 201 },
  async ({ db, user, params, body }) => duplicateSequence(db, user, params.id, body),
);
