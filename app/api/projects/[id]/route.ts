import { route } from "@/lib/api/handler";
import { notFound } from "@/lib/errors";
import { projectParams } from "@/lib/validation/projects";
import { getProjectDetail } from "@/db/projects";

export const dynamic = "force-dynamic";

export const GET = route({ params: projectParams }, async ({ db, user, params }) => {
  const project = await getProjectDetail(db, user, params.id);
  if (!project) throw notFound("Project");
  return project;
});
