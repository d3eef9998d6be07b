/**
 * A few seconds' memory of validated sessions, so a signed-in request does not queue behind a PGlite
 * query just to learn what it learnt a moment ago.
 *
 * Why: PGlite is single-threaded WASM in this process; Lucia's validateSession is one query (≈1 ms of
 * main-thread work) on every request, which under 50 concurrent readers of a run page was most of each
 * request's cost (issue 5 §7). What it costs: nothing within this process — every place here that ends a
 * session or changes an account (sign-out, deactivation, role change; lib/auth/session.ts, db/users.ts)
 * drops the entries at once. A change made by another process on a shared PostgreSQL shows up to TTL_MS
 * late.
 *
 * An entry is never served past the session's expiry, nor past the point where Lucia would slide the
 * expiry forward (half the session's lifetime left): from then on validation goes back to Lucia, which
 * extends the session and marks it `fresh` so the refreshed cookie is sent. A cached hit is never fresh.
 */
import "server-only";
import type { Session } from "lucia";
import type { SessionUser } from "./types";

const TTL_MS = 5_000;
const MAX_ENTRIES = 10_000;

export interface CachedSession {
  session: Session;
  user: SessionUser;
}

interface Entry extends CachedSession {
  until: number;
}

export class SessionCache {
  private readonly entries = new Map<string, Entry>();
  /**
   * Bumped on every invalidation. A validation that started before one may have read the old row, so
   * its result is not stored (see `set`).
   */
  private epoch = 0;

  constructor(
    /** Lucia's session lifetime: the expiry slides once less than half of it is left. */
    private readonly sessionLifetimeMs: number,
    private readonly ttlMs = TTL_MS,
    private readonly maxEntries = MAX_ENTRIES,
  ) {}

  get size(): number {
    return this.entries.size;
  }

  /** Take before validating against the database; hand to `set` with the result. */
  get generation(): number {
    return this.epoch;
  }

  get(sessionId: string, now = Date.now()): CachedSession | undefined {
    const e = this.entries.get(sessionId);
    if (!e) return undefined;
    if (now >= e.until) {
      this.entries.delete(sessionId);
      return undefined;
    }
    // Copies: a handler that mutates its context must not rewrite the cache.
    return { session: { ...e.session }, user: { ...e.user } };
  }

  /**
   * Remember a session Lucia has just validated (of an active user). Ignored when anything was
   * invalidated since `generation` was taken, or when the session is already due for a refresh.
   */
  set(session: Session, user: SessionUser, generation: number, now = Date.now()): void {
    if (generation !== this.epoch) return;
    const expires = session.expiresAt.getTime();
    const slidesAt = expires - this.sessionLifetimeMs / 2;
    const until = Math.min(now + this.ttlMs, expires, slidesAt);
    if (until <= now) return;
    this.entries.delete(session.id);
    // A stored copy is not fresh: the refreshed cookie goes out with the response that refreshed it.
    this.entries.set(session.id, { session: { ...session, fresh: false }, user: { ...user }, until });
    while (this.entries.size > this.maxEntries) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
  }

  /** One session ended (sign-out, or found to belong to a deactivated user). */
  invalidateSession(sessionId: string): void {
    this.epoch++;
    this.entries.delete(sessionId);
  }

  /** Every session of this user (role change, deactivation, anything else that changes the account). */
  invalidateUser(userId: string): void {
    this.epoch++;
    for (const [id, e] of this.entries) if (e.user.id === userId) this.entries.delete(id);
  }

  clear(): void {
    this.epoch++;
    this.entries.clear();
  }
}
