import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { GET as listUsers, POST as createUser } from "@/app/api/users/route";
import { PATCH as updateUser } from "@/app/api/users/[id]/route";
import { POST as signIn } from "@/app/api/auth/sign-in/route";
import { GET as me } from "@/app/api/me/route";
import { auditFor } from "@/db/audit";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

interface UserBody {
  id: string;
  email: string;
  role: string;
  active: boolean;
}

describe("admin user management", () => {
  it("lists users without password hashes", async () => {
    const res = await t.call<{ users: Record<string, unknown>[] }>(listUsers, { as: "admin" });
    expect(res.status).toBe(200);
    expect(res.body.users.map((u) => u.email)).toEqual(
      expect.arrayContaining(["admin@demo.test", "engineer@demo.test", "clinician@demo.test", "viewer@demo.test"]),
    );
    for (const u of res.body.users) expect(Object.keys(u)).not.toContain("passwordHash");
  });

  it("creates a user who can sign in with the given role, and audits it", async () => {
    const res = await t.call<UserBody>(createUser, {
      as: "admin",
      body: { email: "New.Person@Demo.test", name: "New Person", role: "clinician", password: "correct-horse-battery" },
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: "new.person@demo.test", role: "clinician", active: true });
    const signedIn = await t.call<{ role: string }>(signIn, {
      body: { email: "new.person@demo.test", password: "correct-horse-battery" },
    });
    expect(signedIn.body.role).toBe("clinician");
    const audit = await auditFor(t.db, "user", res.body.id);
    expect(audit.map((a) => a.action)).toContain("user.create");
    expect(audit.find((a) => a.action === "user.create")?.actorId).toBe(t.team.users.admin.id);
  });

  it("refuses a duplicate email with 409 and a field message", async () => {
    const res = await t.call<{ fields: Record<string, string[]> }>(createUser, {
      as: "admin",
      body: { email: "engineer@demo.test", name: "Dup", role: "viewer", password: "long-enough-password" },
    });
    expect(res.status).toBe(409);
    expect(res.body.fields.email[0]).toMatch(/already exists/);
  });

  it("validates the new user's fields", async () => {
    const res = await t.call<{ fields: Record<string, string[]> }>(createUser, {
      as: "admin",
      body: { email: "x", name: "", role: "superuser", password: "short" },
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fields).sort()).toEqual(["email", "name", "password", "role"]);
  });

  it("changes a role and deactivates a user, which ends their sessions", async () => {
    const created = await t.call<UserBody>(createUser, {
      as: "admin",
      body: { email: "temp@demo.test", name: "Temp", role: "viewer", password: "long-enough-password" },
    });
    const signedIn = await t.call(signIn, { body: { email: "temp@demo.test", password: "long-enough-password" } });
    const cookie = signedIn.headers.getSetCookie()[0].split(";")[0];
    const promoted = await t.call<UserBody>(updateUser, {
      method: "PATCH",
      as: "admin",
      params: { id: created.body.id },
      body: { role: "engineer" },
    });
    expect(promoted.body.role).toBe("engineer");
    expect((await t.call<{ role: string }>(me, { as: { cookie } })).body.role).toBe("engineer");

    const off = await t.call<UserBody>(updateUser, {
      method: "PATCH",
      as: "admin",
      params: { id: created.body.id },
      body: { active: false },
    });
    expect(off.body.active).toBe(false);
    expect((await t.call(me, { as: { cookie } })).status).toBe(401);
    const again = await t.call<{ error: string }>(signIn, { body: { email: "temp@demo.test", password: "long-enough-password" } });
    expect(again.status).toBe(401);
    expect(again.body.error).toMatch(/deactivated/);
  });

  it("will not let an admin demote or deactivate themselves", async () => {
    const res = await t.call(updateUser, {
      method: "PATCH",
      as: "admin",
      params: { id: t.team.users.admin.id },
      body: { active: false },
    });
    expect(res.status).toBe(409);
  });

  it("answers 404 for an unknown user and 400 for an empty patch", async () => {
    const unknown = await t.call(updateUser, {
      method: "PATCH",
      as: "admin",
      params: { id: "00000000-0000-4000-8000-000000000000" },
      body: { role: "viewer" },
    });
    expect(unknown.status).toBe(404);
    const empty = await t.call(updateUser, { method: "PATCH", as: "admin", params: { id: t.team.users.viewer.id }, body: {} });
    expect(empty.status).toBe(400);
  });
});
