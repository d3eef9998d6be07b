import { route } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { sequenceFor } from "@/db/queries/sequences-access";
import { revisionView } from "@/lib/sequences/revision-view";
import { revisionParams } from "@/lib/validation/sequences";

export const dynamic = "force-dynamic";

export const GET = route({ params: revisionParams }, async ({ db, user, params }) => {
  if (!(await sequenceFor(db, user, params.id))) throw notFound("That sequence");
  const revision = await revisionView(db, params.id, params.n);
  if (!revision) throw notFound("That revision");
  return revision;
});
