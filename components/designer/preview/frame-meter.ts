/**
 * Smoothness figures for the preview, measured, not assumed: frames per second of the loop, scans
 * per second simulated, and the engine's share of each frame (how much headroom is left).
 * Averages over a sliding window of about a second.
 */
export interface FrameStats {
  fps: number;
  scansPerS: number;
  /** Mean wall time spent inside the engine per frame, ms. */
  engineMsPerFrame: number;
  /** Simulated seconds per wall second actually achieved. */
  realtimeFactor: number;
}

interface Sample {
  at: number;
  scans: number;
  engineMs: number;
  simS: number;
}

export class FrameMeter {
  private samples: Sample[] = [];
  constructor(private readonly windowMs = 1000) {}

  record(at: number, scans: number, engineMs: number, simS: number): void {
    this.samples.push({ at, scans, engineMs, simS });
    const cutoff = at - this.windowMs;
    while (this.samples.length > 2 && this.samples[0].at < cutoff) this.samples.shift();
  }

  stats(): FrameStats | null {
    const s = this.samples;
    if (s.length < 2) return null;
    const spanS = (s[s.length - 1].at - s[0].at) / 1000;
    if (spanS <= 0) return null;
    // The first sample opens the window; count what happened after it.
    let scans = 0;
    let engine = 0;
    let sim = 0;
    for (let i = 1; i < s.length; i++) {
      scans += s[i].scans;
      engine += s[i].engineMs;
      sim += s[i].simS;
    }
    const frames = s.length - 1;
    return { fps: frames / spanS, scansPerS: scans / spanS, engineMsPerFrame: engine / frames, realtimeFactor: sim / spanS };
  }

  reset(): void {
    this.samples = [];
  }
}
