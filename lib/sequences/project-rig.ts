/**
 * The project's rig profile as the API and the page see it: readable by every member, editable by
 * engineers and admins there (issue 4 §5).
 */
import "server-only";
import type { Db } from "@/db";
import { projectAccess } from "@/db/projects";
import { getProjectRig, saveProjectRig } from "@/db/queries/rig";
import { can } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import { forbidden, notFound } from "@/lib/errors";
import type { Rig } from "@/lib/sim/types";

export interface RigView {
  rig: Rig;
  updatedAt: string | null;
  canEdit: boolean;
}

export async function readRig(db: Db, user: SessionUser, projectId: string): Promise<RigView> {
  const access = await projectAccess(db, user, projectId);
  if (!access) throw notFound("That project");
  const { rig, updatedAt } = await getProjectRig(db, projectId);
  return { rig, updatedAt, canEdit: can(access.role, "rig:edit") };
}

export async function writeRig(db: Db, user: SessionUser, projectId: string, rig: Rig): Promise<RigView> {
  const access = await projectAccess(db, user, projectId);
  if (!access) throw notFound("That project");
  if (!can(access.role, "rig:edit")) throw forbidden("Your role in this project can read the rig profile but not change it.");
  const saved = await saveProjectRig(db, projectId, user.id, rig);
  return { rig: saved.rig, updatedAt: saved.updatedAt, canEdit: true };
}
