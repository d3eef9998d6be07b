import { route } from "@/lib/api/handler";
import { createCase, listCases } from "@/db/queries/cases";
import { canEditCases, createCaseBody } from "@/lib/validation/cases";

export const dynamic = "force-dynamic";

export const GET = route({}, async ({ db }) => ({ cases: await listCases(db) }));

export const POST = route(
  { body: createCaseBody, allow: (u) => canEditCases(u.role), status: 201 },
  async ({ db, user, body }) => createCase(db, user.id, body),
);
