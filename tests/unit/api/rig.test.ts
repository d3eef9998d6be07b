/**
 * Handler tests for the project rig profile (issue 4 §5): every member reads (DEFAULT_RIG until one
 * is saved), engineers and admins write, the body is validated with rigSchema.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { GET as getRig, PUT as putRig } from "@/app/api/projects/[id]/rig/route";
import { auditLog } from "@/db/schema";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { rigSchema, type Rig } from "@/lib/sim/types";
import { foreignProject, outsider } from "./sequences-fixtures";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

interface RigBody {
  rig: Rig;
  updatedAt: string | null;
  canEdit: boolean;
}

const defaults = () => rigSchema.parse(DEFAULT_RIG);

describe("GET /api/projects/:id/rig", () => {
  it("answers the default profile for a project that has none, canEdit by role", async () => {
    const project = await foreignProject(t);
    const res = await t.call<RigBody>(getRig, { as: "admin", params: { id: project } });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ rig: defaults(), updatedAt: null, canEdit: true });
    for (const [role, canEdit] of [
      ["engineer", true],
      ["clinician", false],
      ["viewer", false],
    ] as const) {
      const mine = await t.call<RigBody>(getRig, { as: role, params: { id: t.team.projectId } });
      expect(mine.status).toBe(200);
      expect(mine.body.canEdit).toBe(canEdit);
    }
  });

  it("answers 404 outside the project and 401 without a session", async () => {
    const project = await foreignProject(t);
    expect((await t.call(getRig, { as: "engineer", params: { id: project } })).status).toBe(404);
    expect((await t.call(getRig, { params: { id: project } })).status).toBe(401);
  });
});

describe("PUT /api/projects/:id/rig", () => {
  it("stores a valid profile for an engineer, answers it, reads it back, audits it", async () => {
    const member = await outsider(t, "engineer");
    const project = await foreignProject(t, member.id);
    const rig: Rig = { ...defaults(), name: "Bench rig B", scanPeriodS: 0.005 };
    const res = await t.call<RigBody>(putRig, { method: "PUT", as: { cookie: member.cookie }, params: { id: project }, body: { rig } });
    expect(res.status).toBe(200);
    expect(res.body.rig).toEqual(rig);
    expect(res.body.updatedAt).not.toBeNull();
    const read = await t.call<RigBody>(getRig, { as: "admin", params: { id: project } });
    expect(read.body.rig).toEqual(rig);
    const again = await t.call<RigBody>(putRig, {
      method: "PUT",
      as: "admin",
      params: { id: project },
      body: { rig: { ...rig, reliefValveCmH2O: 45 } },
    });
    expect(again.status).toBe(200);
    expect((await t.call<RigBody>(getRig, { as: "admin", params: { id: project } })).body.rig.reliefValveCmH2O).toBe(45);
    const audit = await t.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.targetId, project), eq(auditLog.action, "rig.update")));
    expect(audit).toHaveLength(2);
  });

  it("answers 400 with field messages for an invalid profile", async () => {
    const res = await t.call<{ fields: Record<string, string[]> }>(putRig, {
      method: "PUT",
      as: "engineer",
      params: { id: t.team.projectId },
      body: { rig: { ...defaults(), scanPeriodS: -1, bagCalibration: [{ angleDeg: 0, volumeMl: 0 }] } },
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fields)).toEqual(expect.arrayContaining(["rig.scanPeriodS", "rig.bagCalibration"]));
  });

  it.each(["clinician", "viewer"] as const)("answers 403 to a %s", async (role) => {
    const res = await t.call(putRig, { method: "PUT", as: role, params: { id: t.team.projectId }, body: { rig: defaults() } });
    expect(res.status).toBe(403);
  });

  it("answers 404 to an engineer outside the project", async () => {
    const project = await foreignProject(t);
    const res = await t.call(putRig, { method: "PUT", as: "engineer", params: { id: project }, body: { rig: defaults() } });
    expect(res.status).toBe(404);
  });
});
