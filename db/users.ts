import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Db } from "./index";
import { sessions, users, type User } from "./schema";
import type { Role } from "@/lib/auth/roles";
import { hashPassword } from "@/lib/auth/password";
import { sessionCacheFor } from "@/lib/auth/lucia";
import type { UserSummary } from "@/lib/validation/users";

export type { UserSummary };

export function toUserSummary(u: User): UserSummary {
  return { id: u.id, email: u.email, name: u.name, role: u.role, active: u.active, createdAt: u.createdAt.toISOString() };
}

export async function findUserByEmail(db: Db, email: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).limit(1);
  return row;
}

export async function findUserById(db: Db, id: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.id, id)).limit(1);
  return row;
}

export async function listUsers(db: Db): Promise<UserSummary[]> {
  const rows = await db.select().from(users).orderBy(asc(users.email));
  return rows.map(toUserSummary);
}

export async function createUser(
  db: Db,
  input: { email: string; name: string; role: Role; password: string },
): Promise<User> {
  const passwordHash = await hashPassword(input.password);
  const [row] = await db
    .insert(users)
    .values({ email: input.email.trim().toLowerCase(), name: input.name, role: input.role, passwordHash })
    .returning();
  return row;
}

export async function updateUser(db: Db, id: string, patch: { role?: Role; active?: boolean }): Promise<User | undefined> {
  try {
    return await db.transaction(async (tx) => {
      const [row] = await tx.update(users).set(patch).where(eq(users.id, id)).returning();
      // A deactivated account is signed out everywhere at once.
      if (row && patch.active === false) await tx.delete(sessions).where(eq(sessions.userId, id));
      return row;
    });
  } finally {
    // Validated sessions carry the role and active flag (lib/auth/session-cache.ts): forget this user's
    // once the change is committed, so the next request reads the new row. Also after a rollback
    // (harmless: one extra query per session).
    sessionCacheFor(db).invalidateUser(id);
  }
}
