import { route } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { sequenceFor } from "@/db/queries/sequences-access";
import { listRevisions } from "@/db/queries/revisions";
import { saveRevision } from "@/lib/sequences/save-revision";
import { saveRevisionBody, sequenceParams } from "@/lib/validation/sequences";

export const dynamic = "force-dynamic";

export const GET = route({ params: sequenceParams }, async ({ db, user, params }) => {
  if (!(await sequenceFor(db, user, params.id))) throw notFound("That sequence");
  return { revisions: await listRevisions(db, params.id) };
});

/**
 * Save. 409 and 422 carry more than the shared error body (latestRevision, problems), so they are
 * returned as Responses rather than thrown as ApiErrors.
 */
export const POST = route(
  // Definitions with long descriptions and many steps stay well under this; it only stops abuse.
  { params: sequenceParams, body: saveRevisionBody, maxBodyBytes: 512 * 1024 },
  async ({ db, user, params, body }) => {
    const outcome = await saveRevision(db, user, params.id, body);
    switch (outcome.kind) {
      case "created":
        return Response.json(
          { id: outcome.id, number: outcome.number, hash: outcome.hash, problems: outcome.problems },
          { status: 201 },
        );
      case "stale":
        return Response.json(
          {
            error: `Revision ${outcome.latestRevision} was saved after the one you started from. Reload it and apply your changes again.`,
            latestRevision: outcome.latestRevision,
          },
          { status: 409 },
        );
      case "archived":
        return Response.json(
          { error: "This sequence is archived. Unarchive it before saving.", latestRevision: outcome.latestRevision },
          { status: 409 },
        );
      case "invalid":
        return Response.json(
          {
            error: `The sequence has ${outcome.problems.length} blocking problem${outcome.problems.length === 1 ? "" : "s"}; fix ${outcome.problems.length === 1 ? "it" : "them"} and save again.`,
            problems: outcome.problems,
          },
          { status: 422 },
        );
    }
  },
);
