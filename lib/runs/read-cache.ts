/**
 * A two-second memory of "this user may read this finished run, and here is its row", for the read
 * endpoints (run summary, waveform window, CSV) that a run page and its zooming hit over and over.
 *
 * Why: on PGlite every query costs about a millisecond, and the session check already takes one. Without
 * this, 50 concurrent readers of one run queue behind two queries each. What it costs: a membership
 * removal or a case rename shows on these reads up to TTL_MS late. Only finished runs (immutable) are
 * kept; starting and cancelling runs always check access in SQL.
 */
import "server-only";
import type { RunRecord } from "@/db/queries/runs";

const TTL_MS = 2_000;
const MAX_ENTRIES = 5_000;

interface Entry {
  record: RunRecord;
  expires: number;
}

export class RunReadCache {
  private readonly entries = new Map<string, Entry>();

  constructor(private readonly ttlMs = TTL_MS) {}

  private static key(userId: string, role: string, runId: string): string {
    return `${userId}\u0000${role}\u0000${runId}`;
  }

  get(userId: string, role: string, runId: string, now = Date.now()): RunRecord | undefined {
    const key = RunReadCache.key(userId, role, runId);
    const e = this.entries.get(key);
    if (!e) return undefined;
    if (e.expires <= now) {
      this.entries.delete(key);
      return undefined;
    }
    return e.record;
  }

  set(userId: string, role: string, record: RunRecord, now = Date.now()): void {
    if (record.status !== "done" && record.status !== "failed" && record.status !== "cancelled") return;
    const key = RunReadCache.key(userId, role, record.id);
    this.entries.delete(key);
    this.entries.set(key, { record, expires: now + this.ttlMs });
    while (this.entries.size > MAX_ENTRIES) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
  }

  clear(): void {
    this.entries.clear();
  }
}

const KEY = Symbol.for("tidewright.run-read-cache");
export function runReadCache(): RunReadCache {
  const g = globalThis as unknown as Record<symbol, RunReadCache | undefined>;
  g[KEY] ??= new RunReadCache();
  return g[KEY];
}
