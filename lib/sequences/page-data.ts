/**
 * Loaders for the sequence and rig pages. Pages are thin: they call one of these and hand the result
 * to client components. A record the user may not see, a malformed id, or a sequence addressed under
 * the wrong project all end in Next's notFound(), the page equivalent of the API's 404.
 */
import "server-only";
import { notFound, redirect } from "next/navigation";
import { getDb, type Db } from "@/db";
import { projectAccess } from "@/db/projects";
import { sequenceFor } from "@/db/queries/sequences-access";
import { currentUser } from "@/lib/auth/session";
import type { Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { uuidParam } from "@/lib/validation/sequences";
import { sequenceView } from "./sequence-view";
import type { SequenceView } from "./types";

export interface ProjectPageContext {
  db: Db;
  user: SessionUser;
  project: { id: string; name: string };
  role: Role;
}

export async function loadProjectPage(rawProjectId: string): Promise<ProjectPageContext> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const projectId = uuidParam.safeParse(rawProjectId);
  if (!projectId.success) notFound();
  const db = await getDb();
  const access = await projectAccess(db, user, projectId.data);
  if (!access) notFound();
  return { db, user, project: { id: access.project.id, name: access.project.name }, role: access.role };
}

export interface SequencePageContext extends ProjectPageContext {
  sequence: SequenceView;
}

export async function loadSequencePage(rawProjectId: string, rawSequenceId: string): Promise<SequencePageContext> {
  const context = await loadProjectPage(rawProjectId);
  const sequenceId = uuidParam.safeParse(rawSequenceId);
  if (!sequenceId.success) notFound();
  const sequence = await sequenceFor(context.db, context.user, sequenceId.data);
  if (!sequence || sequence.projectId !== context.project.id) notFound();
  return { ...context, sequence: await sequenceView(context.db, sequence) };
}

/** `?rev=3` → 3; absent → null; anything else → notFound (a mistyped link should not show the latest). */
export function revisionFromQuery(value: string | string[] | undefined): number | null {
  if (value === undefined) return null;
  const text = Array.isArray(value) ? value[0] : value;
  if (!/^[1-9]\d{0,6}$/.test(text)) notFound();
  return Number(text);
}
