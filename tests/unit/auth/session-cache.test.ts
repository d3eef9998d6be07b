/**
 * The validated-session cache (lib/auth/session-cache.ts): on its own (TTL, Lucia's expiry and slide
 * point, invalidation racing a validation, bound), and through the handlers — sign-out, deactivation
 * and a role change take effect on the very next request even with the session cached, and Lucia's
 * refreshed cookie (`session.fresh`) still goes out.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import type { Session } from "lucia";
import { SessionCache } from "@/lib/auth/session-cache";
import type { SessionUser } from "@/lib/auth/types";
import { sessionCacheFor } from "@/lib/auth/lucia";
import { authenticateCookieHeader } from "@/lib/auth/session";
import { sessions, users } from "@/db/schema";
import { POST as signIn } from "@/app/api/auth/sign-in/route";
import { POST as signOut } from "@/app/api/auth/sign-out/route";
import { GET as me } from "@/app/api/me/route";
import { POST as createUser } from "@/app/api/users/route";
import { PATCH as updateUser } from "@/app/api/users/[id]/route";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";

const DAY = 86_400_000;
const LIFETIME = 30 * DAY;
const NOW = 1_000_000_000_000;

function session(id: string, userId: string, expiresAt: number, fresh = false): Session {
  return { id, userId, expiresAt: new Date(expiresAt), fresh };
}
const alice: SessionUser = { id: "u-alice", email: "alice@example.test", name: "Alice", role: "engineer" };
const bob: SessionUser = { id: "u-bob", email: "bob@example.test", name: "Bob", role: "viewer" };

describe("SessionCache", () => {
  it("serves a validated session for its TTL only", () => {
    const cache = new SessionCache(LIFETIME, 5_000);
    cache.set(session("s1", alice.id, NOW + LIFETIME), alice, cache.generation, NOW);
    expect(cache.get("s1", NOW + 4_999)?.user).toEqual(alice);
    expect(cache.get("s1", NOW + 5_000)).toBeUndefined();
    expect(cache.size).toBe(0);
  });

  it("never serves a session past its Lucia expiry, nor past the point where Lucia slides it", () => {
    const cache = new SessionCache(LIFETIME, 5_000);
    // Only 16 days + 2 s left: Lucia slides the expiry once 15 days are left, 2 s from now.
    cache.set(session("s1", alice.id, NOW + 15 * DAY + 2_000), alice, cache.generation, NOW);
    expect(cache.get("s1", NOW + 1_999)).toBeDefined();
    expect(cache.get("s1", NOW + 2_000)).toBeUndefined();
    // A session already due for a slide (or expired) is not kept at all.
    cache.set(session("s2", alice.id, NOW + 10 * DAY), alice, cache.generation, NOW);
    cache.set(session("s3", alice.id, NOW - 1), alice, cache.generation, NOW);
    expect(cache.get("s2", NOW)).toBeUndefined();
    expect(cache.get("s3", NOW)).toBeUndefined();
    // With a short lifetime the expiry itself is the bound.
    const short = new SessionCache(0, 5_000);
    short.set(session("s4", alice.id, NOW + 1_000), alice, short.generation, NOW);
    expect(short.get("s4", NOW + 999)).toBeDefined();
    expect(short.get("s4", NOW + 1_000)).toBeUndefined();
  });

  it("hands out copies that are never fresh", () => {
    const cache = new SessionCache(LIFETIME, 5_000);
    cache.set(session("s1", alice.id, NOW + LIFETIME, true), alice, cache.generation, NOW);
    const hit = cache.get("s1", NOW + 1);
    expect(hit?.session.fresh).toBe(false);
    hit!.user.role = "admin";
    expect(cache.get("s1", NOW + 1)?.user.role).toBe("engineer");
  });

  it("invalidates one session, or every session of one user", () => {
    const cache = new SessionCache(LIFETIME, 5_000);
    const g = cache.generation;
    cache.set(session("a1", alice.id, NOW + LIFETIME), alice, g, NOW);
    cache.set(session("a2", alice.id, NOW + LIFETIME), alice, g, NOW);
    cache.set(session("b1", bob.id, NOW + LIFETIME), bob, g, NOW);
    cache.invalidateSession("a1");
    expect(cache.get("a1", NOW)).toBeUndefined();
    expect(cache.get("a2", NOW)).toBeDefined();
    cache.invalidateUser(alice.id);
    expect(cache.get("a2", NOW)).toBeUndefined();
    expect(cache.get("b1", NOW)).toBeDefined();
    cache.clear();
    expect(cache.get("b1", NOW)).toBeUndefined();
  });

  it("refuses a validation that began before an invalidation (it may have read the old row)", () => {
    const cache = new SessionCache(LIFETIME, 5_000);
    const before = cache.generation;
    cache.invalidateUser(alice.id); // e.g. a role change committed while the query was in flight
    cache.set(session("a1", alice.id, NOW + LIFETIME), alice, before, NOW);
    expect(cache.get("a1", NOW)).toBeUndefined();
    cache.set(session("a1", alice.id, NOW + LIFETIME), alice, cache.generation, NOW);
    expect(cache.get("a1", NOW)).toBeDefined();
  });

  it("is bounded: the oldest entries go first", () => {
    const cache = new SessionCache(LIFETIME, 5_000, 2);
    for (const id of ["s1", "s2", "s3"]) cache.set(session(id, alice.id, NOW + LIFETIME), alice, cache.generation, NOW);
    expect(cache.size).toBe(2);
    expect(cache.get("s1", NOW)).toBeUndefined();
    expect(cache.get("s3", NOW)).toBeDefined();
  });
});

describe("session cache through the handlers", () => {
  let t: TestDb;
  beforeAll(async () => {
    t = await openTestDb();
  });
  afterAll(async () => {
    await t.close();
  });

  const cookieOf = (headers: Headers) => headers.getSetCookie().find((c) => c.startsWith("tidewright_session="))?.split(";")[0] ?? "";
  const idOf = (cookie: string) => cookie.split("=")[1];

  async function newAccount(role: "viewer" | "engineer") {
    const email = `cache-${role}-${Date.now()}-${Math.random().toString(36).slice(2)}@demo.test`;
    const created = await t.call<{ id: string }>(createUser, {
      as: "admin",
      body: { email, name: "Cache test", role, password: "long-enough-password" },
    });
    const signedIn = await t.call(signIn, { body: { email, password: "long-enough-password" } });
    return { id: created.body.id, cookie: cookieOf(signedIn.headers) };
  }

  it("answers a repeated request from memory (no database read)", async () => {
    const { cookie } = await newAccount("viewer");
    expect((await t.call(me, { as: { cookie } })).status).toBe(200);
    expect(sessionCacheFor(t.db).get(idOf(cookie))).toBeDefined();
    // Deleted behind the cache's back (as another process could): still served within the TTL.
    await t.db.delete(sessions).where(eq(sessions.id, idOf(cookie)));
    expect((await t.call(me, { as: { cookie } })).status).toBe(200);
    sessionCacheFor(t.db).invalidateSession(idOf(cookie));
    expect((await t.call(me, { as: { cookie } })).status).toBe(401);
  });

  it("sign-out ends a cached session at once", async () => {
    const { cookie } = await newAccount("viewer");
    expect((await t.call(me, { as: { cookie } })).status).toBe(200);
    expect((await t.call(me, { as: { cookie } })).status).toBe(200);
    expect((await t.call(signOut, { as: { cookie }, method: "POST" })).status).toBe(204);
    expect(sessionCacheFor(t.db).get(idOf(cookie))).toBeUndefined();
    expect((await t.call(me, { as: { cookie } })).status).toBe(401);
  });

  it("a role change shows on the next request of a cached session", async () => {
    const account = await newAccount("viewer");
    expect((await t.call<{ role: string }>(me, { as: { cookie: account.cookie } })).body.role).toBe("viewer");
    const res = await t.call(updateUser, { method: "PATCH", as: "admin", params: { id: account.id }, body: { role: "engineer" } });
    expect(res.status).toBe(200);
    expect((await t.call<{ role: string }>(me, { as: { cookie: account.cookie } })).body.role).toBe("engineer");
  });

  it("deactivation signs a cached session out at once", async () => {
    const account = await newAccount("engineer");
    expect((await t.call(me, { as: { cookie: account.cookie } })).status).toBe(200);
    const res = await t.call(updateUser, { method: "PATCH", as: "admin", params: { id: account.id }, body: { active: false } });
    expect(res.status).toBe(200);
    expect((await t.call(me, { as: { cookie: account.cookie } })).status).toBe(401);
  });

  it("a deactivated account found on validation is not cached", async () => {
    const account = await newAccount("viewer");
    // Flagged inactive directly (its sessions left in place): validation must refuse and not remember it.
    await t.db.update(users).set({ active: false }).where(eq(users.id, account.id));
    const result = await authenticateCookieHeader(t.db, account.cookie);
    expect(result?.user).toBeNull();
    expect(sessionCacheFor(t.db).get(idOf(account.cookie))).toBeUndefined();
  });

  it("keeps Lucia's refresh: a session due for a slide is validated, extended and its cookie sent", async () => {
    const { cookie } = await newAccount("viewer");
    expect((await t.call(me, { as: { cookie } })).headers.getSetCookie()).toEqual([]);
    // Ten days left: Lucia slides the expiry on the next validation. Drop the cached copy as its TTL would.
    await t.db.update(sessions).set({ expiresAt: new Date(Date.now() + 10 * DAY) }).where(eq(sessions.id, idOf(cookie)));
    sessionCacheFor(t.db).invalidateSession(idOf(cookie));
    const refreshed = await t.call(me, { as: { cookie } });
    expect(refreshed.status).toBe(200);
    expect(cookieOf(refreshed.headers)).toBe(cookie);
    const [row] = await t.db.select().from(sessions).where(eq(sessions.id, idOf(cookie)));
    expect(row.expiresAt.getTime()).toBeGreaterThan(Date.now() + 29 * DAY);
    // The next request is served from the cache: not fresh, no cookie.
    const next = await t.call(me, { as: { cookie } });
    expect(next.status).toBe(200);
    expect(next.headers.getSetCookie()).toEqual([]);
  });
});
