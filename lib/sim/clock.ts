/**
 * The controller's simulated clock: XState's `after` timers run on it (passed as the actor's `clock`).
 *
 * Like xstate's SimulatedClock, but built for scan-by-scan control: time only moves when the controller
 * advances it to the next scan; a timer due within a hair of the scan time (floating-point sums of delays
 * such as 60/RR − tBreath) fires at that scan rather than one scan late; and the number of timers fired in
 * one advance is capped, so a zero-time loop between steps is reported instead of recursing forever.
 */
/** The clock interface XState's actor system uses (setTimeout/clearTimeout), declared here: xstate does not export it. */
export interface ActorClock {
  setTimeout(fn: (...args: unknown[]) => void, timeout: number): unknown;
  clearTimeout(id: unknown): void;
}

interface Timer {
  dueMs: number;
  fn: () => void;
}

/** Timers due within this many ms of the scan time fire at that scan. */
const DUE_TOLERANCE_MS = 1e-6;

export class ScanClock implements ActorClock {
  private nowMs = 0;
  private nextId = 1;
  private readonly timers = new Map<number, Timer>();
  /** Earliest due time of the pending timers (a lower bound after clears): most scans stop at this check. */
  private nextDueMs = Infinity;

  now(): number {
    return this.nowMs;
  }

  setTimeout(fn: (...args: unknown[]) => void, timeoutMs: number): number {
    const id = this.nextId++;
    const dueMs = this.nowMs + (timeoutMs > 0 ? timeoutMs : 0);
    this.timers.set(id, { dueMs, fn: fn as () => void });
    if (dueMs < this.nextDueMs) this.nextDueMs = dueMs;
    return id;
  }

  clearTimeout(id: unknown): void {
    this.timers.delete(id as number);
  }

  /** Pending timers (for tests and the designer's preview). */
  get pending(): number {
    return this.timers.size;
  }

  /**
   * Move to `ms` and fire every timer due by then, earliest first (timers set while firing included).
   * Returns false if more than `maxFirings` fired: the caller reports a zero-time loop.
   */
  advanceTo(ms: number, maxFirings: number): boolean {
    if (ms > this.nowMs) this.nowMs = ms;
    // Most scans fire nothing. This check is all of advanceTo that runs then, and it is kept small enough
    // for V8 to inline at the controller's call site (a call would also box `ms` in a heap number per scan).
    if (this.nowMs + DUE_TOLERANCE_MS < this.nextDueMs) return true;
    return this.fireDue(maxFirings);
  }

  private fireDue(maxFirings: number): boolean {
    let fired = 0;
    for (;;) {
      let bestId = 0;
      let best: Timer | null = null;
      for (const [id, t] of this.timers) {
        if (t.dueMs <= this.nowMs + DUE_TOLERANCE_MS && (best === null || t.dueMs < best.dueMs)) {
          best = t;
          bestId = id;
        }
      }
      if (best === null) {
        let next = Infinity;
        for (const t of this.timers.values()) if (t.dueMs < next) next = t.dueMs;
        this.nextDueMs = next;
        return true;
      }
      if (fired >= maxFirings) return false;
      this.timers.delete(bestId);
      fired++;
      best.fn();
    }
  }
}
