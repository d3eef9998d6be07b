import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import type { Db } from "./index";
import { projectMembers, projects, users, type Project } from "./schema";
import type { Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import type { ProjectDetail, ProjectMember, ProjectSummary } from "@/lib/validation/projects";

export type { ProjectDetail, ProjectMember, ProjectSummary };
import { recordAudit } from "./audit";

const memberCount = sql<number>`(select count(*)::int from ${projectMembers} where ${projectMembers.projectId} = ${projects.id})`;

function toSummary(p: Project, count: number): ProjectSummary {
  return {
    id: p.id,
    name: p.name,
    description: p.description,
    createdAt: p.createdAt.toISOString(),
    createdBy: p.createdBy,
    memberCount: count,
  };
}

/** Admins see every project; everyone else the projects they are a member of. */
export async function listVisibleProjects(db: Db, user: SessionUser): Promise<ProjectSummary[]> {
  if (user.role === "admin") {
    const rows = await db.select({ p: projects, count: memberCount }).from(projects).orderBy(desc(projects.createdAt));
    return rows.map((r) => toSummary(r.p, r.count));
  }
  const rows = await db
    .select({ p: projects, count: memberCount })
    .from(projects)
    .innerJoin(projectMembers, and(eq(projectMembers.projectId, projects.id), eq(projectMembers.userId, user.id)))
    .orderBy(desc(projects.createdAt));
  return rows.map((r) => toSummary(r.p, r.count));
}

/**
 * The project and the caller's effective role in it, or null when the caller may not see it
 * (answer 404 then, never 403). Per-project roles override the account's role; admins are admin everywhere.
 * Later features authorize with this: `const access = await projectAccess(db, user, id); if (!access) throw notFound("Project")`.
 */
export async function projectAccess(
  db: Db,
  user: SessionUser,
  projectId: string,
): Promise<{ project: Project; role: Role } | null> {
  const [row] = await db
    .select({ project: projects, memberRole: projectMembers.role, isMember: projectMembers.userId })
    .from(projects)
    .leftJoin(projectMembers, and(eq(projectMembers.projectId, projects.id), eq(projectMembers.userId, user.id)))
    .where(eq(projects.id, projectId))
    .limit(1);
  if (!row) return null;
  if (user.role === "admin") return { project: row.project, role: "admin" };
  if (!row.isMember) return null;
  return { project: row.project, role: row.memberRole ?? user.role };
}

export async function listProjectMembers(db: Db, projectId: string): Promise<ProjectMember[]> {
  const rows = await db
    .select({ id: users.id, name: users.name, email: users.email, accountRole: users.role, memberRole: projectMembers.role })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(and(eq(projectMembers.projectId, projectId), eq(users.active, true)))
    .orderBy(asc(users.name));
  return rows.map((r) => ({ id: r.id, name: r.name, email: r.email, role: r.memberRole ?? r.accountRole }));
}

export async function getProjectDetail(db: Db, user: SessionUser, projectId: string): Promise<ProjectDetail | null> {
  const access = await projectAccess(db, user, projectId);
  if (!access) return null;
  const members = await listProjectMembers(db, projectId);
  return { ...toSummary(access.project, members.length), yourRole: access.role, members };
}

/** Create a project; its creator becomes a member. Role checks happen in the handler. */
export async function createProject(
  db: Db,
  user: SessionUser,
  input: { name: string; description: string },
): Promise<ProjectSummary> {
  return db.transaction(async (tx) => {
    const [project] = await tx
      .insert(projects)
      .values({ name: input.name, description: input.description, createdBy: user.id })
      .returning();
    await tx.insert(projectMembers).values({ projectId: project.id, userId: user.id });
    await recordAudit(tx, {
      actorId: user.id,
      action: "project.create",
      targetType: "project",
      targetId: project.id,
      details: { name: project.name },
    });
    return toSummary(project, 1);
  });
}

export async function addProjectMember(db: Db, projectId: string, userId: string, role: Role | null = null): Promise<void> {
  await db
    .insert(projectMembers)
    .values({ projectId, userId, role })
    .onConflictDoUpdate({ target: [projectMembers.projectId, projectMembers.userId], set: { role } });
}
