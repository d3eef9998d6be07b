import "server-only";
import { Lucia, TimeSpan } from "lucia";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import type { Db } from "@/db";
import { sessions, users } from "@/db/schema";
import type { Role } from "./roles";
import { SessionCache } from "./session-cache";

/**
 * Lucia v3 is no longer developed (STACK.md): it stays behind lib/auth so it can be replaced.
 * One Lucia per database instance (tests swap the database per file).
 */
export const SESSION_COOKIE = "tidewright_session";

/** Lucia's default, spelt out because the session cache must know when Lucia slides the expiry. */
const SESSION_LIFETIME = new TimeSpan(30, "d");

function createLucia(db: Db) {
  return new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
    sessionExpiresIn: SESSION_LIFETIME,
    sessionCookie: {
      name: SESSION_COOKIE,
      // A long-lived cookie; Lucia slides the session's own 30-day expiry on use.
      expires: true,
      attributes: { secure: process.env.NODE_ENV === "production", sameSite: "lax" },
    },
    getUserAttributes: (attributes) => ({
      email: attributes.email,
      name: attributes.name,
      role: attributes.role,
      active: attributes.active,
    }),
  });
}

export type AppLucia = ReturnType<typeof createLucia>;

const instances = new WeakMap<Db, AppLucia>();

export function luciaFor(db: Db): AppLucia {
  let lucia = instances.get(db);
  if (!lucia) {
    lucia = createLucia(db);
    instances.set(db, lucia);
  }
  return lucia;
}

const caches = new WeakMap<Db, SessionCache>();

/** The validated-session cache of this database (lib/auth/session-cache.ts); one per Db, like Lucia. */
export function sessionCacheFor(db: Db): SessionCache {
  let cache = caches.get(db);
  if (!cache) {
    cache = new SessionCache(SESSION_LIFETIME.milliseconds());
    caches.set(db, cache);
  }
  return cache;
}

declare module "lucia" {
  interface Register {
    Lucia: AppLucia;
    UserId: string;
    DatabaseUserAttributes: { email: string; name: string; role: Role; active: boolean };
  }
}
