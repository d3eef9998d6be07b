/**
 * The JSON text of recently served waveform windows, least recently used out past a byte budget.
 *
 * Why: under load a window request was ~70% JSON serialisation of its number arrays and ~25% min–max
 * bucketing; a run page, its refetches and several viewers of one run ask for the same windows. A
 * finished run's waveforms never change, so a window of it is a pure function of the run and the query.
 * Each entry remembers the decoded waveforms it was made from and is only served while those are still
 * the ones in the waveform cache (lib/runs/waveform-cache.ts): dropping or reloading a run's waveforms
 * drops its windows too. The text is shared between callers; access is not cached here — the caller
 * decides it (lib/runs/service.ts readableRun) before every lookup.
 */
import "server-only";
import type { WindowRequest } from "@/lib/waveform/downsample";

const DEFAULT_BUDGET_BYTES = 32 * 1024 * 1024;

interface Entry {
  /** Token of the decoded waveforms it was made from (not the object: that would pin evicted runs). */
  source: number;
  json: string;
}

const tokens = new WeakMap<object, number>();
let nextToken = 1;
function tokenOf(w: object): number {
  let t = tokens.get(w);
  if (t === undefined) {
    t = nextToken++;
    tokens.set(w, t);
  }
  return t;
}

export class WindowJsonCache {
  private readonly entries = new Map<string, Entry>();
  private total = 0;

  constructor(private readonly budgetBytes = DEFAULT_BUDGET_BYTES) {}

  static key(runId: string, query: WindowRequest): string {
    return [runId, query.from ?? "", query.to ?? "", query.points, query.signals.join(",")].join("\u0000");
  }

  get(key: string, source: object): string | undefined {
    const e = this.entries.get(key);
    if (!e) return undefined;
    this.delete(key);
    if (e.source !== tokenOf(source)) return undefined;
    this.entries.set(key, e);
    this.total += e.json.length;
    return e.json;
  }

  set(key: string, source: object, json: string): void {
    // JSON of numbers is ASCII: V8 keeps it one byte per character.
    if (json.length > this.budgetBytes) return;
    this.delete(key);
    this.entries.set(key, { source: tokenOf(source), json });
    this.total += json.length;
    for (const [k, e] of this.entries) {
      if (this.total <= this.budgetBytes) break;
      this.entries.delete(k);
      this.total -= e.json.length;
    }
  }

  delete(key: string): void {
    const e = this.entries.get(key);
    if (!e) return;
    this.entries.delete(key);
    this.total -= e.json.length;
  }

  get bytes(): number {
    return this.total;
  }
}

const KEY = Symbol.for("tidewright.window-json-cache");
export function windowJsonCache(): WindowJsonCache {
  const g = globalThis as unknown as Record<symbol, WindowJsonCache | undefined>;
  g[KEY] ??= new WindowJsonCache();
  return g[KEY];
}
