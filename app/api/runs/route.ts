import { route } from "@/lib/api/handler";
import { listRuns, startRun } from "@/lib/runs/service";
import { createRunBody, listRunsQuery } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

/** `?revisionId=` and/or `?caseId=` → `{ runs }`, newest first, only runs of projects the caller sees. */
export const GET = route({ query: listRunsQuery }, async ({ db, user, query }) => listRuns(db, user, query));

/**
 * Start a run. 201 `{ id, status, summary, error }` once it has ended (default `wait: true`; status is
 * done, failed or cancelled — a failed run is stored too); `wait: false` → 202 `{ id, status: "running" }`.
 * 400 bad body / duration outside 1–600 s / unknown or invalid case; 403 viewer; 404 revision not visible.
 */
export const POST = route({ body: createRunBody }, async ({ db, user, body }) => {
  const result = await startRun(db, user, body);
  return Response.json(result.body, { status: result.status });
});
