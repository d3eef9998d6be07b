/**
 * Which sequences a user may see, and with which role. Sequence and revision reads go through these,
 * so "someone else's project" is decided in the WHERE clause (and answers 404), never after the row
 * has been fetched. Project-level access (the list, create, the rig) uses db/projects.ts projectAccess.
 *
 * Effective role, as in projectAccess: admins are admins everywhere; for everyone else a per-project
 * role on the membership row, when set, replaces the account's role.
 */
import "server-only";
import { and, eq, sql, type SQL } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import type { Db } from "@/db";
import { projectMembers, sequences } from "@/db/schema";
import { isRole, type Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";

/** SQL condition: the user may read rows of the project whose id column is `projectIdColumn`. */
export function visibleProjectCondition(user: SessionUser, projectIdColumn: AnyPgColumn): SQL {
  if (user.role === "admin") return sql`true`;
  return sql`exists (select 1 from ${projectMembers} where ${projectMembers.projectId} = ${projectIdColumn} and ${projectMembers.userId} = ${user.id})`;
}

function effectiveRole(user: SessionUser, memberRole: unknown): Role {
  if (user.role === "admin") return "admin";
  return isRole(memberRole) ? memberRole : user.role;
}

export interface VisibleSequence {
  id: string;
  projectId: string;
  name: string;
  status: (typeof sequences.$inferSelect)["status"];
  createdAt: Date;
  updatedAt: Date;
  role: Role;
}

/** A sequence in a project the user can see, with their role there; null otherwise. */
export async function sequenceFor(db: Db, user: SessionUser, sequenceId: string): Promise<VisibleSequence | null> {
  const rows = await db
    .select({
      id: sequences.id,
      projectId: sequences.projectId,
      name: sequences.name,
      status: sequences.status,
      createdAt: sequences.createdAt,
      updatedAt: sequences.updatedAt,
      memberRole: projectMembers.role,
    })
    .from(sequences)
    .leftJoin(
      projectMembers,
      and(eq(projectMembers.projectId, sequences.projectId), eq(projectMembers.userId, user.id)),
    )
    .where(and(eq(sequences.id, sequenceId), visibleProjectCondition(user, sequences.projectId)))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const { memberRole, ...sequence } = row;
  return { ...sequence, role: effectiveRole(user, memberRole) };
}
