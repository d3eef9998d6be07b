/**
 * Decoded waveforms of recent runs, kept in memory: a stored run never changes, and inflating a
 * 10-minute run (~18 MB of typed arrays) costs tens of ms — more than a zoom request may take. A v2
 * blob is kept as a StoredWaveforms, which inflates chunks as windows read them and keeps them.
 * Least-recently-used eviction under a byte budget. Authorization is not cached: callers check access
 * (db/queries/runs.ts findVisibleRun) before every read.
 */
import "server-only";
import type { Waveforms } from "@/lib/sim/types";
import { StoredWaveforms } from "@/lib/waveform/codec";

const DEFAULT_BUDGET_BYTES = 256 * 1024 * 1024;

/** Decoded arrays (a run just finished, or a v1 blob), or a v2 blob decoded on demand. */
export type CachedWaveforms = Waveforms | StoredWaveforms;

function sizeOf(w: CachedWaveforms): number {
  // A stored run counts as fully decoded: it may become so (CSV), and the budget must hold then too.
  if (w instanceof StoredWaveforms) return w.byteSize;
  return Object.values(w).reduce((sum: number, a: ArrayBufferView) => sum + a.byteLength, 0);
}

export class WaveformCache {
  private readonly entries = new Map<string, { waveforms: CachedWaveforms; bytes: number }>();
  private total = 0;

  constructor(private readonly budgetBytes = DEFAULT_BUDGET_BYTES) {}

  get(runId: string): CachedWaveforms | undefined {
    const e = this.entries.get(runId);
    if (!e) return undefined;
    this.entries.delete(runId);
    this.entries.set(runId, e);
    return e.waveforms;
  }

  set(runId: string, waveforms: CachedWaveforms): void {
    const bytes = sizeOf(waveforms);
    if (bytes > this.budgetBytes) return;
    this.delete(runId);
    this.entries.set(runId, { waveforms, bytes });
    this.total += bytes;
    for (const [id, e] of this.entries) {
      if (this.total <= this.budgetBytes) break;
      this.entries.delete(id);
      this.total -= e.bytes;
    }
  }

  delete(runId: string): void {
    const e = this.entries.get(runId);
    if (!e) return;
    this.entries.delete(runId);
    this.total -= e.bytes;
  }

  get bytes(): number {
    return this.total;
  }
}

const KEY = Symbol.for("tidewright.waveform-cache");
export function waveformCache(): WaveformCache {
  const g = globalThis as unknown as Record<symbol, WaveformCache | undefined>;
  g[KEY] ??= new WaveformCache();
  return g[KEY];
}
