import { route } from "@/lib/api/handler";
import { createProjectSchema } from "@/lib/validation/projects";
import { createProject, listVisibleProjects } from "@/db/projects";

export const dynamic = "force-dynamic";

export const GET = route({}, async ({ db, user }) => ({ projects: await listVisibleProjects(db, user) }));

export const POST = route(
  { allow: "projects:create", body: createProjectSchema, status: 201 },
  async ({ db, user, body }) => createProject(db, user, body),
);
