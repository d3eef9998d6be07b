import "server-only";
import { cache } from "react";
import type { Session } from "lucia";
import { getDb, type Db } from "@/db";
import { luciaFor, sessionCacheFor, SESSION_COOKIE } from "./lucia";
import type { SessionUser } from "./types";

export interface Authenticated {
  user: SessionUser;
  session: Session;
  /** Set-Cookie value to send back when Lucia refreshed or cleared the cookie. */
  setCookie?: string;
}

/**
 * Validate the session cookie found in a Cookie header. Deactivated users are treated as signed out
 * (their sessions are also deleted on deactivation). Returns null when there is no valid session.
 * A session validated in the last few seconds is answered from memory (lib/auth/session-cache.ts).
 */
export async function authenticateCookieHeader(
  db: Db,
  cookieHeader: string | null,
): Promise<(Authenticated | { user: null; setCookie?: string }) | null> {
  const lucia = luciaFor(db);
  const sessionId = lucia.readSessionCookie(cookieHeader ?? "");
  if (!sessionId) return null;
  const cache = sessionCacheFor(db);
  const hit = cache.get(sessionId);
  if (hit) return hit;
  const generation = cache.generation;
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session || !user) return { user: null, setCookie: lucia.createBlankSessionCookie().serialize() };
  if (!user.active) {
    await invalidateSession(db, session.id);
    return { user: null, setCookie: lucia.createBlankSessionCookie().serialize() };
  }
  const sessionUser: SessionUser = { id: user.id, email: user.email, name: user.name, role: user.role };
  cache.set(session, sessionUser, generation);
  return {
    session,
    user: sessionUser,
    setCookie: session.fresh ? lucia.createSessionCookie(session.id).serialize() : undefined,
  };
}

/** End one session (sign-out): in the database and in the session cache. */
export async function invalidateSession(db: Db, sessionId: string): Promise<void> {
  await luciaFor(db).invalidateSession(sessionId);
  // After the delete: a validation that read the row before it has either stored its result already
  // (dropped here) or will have it refused (the cache's generation has moved on).
  sessionCacheFor(db).invalidateSession(sessionId);
}

/**
 * The signed-in user for a server component (pages and layouts). Rendering cannot set cookies, so a
 * refreshed cookie is left for the next API call to send.
 */
export const currentUser = cache(async function currentUser(): Promise<SessionUser | null> {
  const { cookies } = await import("next/headers");
  const store = await cookies();
  const value = store.get(SESSION_COOKIE)?.value;
  if (!value) return null;
  const db = await getDb();
  const result = await authenticateCookieHeader(db, `${SESSION_COOKIE}=${value}`);
  return result?.user ?? null;
});
