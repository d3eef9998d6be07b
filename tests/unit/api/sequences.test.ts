/**
 * Handler tests for the sequences API (issue 4 §1, §11): list, create (blank / template), read,
 * rename, archive, duplicate — status codes and role rules, including "someone else's project → 404".
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { GET as listRoute, POST as createRoute } from "@/app/api/projects/[id]/sequences/route";
import { GET as getRoute, PATCH as patchRoute } from "@/app/api/sequences/[id]/route";
import { POST as duplicateRoute } from "@/app/api/sequences/[id]/duplicate/route";
import { auditLog, sequences } from "@/db/schema";
import { hashDefinition } from "@/machines/hash";
import { SEQUENCE_STATUSES as DB_STATUSES } from "@/db/schema";
import { SEQUENCE_STATUSES } from "@/lib/validation/sequences";
import { foreignProject, newSequence, outsider, storedRevision } from "./sequences-fixtures";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

interface ListBody {
  sequences: Array<{
    id: string;
    name: string;
    status: string;
    updatedAt: string;
    latestRevision: { number: number; hash: string; createdAt: string; message: string; author: { id: string; name: string } } | null;
  }>;
}

describe("GET /api/projects/:id/sequences", () => {
  it.each(["admin", "engineer", "clinician", "viewer"] as const)("lists the project's sequences for a %s", async (role) => {
    const id = await newSequence(t, { name: `Listed for ${role}` });
    const res = await t.call<ListBody>(listRoute, { as: role, params: { id: t.team.projectId } });
    expect(res.status).toBe(200);
    const item = res.body.sequences.find((s) => s.id === id);
    expect(item).toMatchObject({ name: `Listed for ${role}`, status: "draft" });
    expect(item?.latestRevision).toMatchObject({ number: 1, author: { id: t.team.users.engineer.id } });
    expect(item?.latestRevision?.hash).toMatch(/^[0-9a-f]{64}$/);
  });

  it("answers 401 without a session", async () => {
    const res = await t.call(listRoute, { params: { id: t.team.projectId } });
    expect(res.status).toBe(401);
  });

  it("answers 404 for a project the caller is not a member of, and for a malformed id", async () => {
    const other = await foreignProject(t);
    expect((await t.call(listRoute, { as: "engineer", params: { id: other } })).status).toBe(404);
    expect((await t.call(listRoute, { as: "engineer", params: { id: "not-a-uuid" } })).status).toBe(404);
  });

  it("lets an admin list any project", async () => {
    const other = await foreignProject(t);
    const res = await t.call<ListBody>(listRoute, { as: "admin", params: { id: other } });
    expect(res.status).toBe(200);
    expect(res.body.sequences).toEqual([]);
  });
});

describe("POST /api/projects/:id/sequences", () => {
  it("creates a blank sequence with revision 1 whose hash is the definition's hash", async () => {
    const res = await t.call<{ id: string }>(createRoute, {
      as: "engineer",
      params: { id: t.team.projectId },
      body: { name: "  Blank one  " },
    });
    expect(res.status).toBe(201);
    const [row] = await t.db.select().from(sequences).where(eq(sequences.id, res.body.id));
    expect(row).toMatchObject({ name: "Blank one", status: "draft", createdBy: t.team.users.engineer.id });
    const rev = await storedRevision(t, res.body.id, 1);
    expect(rev.hash).toBe(hashDefinition(rev.definition));
    expect(rev.definition.name).toBe("Blank one");
  });

  it("creates from a template: revision 1 holds the template renamed to the sequence", async () => {
    const id = await newSequence(t, { name: "Assist from template", template: "assist-volume" });
    const rev = await storedRevision(t, id, 1);
    expect(rev.definition.name).toBe("Assist from template");
    expect(Object.keys(rev.definition.machine.states).length).toBeGreaterThan(1);
    expect(rev.message).toMatch(/template/i);
    expect(Object.keys((rev.layout as { nodes: object }).nodes).length).toBe(
      Object.keys(rev.definition.machine.states).length,
    );
  });

  it("writes an audit entry", async () => {
    const id = await newSequence(t, { name: "Audited" });
    const entries = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.targetId, id), eq(auditLog.action, "sequence.create")));
    expect(entries).toHaveLength(1);
    expect(entries[0].actorId).toBe(t.team.users.engineer.id);
  });

  it.each(["clinician", "viewer"] as const)("answers 403 to a %s", async (role) => {
    const res = await t.call(createRoute, { as: role, params: { id: t.team.projectId }, body: { name: "Nope" } });
    expect(res.status).toBe(403);
  });

  it("answers 400 for a missing name or an unknown template", async () => {
    const missing = await t.call<{ fields: Record<string, string[]> }>(createRoute, {
      as: "engineer",
      params: { id: t.team.projectId },
      body: {},
    });
    expect(missing.status).toBe(400);
    expect(missing.body.fields.name).toBeDefined();
    const unknown = await t.call<{ fields: Record<string, string[]> }>(createRoute, {
      as: "engineer",
      params: { id: t.team.projectId },
      body: { name: "X", template: "no-such-template" },
    });
    expect(unknown.status).toBe(400);
    expect(unknown.body.fields.template).toBeDefined();
  });

  it("answers 404 to an engineer outside the project, 201 to one inside", async () => {
    const stranger = await outsider(t, "engineer");
    const other = await foreignProject(t);
    const res = await t.call(createRoute, { as: { cookie: stranger.cookie }, params: { id: other }, body: { name: "X" } });
    expect(res.status).toBe(404);
    const member = await outsider(t, "engineer");
    const theirs = await foreignProject(t, member.id);
    const ok = await t.call(createRoute, { as: { cookie: member.cookie }, params: { id: theirs }, body: { name: "X" } });
    expect(ok.status).toBe(201);
  });

  it("refuses a request from another site (Origin check)", async () => {
    const res = await t.call(createRoute, {
      as: "engineer",
      params: { id: t.team.projectId },
      body: { name: "Cross-site" },
      headers: { origin: "https://evil.example" },
    });
    expect(res.status).toBe(403);
  });
});

describe("GET /api/sequences/:id", () => {
  it("answers the sequence with canEdit by role", async () => {
    const id = await newSequence(t);
    const asEngineer = await t.call<{ canEdit: boolean; latestRevision: number; projectId: string }>(getRoute, {
      as: "engineer",
      params: { id },
    });
    expect(asEngineer.status).toBe(200);
    expect(asEngineer.body).toMatchObject({ id, projectId: t.team.projectId, latestRevision: 1, canEdit: true });
    for (const role of ["clinician", "viewer"] as const) {
      const res = await t.call<{ canEdit: boolean }>(getRoute, { as: role, params: { id } });
      expect(res.status).toBe(200);
      expect(res.body.canEdit).toBe(false);
    }
  });

  it("answers 404 for someone else's sequence and for an unknown id", async () => {
    const stranger = await outsider(t, "engineer");
    const other = await foreignProject(t, stranger.id);
    const theirs = await newSequence(t, {}, other, "admin");
    expect((await t.call(getRoute, { as: "engineer", params: { id: theirs } })).status).toBe(404);
    expect((await t.call(getRoute, { as: { cookie: stranger.cookie }, params: { id: theirs } })).status).toBe(200);
    expect((await t.call(getRoute, { as: "engineer", params: { id: crypto.randomUUID() } })).status).toBe(404);
  });
});

describe("PATCH /api/sequences/:id", () => {
  it("renames, archives and unarchives, with one audit entry each", async () => {
    const id = await newSequence(t, { name: "Before" });
    const renamed = await t.call<{ name: string }>(patchRoute, {
      method: "PATCH",
      as: "engineer",
      params: { id },
      body: { name: "After" },
    });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe("After");
    const archived = await t.call<{ status: string; canEdit: boolean }>(patchRoute, {
      method: "PATCH",
      as: "engineer",
      params: { id },
      body: { status: "archived" },
    });
    expect(archived.status).toBe(200);
    expect(archived.body).toMatchObject({ status: "archived", canEdit: false });
    const restored = await t.call<{ status: string }>(patchRoute, {
      method: "PATCH",
      as: "admin",
      params: { id },
      body: { status: "draft" },
    });
    expect(restored.body.status).toBe("draft");
    const actions = (await t.db.select().from(auditLog).where(eq(auditLog.targetId, id))).map((e) => e.action).sort();
    expect(actions).toEqual(["sequence.archive", "sequence.create", "sequence.rename", "sequence.unarchive"]);
  });

  it("answers 400 for a status this endpoint does not set, and for an empty change", async () => {
    const id = await newSequence(t);
    const approve = await t.call(patchRoute, { method: "PATCH", as: "engineer", params: { id }, body: { status: "approved" } });
    expect(approve.status).toBe(400);
    const empty = await t.call(patchRoute, { method: "PATCH", as: "engineer", params: { id }, body: {} });
    expect(empty.status).toBe(400);
  });

  it("answers 409 when 'draft' would undo a review state rather than unarchive", async () => {
    const id = await newSequence(t);
    await t.db.update(sequences).set({ status: "approved" }).where(eq(sequences.id, id));
    const res = await t.call(patchRoute, { method: "PATCH", as: "engineer", params: { id }, body: { status: "draft" } });
    expect(res.status).toBe(409);
    const archive = await t.call(patchRoute, { method: "PATCH", as: "engineer", params: { id }, body: { status: "archived" } });
    expect(archive.status).toBe(200);
  });

  it.each(["clinician", "viewer"] as const)("answers 403 to a %s", async (role) => {
    const id = await newSequence(t);
    const res = await t.call(patchRoute, { method: "PATCH", as: role, params: { id }, body: { name: "Mine now" } });
    expect(res.status).toBe(403);
  });
});

describe("POST /api/sequences/:id/duplicate", () => {
  it("copies the latest revision into a new sequence's revision 1 with the same hash", async () => {
    const id = await newSequence(t, { name: "Original", template: "volume-control" });
    const res = await t.call<{ id: string }>(duplicateRoute, { method: "POST", as: "engineer", params: { id } });
    expect(res.status).toBe(201);
    const [copy] = await t.db.select().from(sequences).where(eq(sequences.id, res.body.id));
    expect(copy.name).toBe("Copy of Original");
    expect((await storedRevision(t, res.body.id, 1)).hash).toBe((await storedRevision(t, id, 1)).hash);
    const named = await t.call<{ id: string }>(duplicateRoute, { as: "engineer", params: { id }, body: { name: "Named copy" } });
    expect(named.status).toBe(201);
  });

  it.each(["clinician", "viewer"] as const)("answers 403 to a %s", async (role) => {
    const id = await newSequence(t);
    expect((await t.call(duplicateRoute, { method: "POST", as: role, params: { id } })).status).toBe(403);
  });
});

describe("status values", () => {
  it("the client-side list mirrors the database enum", () => {
    expect([...SEQUENCE_STATUSES]).toEqual([...DB_STATUSES]);
  });
});
