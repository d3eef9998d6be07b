import "server-only";
import { inArray, sql } from "drizzle-orm";
import type { Db } from "./index";
import { loginThrottle } from "./schema";

/**
 * Sign-in throttling, per account and per client address. Each key counts failures in a window;
 * passing the limit locks the key for LOCK_S seconds. Stored in the database so it survives restarts
 * and holds across processes on a shared PostgreSQL.
 */
export const THROTTLE = {
  windowS: 15 * 60,
  lockS: 15 * 60,
  /** Failures allowed per account (email) per window; the next attempt is refused. */
  accountLimit: 5,
  /** Failures allowed per client address per window (several people may share one address). */
  ipLimit: 20,
} as const;

export const accountKey = (email: string) => `email:${email.trim().toLowerCase()}`;
export const ipKey = (ip: string) => `ip:${ip}`;

/** Seconds until the longest lock among `keys` ends, or 0 when none is locked. */
export async function lockedForSeconds(db: Db, keys: string[], now = new Date()): Promise<number> {
  const rows = await db.select().from(loginThrottle).where(inArray(loginThrottle.key, keys));
  let seconds = 0;
  for (const row of rows) {
    if (row.lockedUntil && row.lockedUntil > now) {
      seconds = Math.max(seconds, (row.lockedUntil.getTime() - now.getTime()) / 1000);
    }
  }
  return seconds;
}

/** Count one failure against `key` (atomic upsert), locking it once `limit` is reached. */
export async function recordFailure(db: Db, key: string, limit: number, now = new Date()): Promise<void> {
  const windowStart = new Date(now.getTime() - THROTTLE.windowS * 1000);
  const lockUntil = new Date(now.getTime() + THROTTLE.lockS * 1000);
  const expired = sql`${loginThrottle.windowStart} < ${windowStart.toISOString()}::timestamptz`;
  const nextFailures = sql`case when ${expired} then 1 else ${loginThrottle.failures} + 1 end`;
  await db
    .insert(loginThrottle)
    .values({ key, failures: 1, windowStart: now, lockedUntil: limit <= 1 ? lockUntil : null })
    .onConflictDoUpdate({
      target: loginThrottle.key,
      set: {
        failures: nextFailures,
        windowStart: sql`case when ${expired} then ${now.toISOString()}::timestamptz else ${loginThrottle.windowStart} end`,
        lockedUntil: sql`case when ${nextFailures} >= ${limit} then ${lockUntil.toISOString()}::timestamptz else null end`,
      },
    });
}

export async function clearFailures(db: Db, key: string): Promise<void> {
  await db.delete(loginThrottle).where(inArray(loginThrottle.key, [key]));
}
