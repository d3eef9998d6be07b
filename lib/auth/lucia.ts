import "server-only";
import { Lucia } from "lucia";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import type { Db } from "@/db";
import { sessions, users } from "@/db/schema";
import type { Role } from "./roles";

/**
 * Lucia v3 is no longer developed (STACK.md): it stays behind lib/auth so it can be replaced.
 * One Lucia per database instance (tests swap the database per file).
 */
export const SESSION_COOKIE = "tidewright_session";

function createLucia(db: Db) {
  return new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
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

declare module "lucia" {
  interface Register {
    Lucia: AppLucia;
    UserId: string;
    DatabaseUserAttributes: { email: string; name: string; role: Role; active: boolean };
  }
}
