import { route } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { sequenceFor } from "@/db/queries/sequences-access";
import { sequenceView } from "@/lib/sequences/sequence-view";
import { patchSequence } from "@/lib/sequences/update-sequence";
import { patchSequenceBody, sequenceParams } from "@/lib/validation/sequences";

export const dynamic = "force-dynamic";

export const GET = route({ params: sequenceParams }, async ({ db, user, params }) => {
  const sequence = await sequenceFor(db, user, params.id);
  if (!sequence) throw notFound("That sequence");
  return sequenceView(db, sequence);
});

export const PATCH = route(
  { params: sequenceParams, body: patchSequenceBody },
  async ({ db, user, params, body }) => patchSequence(db, user, params.id, body),
);
