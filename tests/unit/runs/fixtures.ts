/**
 * Setup shared by the runs and cases handler tests: sequences/revisions inserted directly (so these
 * tests do not depend on the sequences API), a project the demo team cannot see, outsiders.
 */
import { projectMembers, projects, revisions, sequences, users } from "@/db/schema";
import { luciaFor } from "@/lib/auth/lucia";
import type { Role } from "@/lib/auth/roles";
import type { TestDb } from "@/tests/fixtures/test-db";
import { getTemplate } from "@/machines/templates";
import type { SequenceDefinition } from "@/machines/schema";

let counter = 0;
export const unique = (prefix: string) => `${prefix}-${process.pid}-${Date.now()}-${++counter}`;

export async function signedInUser(t: TestDb, role: Role): Promise<{ id: string; cookie: string }> {
  const [user] = await t.db
    .insert(users)
    .values({ email: `${unique("user")}@example.test`, name: "Test person", role, passwordHash: "x" })
    .returning({ id: users.id });
  const lucia = luciaFor(t.db);
  const session = await lucia.createSession(user.id, {});
  return { id: user.id, cookie: `${lucia.sessionCookieName}=${session.id}` };
}

export async function newProject(t: TestDb, members: Array<{ userId: string; role?: Role }> = []): Promise<string> {
  const [p] = await t.db.insert(projects).values({ name: unique("Programme") }).returning({ id: projects.id });
  if (members.length > 0) {
    await t.db.insert(projectMembers).values(members.map((m) => ({ projectId: p.id, userId: m.userId, role: m.role ?? null })));
  }
  return p.id;
}

export function templateDefinition(id: string): SequenceDefinition {
  const tpl = getTemplate(id);
  if (!tpl) throw new Error(`no template ${id}`);
  return tpl.definition;
}

/** A sequence with one revision holding `definition`; returns the revision id. */
export async function newRevision(t: TestDb, projectId: string, definition: unknown, name = unique("Sequence")): Promise<string> {
  const [s] = await t.db.insert(sequences).values({ projectId, name }).returning({ id: sequences.id });
  const [r] = await t.db
    .insert(revisions)
    .values({ sequenceId: s.id, number: 1, definition, layout: {}, hash: unique("hash"), message: "test" })
    .returning({ id: revisions.id });
  return r.id;
}
