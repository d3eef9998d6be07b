/**
 * Handler tests for saving and reading revisions (issue 4 §6, §8, §11): 201 / 409 / 422 / 403 / 400 /
 * 404, numbering, and that the stored hash is the canonical-definition hash (stable, layout-blind).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { openTestDb, type CallOptions, type TestDb } from "@/tests/fixtures/test-db";
import { GET as listRoute, POST as saveRoute } from "@/app/api/sequences/[id]/revisions/route";
import { GET as revisionRoute } from "@/app/api/sequences/[id]/revisions/[n]/route";
import { PATCH as patchRoute } from "@/app/api/sequences/[id]/route";
import { auditLog } from "@/db/schema";
import { hashDefinition } from "@/machines/hash";
import type { SequenceDefinition } from "@/machines/schema";
import type { Problem } from "@/machines/checks/types";
import { foreignProject, newSequence, outsider, storedRevision } from "./sequences-fixtures";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

interface Saved {
  id: string;
  number: number;
  hash: string;
  problems: Problem[];
}

async function templateSequence(): Promise<{ id: string; definition: SequenceDefinition }> {
  const id = await newSequence(t, { template: "volume-control" });
  return { id, definition: (await storedRevision(t, id, 1)).definition };
}

/** Same definition with every object's keys in reverse order: must hash the same. */
function reorderKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(reorderKeys);
  if (value && typeof value === "object") {
    return Object.fromEntries(
      Object.entries(value as Record<string, unknown>)
        .reverse()
        .map(([k, v]) => [k, reorderKeys(v)]),
    );
  }
  return value;
}

function withDescription(def: SequenceDefinition, description: string): SequenceDefinition {
  return { ...structuredClone(def), description };
}

function save(id: string, body: unknown, as: CallOptions["as"] = "engineer") {
  return t.call<Saved & { error: string; latestRevision: number; fields: Record<string, string[]> }>(saveRoute, {
    as,
    params: { id },
    body,
  });
}

describe("POST /api/sequences/:id/revisions", () => {
  it("stores revision 2 with the definition's hash, warnings in the answer, and an audit entry", async () => {
    const { id, definition } = await templateSequence();
    const changed = withDescription(definition, "Longer hold for plateau readings");
    const res = await save(id, { definition: changed, layout: { nodes: {} }, message: "Describe it", baseRevision: 1 });
    expect(res.status).toBe(201);
    expect(res.body.number).toBe(2);
    expect(res.body.hash).toBe(hashDefinition(changed));
    expect(res.body.problems.every((p) => p.severity === "warning")).toBe(true);
    const stored = await storedRevision(t, id, 2);
    expect(stored).toMatchObject({ message: "Describe it", authorId: t.team.users.engineer.id, hash: res.body.hash });
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.targetId, id), eq(auditLog.action, "sequence.save")));
    expect(audit).toHaveLength(1);
  });

  it("gives the same hash for the same definition: key order and layout do not count", async () => {
    const { id, definition } = await templateSequence();
    const a = await save(id, { definition, layout: { nodes: {} }, message: "same", baseRevision: 1 });
    const b = await save(id, {
      definition: reorderKeys(definition),
      layout: { nodes: { anywhere: { x: 5, y: 9 } } },
      message: "same again",
      baseRevision: 2,
    });
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    expect(b.body.hash).toBe(a.body.hash);
    expect(a.body.hash).toBe((await storedRevision(t, id, 1)).hash);
    const c = await save(id, { definition: withDescription(definition, "different"), layout: {}, message: "", baseRevision: 3 });
    expect(c.body.hash).not.toBe(a.body.hash);
  });

  it("answers 409 with the latest number when the base revision is stale", async () => {
    const { id, definition } = await templateSequence();
    expect((await save(id, { definition, layout: {}, message: "first", baseRevision: 1 })).status).toBe(201);
    const stale = await save(id, { definition, layout: {}, message: "late", baseRevision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.latestRevision).toBe(2);
    expect(typeof stale.body.error).toBe("string");
    const ahead = await save(id, { definition, layout: {}, message: "future", baseRevision: 7 });
    expect(ahead.status).toBe(409);
  });

  it("lets exactly one of two concurrent saves from the same base through", async () => {
    const { id, definition } = await templateSequence();
    const [x, y] = await Promise.all([
      save(id, { definition: withDescription(definition, "x"), layout: {}, message: "x", baseRevision: 1 }),
      save(id, { definition: withDescription(definition, "y"), layout: {}, message: "y", baseRevision: 1 }),
    ]);
    expect([x.status, y.status].sort()).toEqual([201, 409]);
  });

  it("answers 422 with the problems when the definition breaks the format", async () => {
    const { id, definition } = await templateSequence();
    const broken = { ...structuredClone(definition), format: "something-else" };
    const res = await t.call<{ error: string; problems: Problem[] }>(saveRoute, {
      as: "engineer",
      params: { id },
      body: { definition: broken, layout: {}, message: "", baseRevision: 1 },
    });
    expect(res.status).toBe(422);
    expect(res.body.problems.length).toBeGreaterThan(0);
    expect(res.body.problems.every((p) => p.severity === "error")).toBe(true);
  });

  it("answers 422 when compile or the static checks find an error (transition to a missing step)", async () => {
    const { id, definition } = await templateSequence();
    const broken = structuredClone(definition);
    const [firstStep] = Object.keys(broken.machine.states);
    broken.machine.states[firstStep].on = { STOP: { target: "nowhere" } };
    const res = await t.call<{ problems: Problem[] }>(saveRoute, {
      as: "engineer",
      params: { id },
      body: { definition: broken, layout: {}, message: "", baseRevision: 1 },
    });
    expect(res.status).toBe(422);
    expect(res.body.problems.some((p) => p.severity === "error")).toBe(true);
    expect((await t.call<unknown[]>(listRoute, { as: "engineer", params: { id } })).body).toMatchObject({
      revisions: [{ number: 1 }],
    });
  });

  it("answers 422 for a guard naming an unknown signal", async () => {
    const { id, definition } = await templateSequence();
    const broken = structuredClone(definition);
    const [firstStep] = Object.keys(broken.machine.states);
    broken.machine.states[firstStep].on = {
      ...broken.machine.states[firstStep].on,
      SCAN: [{ target: firstStep, guard: { type: "formula", params: { expr: "pawz > 3" } } }],
    };
    const res = await save(id, { definition: broken, layout: {}, message: "", baseRevision: 1 });
    expect(res.status).toBe(422);
  });

  it.each(["clinician", "viewer"] as const)("answers 403 to a %s", async (role) => {
    const { id, definition } = await templateSequence();
    const res = await save(id, { definition, layout: {}, message: "", baseRevision: 1 }, role);
    expect(res.status).toBe(403);
  });

  it("answers 404 to an engineer outside the project", async () => {
    const stranger = await outsider(t, "engineer");
    const { id, definition } = await templateSequence();
    const res = await save(id, { definition, layout: {}, message: "", baseRevision: 1 }, { cookie: stranger.cookie });
    expect(res.status).toBe(404);
  });

  it("answers 400 for a malformed body", async () => {
    const { id, definition } = await templateSequence();
    expect((await save(id, { definition, layout: {}, message: "no base" })).status).toBe(400);
    expect((await save(id, { definition: "a string", layout: {}, baseRevision: 1 })).status).toBe(400);
    expect((await save(id, { definition, layout: {}, baseRevision: 1.5 })).status).toBe(400);
    expect((await save(id, "{not json")).status).toBe(400);
  });

  it("answers 409 while the sequence is archived", async () => {
    const { id, definition } = await templateSequence();
    await t.call(patchRoute, { method: "PATCH", as: "engineer", params: { id }, body: { status: "archived" } });
    const res = await save(id, { definition, layout: {}, message: "", baseRevision: 1 });
    expect(res.status).toBe(409);
  });
});

describe("GET /api/sequences/:id/revisions[/:n]", () => {
  it("lists revisions newest first with author and hash, readable by every role", async () => {
    const { id, definition } = await templateSequence();
    await save(id, { definition: withDescription(definition, "two"), layout: {}, message: "second", baseRevision: 1 });
    for (const role of ["admin", "engineer", "clinician", "viewer"] as const) {
      const res = await t.call<{ revisions: Array<{ number: number; message: string; hash: string; author: { name: string } }> }>(
        listRoute,
        { as: role, params: { id } },
      );
      expect(res.status).toBe(200);
      expect(res.body.revisions.map((r) => r.number)).toEqual([2, 1]);
      expect(res.body.revisions[0]).toMatchObject({ message: "second", author: { name: t.team.users.engineer.name } });
    }
  });

  it("answers one revision with definition, layout and problems; 404 for a missing one", async () => {
    const { id, definition } = await templateSequence();
    const res = await t.call<{ number: number; definition: SequenceDefinition; layout: object; problems: Problem[]; hash: string }>(
      revisionRoute,
      { as: "viewer", params: { id, n: "1" } },
    );
    expect(res.status).toBe(200);
    expect(res.body.definition).toEqual(definition);
    expect(res.body.hash).toBe(hashDefinition(definition));
    expect(Array.isArray(res.body.problems)).toBe(true);
    expect(res.body.layout).toHaveProperty("nodes");
    expect((await t.call(revisionRoute, { as: "viewer", params: { id, n: "99" } })).status).toBe(404);
    expect((await t.call(revisionRoute, { as: "viewer", params: { id, n: "zero" } })).status).toBe(404);
  });

  it("answers 404 for someone else's sequence", async () => {
    const other = await foreignProject(t);
    const theirs = await newSequence(t, {}, other, "admin");
    expect((await t.call(listRoute, { as: "engineer", params: { id: theirs } })).status).toBe(404);
    expect((await t.call(revisionRoute, { as: "engineer", params: { id: theirs, n: "1" } })).status).toBe(404);
  });
});
