import { route } from "@/lib/api/handler";
import { warmSimulationPool } from "@/lib/runs/pool";
import { createCase, listCases } from "@/db/queries/cases";
import { canEditCases, createCaseBody } from "@/lib/validation/cases";

export const dynamic = "force-dynamic";

export const GET = route({}, async ({ db }) => {
  // The run launcher loads the cases first: a good moment to have the simulation workers up.
  warmSimulationPool();
  return { cases: await listCases(db) };
});

export const POST = route(
  { body: createCaseBody, allow: (u) => canEditCases(u.role), status: 201 },
  async ({ db, user, body }) => createCase(db, user.id, body),
);
