import "server-only";
import { cache } from "react";
import type { Session } from "lucia";
import { getDb, type Db } from "@/db";
import { luciaFor, SESSION_COOKIE } from "./lucia";
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
 */
export async function authenticateCookieHeader(
  db: Db,
  cookieHeader: string | null,
): Promise<(Authenticated | { user: null; setCookie?: string }) | null> {
  const lucia = luciaFor(db);
  const sessionId = lucia.readSessionCookie(cookieHeader ?? "");
  if (!sessionId) return null;
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session || !user) return { user: null, setCookie: lucia.createBlankSessionCookie().serialize() };
  if (!user.active) {
    await lucia.invalidateSession(session.id);
    return { user: null, setCookie: lucia.createBlankSessionCookie().serialize() };
  }
  return {
    session,
    user: { id: user.id, email: user.email, name: user.name, role: user.role },
    setCookie: session.fresh ? lucia.createSessionCookie(session.id).serialize() : undefined,
  };
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
