import { describe, expect, it } from "vitest";
import { buildSignalIndex, lowerBound, stepsInWindow, upperBound, waveformWindow, type MinMaxIndex } from "@/lib/waveform/downsample";
import { WAVEFORM_SIGNALS, type WaveformSignal } from "@/lib/validation/runs";
import type { Waveforms } from "@/lib/sim/types";
import { syntheticWaveforms } from "./fixtures";

function fullRange(w: Waveforms, s: WaveformSignal, from: number, to: number) {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < w.t.length; i++) {
    if (w.t[i] < from || w.t[i] > to) continue;
    min = Math.min(min, w[s][i]);
    max = Math.max(max, w[s][i]);
  }
  return { min, max };
}

describe("waveform window", () => {
  const { w, steps } = syntheticWaveforms(600); // a 10-minute run at 1 kHz: 600 001 samples

  it("keeps the true peak and trough of every signal in a window (compared with full resolution)", () => {
    for (const [from, to, points] of [
      [0, 600, 1000],
      [12.3456, 19.87, 200],
      [100, 101, 50],
      [0, 600, 2],
    ] as const) {
      const win = waveformWindow(w, steps, { from, to, points, signals: WAVEFORM_SIGNALS });
      expect(win.points).toBeLessThanOrEqual(points);
      expect(win.t.length).toBe(win.points);
      for (const s of WAVEFORM_SIGNALS) {
        const values = win.signals[s]!;
        expect(values.length).toBe(win.points);
        const truth = fullRange(w, s, from, to);
        expect(Math.max(...values)).toBe(truth.max);
        expect(Math.min(...values)).toBe(truth.min);
      }
    }
  });

  it("has ascending times inside the window and bucket values that come from the data", () => {
    const win = waveformWindow(w, steps, { from: 30, to: 90, points: 1500, signals: ["paw"] });
    expect(win.from).toBe(30);
    expect(win.to).toBe(90);
    for (let i = 1; i < win.t.length; i++) expect(win.t[i]).toBeGreaterThanOrEqual(win.t[i - 1]);
    expect(win.t[0]).toBeGreaterThanOrEqual(30);
    expect(win.t.at(-1)!).toBeLessThanOrEqual(90);
    const all = new Set(Array.from(w.paw));
    for (const v of win.signals.paw!) expect(all.has(v)).toBe(true);
    expect(win.signals.flow).toBeUndefined();
  });

  it("returns raw samples when the window holds fewer than `points`", () => {
    const win = waveformWindow(w, steps, { from: 1, to: 1.1, points: 500, signals: ["flow"] });
    const i0 = lowerBound(w.t, 1);
    const i1 = upperBound(w.t, 1.1);
    expect(win.points).toBe(i1 - i0);
    expect(win.t).toEqual(Array.from(w.t.subarray(i0, i1)));
    expect(win.signals.flow).toEqual(Array.from(w.flow.subarray(i0, i1)));
  });

  it("clamps the window to the run and clips the step intervals to it", () => {
    const win = waveformWindow(w, steps, { from: 590, to: 9999, points: 100, signals: ["paw"] });
    expect(win.to).toBe(600);
    expect(win.steps[0].from).toBe(590);
    expect(win.steps.every((s) => s.from >= 590 && s.to <= 600 && s.to >= s.from)).toBe(true);
    expect(stepsInWindow(steps, 1.5, 2)).toEqual([{ step: "exhale", from: 1.5, to: 2 }]);
  });

  it("gives exactly the same window through the block index as by the plain scan", () => {
    const index: MinMaxIndex = {};
    for (const s of WAVEFORM_SIGNALS) index[s] = buildSignalIndex(w[s]);
    let seed = 11;
    const rand = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    for (let k = 0; k < 40; k++) {
      const from = rand() * 600;
      const to = Math.min(600, from + rand() * 600);
      if (to <= from) continue;
      const points = 2 + Math.floor(rand() * 3000);
      const req = { from, to, points, signals: WAVEFORM_SIGNALS };
      expect(waveformWindow(w, steps, req, index)).toEqual(waveformWindow(w, steps, req));
    }
  });

  it("windows a 10-minute run quickly", () => {
    const started = performance.now();
    waveformWindow(w, steps, { from: 0, to: 600, points: 2000, signals: ["paw", "flow", "volume", "pmus"] });
    expect(performance.now() - started).toBeLessThan(200);
  });
});
