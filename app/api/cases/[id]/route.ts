import { route } from "@/lib/api/handler";
import { findCaseRow, getCase, updateCase } from "@/db/queries/cases";
import { conflict, notFound } from "@/lib/errors";
import { canEditCases, caseIdParams, patchCaseBody } from "@/lib/validation/cases";

export const dynamic = "force-dynamic";

export const GET = route({ params: caseIdParams }, async ({ db, params }) => {
  const c = await getCase(db, params.id);
  if (!c) throw notFound("That patient case");
  return c;
});

export const PATCH = route(
  { params: caseIdParams, body: patchCaseBody, allow: (u) => canEditCases(u.role) },
  async ({ db, user, params, body }) => {
    const row = await findCaseRow(db, params.id);
    if (!row) throw notFound("That patient case");
    // Reference cases carry a citation: changing their numbers would make the citation false.
    if (row.seeded) throw conflict("Seeded reference cases cannot be changed. Create a new case from this one instead.");
    const updated = await updateCase(db, user.id, params.id, body);
    if (!updated) throw notFound("That patient case");
    return updated;
  },
);
