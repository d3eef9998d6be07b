/**
 * Role × endpoint matrix from issue 2 §5: every endpoint answers every kind of caller as specified.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { GET as me } from "@/app/api/me/route";
import { GET as health } from "@/app/api/health/route";
import { GET as listProjects, POST as createProject } from "@/app/api/projects/route";
import { GET as getProject } from "@/app/api/projects/[id]/route";
import { GET as listUsers, POST as createUser } from "@/app/api/users/route";
import { PATCH as updateUser } from "@/app/api/users/[id]/route";
import { POST as signOut } from "@/app/api/auth/sign-out/route";
import type { Role } from "@/lib/auth/roles";
import type { RouteHandler } from "@/lib/api/handler";

type Caller = Role | "anonymous";
const CALLERS: Caller[] = ["anonymous", "admin", "engineer", "clinician", "viewer"];

let t: TestDb;
let adminOnlyProjectId: string;
beforeAll(async () => {
  t = await openTestDb();
  // A project only its creator (the admin) belongs to.
  const res = await t.call<{ id: string }>(createProject, { as: "admin", body: { name: "Admin's private bench" } });
  adminOnlyProjectId = res.body.id;
});
afterAll(async () => {
  await t.close();
});

interface Row {
  name: string;
  handler: RouteHandler;
  method?: string;
  body?: () => unknown;
  params?: () => Record<string, string>;
  expected: Record<Caller, number>;
}

const all = (status: number, anonymous = 401): Record<Caller, number> => ({
  anonymous,
  admin: status,
  engineer: status,
  clinician: status,
  viewer: status,
});

let n = 0;
const unique = () => `matrix-${Date.now()}-${n++}`;

const rows: Row[] = [
  { name: "GET /api/me", handler: me, expected: all(200) },
  { name: "GET /api/health", handler: health, expected: all(200, 200) },
  { name: "GET /api/projects", handler: listProjects, expected: all(200) },
  {
    name: "POST /api/projects (valid)",
    handler: createProject,
    body: () => ({ name: unique(), description: "made by the matrix test" }),
    expected: { anonymous: 401, admin: 201, engineer: 201, clinician: 403, viewer: 403 },
  },
  {
    name: "POST /api/projects (invalid)",
    handler: createProject,
    body: () => ({ name: "", description: 7 }),
    expected: all(400, 400),
  },
  {
    name: "GET /api/projects/:id (demo project, all members)",
    handler: getProject,
    params: () => ({ id: t.team.projectId }),
    expected: all(200),
  },
  {
    name: "GET /api/projects/:id (not a member)",
    handler: getProject,
    params: () => ({ id: adminOnlyProjectId }),
    expected: { anonymous: 401, admin: 200, engineer: 404, clinician: 404, viewer: 404 },
  },
  {
    name: "GET /api/projects/:id (no such project)",
    handler: getProject,
    params: () => ({ id: "00000000-0000-4000-8000-000000000000" }),
    expected: all(404),
  },
  { name: "GET /api/projects/:id (malformed id)", handler: getProject, params: () => ({ id: "nope" }), expected: all(404, 404) },
  { name: "GET /api/users", handler: listUsers, expected: { anonymous: 401, admin: 200, engineer: 403, clinician: 403, viewer: 403 } },
  {
    name: "POST /api/users",
    handler: createUser,
    body: () => ({ email: `${unique()}@demo.test`, name: "Matrix Person", role: "viewer", password: "a-long-enough-password" }),
    expected: { anonymous: 401, admin: 201, engineer: 403, clinician: 403, viewer: 403 },
  },
  {
    name: "PATCH /api/users/:id",
    handler: updateUser,
    method: "PATCH",
    params: () => ({ id: t.team.users.viewer.id }),
    body: () => ({ role: "viewer" }),
    expected: { anonymous: 401, admin: 200, engineer: 403, clinician: 403, viewer: 403 },
  },
  { name: "POST /api/auth/sign-out", handler: signOut, method: "POST", expected: all(204, 204) },
];

describe.each(rows)("$name", (row) => {
  it.each(CALLERS)("as %s", async (caller) => {
    // Sign-out would end the shared session cookie for that role: give it a throwaway session.
    const as =
      caller === "anonymous"
        ? null
        : row.handler === signOut
          ? { cookie: await freshCookie(caller) }
          : caller;
    const res = await t.call<{ error?: string }>(row.handler, {
      method: row.method,
      as,
      body: row.body?.(),
      params: row.params?.(),
    });
    expect(res.status, JSON.stringify(res.body)).toBe(row.expected[caller]);
    if (res.status >= 400) expect(typeof res.body.error).toBe("string");
  });
});

async function freshCookie(role: Role): Promise<string> {
  const { luciaFor } = await import("@/lib/auth/lucia");
  const lucia = luciaFor(t.db);
  const session = await lucia.createSession(t.team.users[role].id, {});
  return `${lucia.sessionCookieName}=${session.id}`;
}

describe("what each role sees", () => {
  it("lists the demo project for every member, and the admin's private project only for the admin", async () => {
    for (const role of ["admin", "engineer", "clinician", "viewer"] as const) {
      const res = await t.call<{ projects: { id: string }[] }>(listProjects, { as: role });
      const ids = res.body.projects.map((p) => p.id);
      expect(ids).toContain(t.team.projectId);
      expect(ids.includes(adminOnlyProjectId)).toBe(role === "admin");
    }
  });

  it("answers POST /api/projects with 201 and the new project, which its creator can then read", async () => {
    const res = await t.call<{ id: string; name: string; description: string }>(createProject, {
      as: "engineer",
      body: { name: "  Night-shift rig  ", description: "trimmed" },
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: "Night-shift rig", description: "trimmed" });
    expect(res.body.id).toMatch(/^[0-9a-f-]{36}$/);
    const read = await t.call<{ yourRole: string }>(getProject, { as: "engineer", params: { id: res.body.id } });
    expect(read.status).toBe(200);
    expect(read.body.yourRole).toBe("engineer");
    expect((await t.call(getProject, { as: "clinician", params: { id: res.body.id } })).status).toBe(404);
  });

  it("gives per-field messages for invalid project input", async () => {
    const res = await t.call<{ error: string; fields: Record<string, string[]> }>(createProject, {
      as: "engineer",
      body: { name: "", description: 7 },
    });
    expect(res.body.fields.name).toEqual(["Give the project a name."]);
    expect(res.body.fields.description).toEqual(["The description must be text."]);
  });
});
