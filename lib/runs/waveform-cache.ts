/**
 * Decoded waveforms of recent runs, kept in memory: a stored run never changes, and inflating a
 * 10-minute run (~18 MB of typed arrays) costs tens of ms — more than a zoom request may take.
 * Least-recently-used eviction under a byte budget. Authorization is not cached: callers check access
 * (db/queries/runs.ts findVisibleRun) before every read.
 */
import "server-only";
import type { Waveforms } from "@/lib/sim/types";

const DEFAULT_BUDGET_BYTES = 256 * 1024 * 1024;

function sizeOf(w: Waveforms): number {
  return Object.values(w).reduce((sum: number, a: ArrayBufferView) => sum + a.byteLength, 0);
}

export class WaveformCache {
  private readonly entries = new Map<string, { waveforms: Waveforms; bytes: number }>();
  private total = 0;

  constructor(private readonly budgetBytes = DEFAULT_BUDGET_BYTES) {}

  get(runId: string): Waveforms | undefined {
    const e = this.entries.get(runId);
    if (!e) return undefined;
    this.entries.delete(runId);
    this.entries.set(runId, e);
    return e.waveforms;
  }

  set(runId: string, waveforms: Waveforms): void {
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
