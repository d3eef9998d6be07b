/**
 * Shared setup for the sequences / revisions / rig handler tests: people and projects outside the
 * demo team (to prove "someone else's record → 404"), and a quick way to make a sequence.
 */
import { eq } from "drizzle-orm";
import { projectMembers, projects, revisions, users } from "@/db/schema";
import { luciaFor } from "@/lib/auth/lucia";
import type { Role } from "@/lib/auth/roles";
import type { TestDb } from "@/tests/fixtures/test-db";
import { POST as createSequenceRoute } from "@/app/api/projects/[id]/sequences/route";
import { sequenceDefinition, type SequenceDefinition } from "@/machines/schema";

let counter = 0;
const unique = (prefix: string) => `${prefix}-${process.pid}-${Date.now()}-${++counter}`;

/** A signed-in account that belongs to no project. */
export async function outsider(t: TestDb, role: Role = "engineer"): Promise<{ id: string; cookie: string }> {
  const [user] = await t.db
    .insert(users)
    .values({ email: `${unique("outsider")}@example.test`, name: "Olu Outsider", role, passwordHash: "x" })
    .returning({ id: users.id });
  const session = await luciaFor(t.db).createSession(user.id, {});
  return { id: user.id, cookie: `${luciaFor(t.db).sessionCookieName}=${session.id}` };
}

/** A project none of the demo team is a member of. */
export async function foreignProject(t: TestDb, memberId?: string): Promise<string> {
  const [project] = await t.db.insert(projects).values({ name: unique("Other programme") }).returning({ id: projects.id });
  if (memberId) await t.db.insert(projectMembers).values({ projectId: project.id, userId: memberId });
  return project.id;
}

export async function newSequence(
  t: TestDb,
  body: { name?: string; template?: string } = {},
  projectId = t.team.projectId,
  as: Role = "engineer",
): Promise<string> {
  const res = await t.call<{ id: string }>(createSequenceRoute, {
    as,
    params: { id: projectId },
    body: { name: body.name ?? unique("Sequence"), ...(body.template ? { template: body.template } : {}) },
  });
  if (res.status !== 201) throw new Error(`create failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.id;
}

export async function storedRevision(t: TestDb, sequenceId: string, number: number) {
  const rows = await t.db.select().from(revisions).where(eq(revisions.sequenceId, sequenceId));
  const row = rows.find((r) => r.number === number);
  if (!row) throw new Error(`no revision ${number}`);
  return { ...row, definition: sequenceDefinition.parse(row.definition) as SequenceDefinition };
}
