import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { POST as signIn } from "@/app/api/auth/sign-in/route";
import { POST as signOut } from "@/app/api/auth/sign-out/route";
import { GET as me } from "@/app/api/me/route";
import { GET as health } from "@/app/api/health/route";
import { DEMO_PASSWORD } from "@/db/seed";
import { ROLES } from "@/lib/auth/roles";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

function sessionCookie(headers: Headers): string {
  const set = headers.getSetCookie().find((c) => c.startsWith("tidewright_session="));
  if (!set) throw new Error("no session cookie set");
  return set.split(";")[0];
}

describe("POST /api/auth/sign-in", () => {
  it.each(ROLES)("signs in the demo %s and /api/me answers with that role", async (role) => {
    const res = await t.call(signIn, { body: { email: `${role}@demo.test`, password: DEMO_PASSWORD } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ email: `${role}@demo.test`, role });
    const setCookie = res.headers.getSetCookie().join("\n");
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
    const who = await t.call(me, { as: { cookie: sessionCookie(res.headers) } });
    expect(who.status).toBe(200);
    expect(who.body).toEqual({ id: t.team.users[role].id, email: `${role}@demo.test`, name: t.team.users[role].name, role });
  });

  it("accepts the email in any case and with spaces", async () => {
    const res = await t.call(signIn, { body: { email: "  Viewer@Demo.TEST ", password: DEMO_PASSWORD } });
    expect(res.status).toBe(200);
  });

  it("answers 401 with a JSON error on a wrong password and on an unknown email", async () => {
    const wrong = await t.call(signIn, { body: { email: "clinician@demo.test", password: "not-the-password" } });
    expect(wrong.status).toBe(401);
    expect(wrong.body).toEqual({ error: "Email or password is incorrect." });
    expect(wrong.headers.getSetCookie()).toEqual([]);
    const unknown = await t.call(signIn, { body: { email: "nobody@demo.test", password: "whatever" } });
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
  });

  it("answers 400 with field errors on a malformed body", async () => {
    const res = await t.call<{ error: string; fields: Record<string, string[]> }>(signIn, {
      body: { email: "not-an-email" },
    });
    expect(res.status).toBe(400);
    expect(typeof res.body.error).toBe("string");
    expect(res.body.fields.email).toEqual(["Enter a valid email address."]);
    expect(res.body.fields.password).toEqual(["Enter your password."]);
  });

  it("answers 400 on a body that is not JSON", async () => {
    const res = await t.call(signIn, { body: "{not json" });
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: "The request body is not valid JSON." });
  });

  it("refuses a cross-site Origin with 403", async () => {
    const res = await t.call(signIn, {
      body: { email: "admin@demo.test", password: DEMO_PASSWORD },
      headers: { origin: "https://evil.example" },
    });
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: "This request came from another site and was refused." });
  });
});

describe("POST /api/auth/sign-out", () => {
  it("answers 204 and invalidates the session", async () => {
    const signedIn = await t.call(signIn, { body: { email: "engineer@demo.test", password: DEMO_PASSWORD } });
    const cookie = sessionCookie(signedIn.headers);
    expect((await t.call(me, { as: { cookie } })).status).toBe(200);
    const out = await t.call(signOut, { method: "POST", as: { cookie } });
    expect(out.status).toBe(204);
    expect(out.headers.getSetCookie().join()).toMatch(/tidewright_session=;/);
    const after = await t.call(me, { as: { cookie } });
    expect(after.status).toBe(401);
    expect(after.body).toEqual({ error: "Sign in to continue." });
  });

  it("answers 204 without a session too", async () => {
    expect((await t.call(signOut, { method: "POST" })).status).toBe(204);
  });
});

describe("GET /api/health", () => {
  it("answers 200 when the database answers", async () => {
    const res = await t.call<{ ok: boolean }>(health);
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(true);
  });
});
