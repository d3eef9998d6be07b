/**
 * Waveform layout v2 (lib/waveform/format.ts): bit-exact round trip, t from the engine's time grid,
 * v1 blobs still read, and windows served from the stored overview and chunks equal to the plain
 * min–max over full resolution for the same buckets.
 */
import { describe, expect, it } from "vitest";
import { decodeWaveforms, openWaveforms, StoredWaveforms, WaveformFormatError } from "@/lib/waveform/codec";
import { encodeWaveforms, encodeWaveformsV1, matchTimeGrid } from "@/lib/waveform/encode";
import { HEADER_V2_BYTES, WAVEFORM_FIELDS, gridTime } from "@/lib/waveform/format";
import { sourceWindow, waveformWindow, type WindowRequest } from "@/lib/waveform/downsample";
import { csvChunks } from "@/lib/waveform/csv";
import { simulate } from "@/lib/sim/simulate";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import type { Waveforms } from "@/lib/sim/types";
import { getTemplate } from "@/machines/templates";
import { SEED_CASES } from "@/db/seed-cases";
import { WAVEFORM_SIGNALS } from "@/lib/validation/runs";
import { syntheticWaveforms } from "./fixtures";

function bitExact(a: Waveforms, b: Waveforms): boolean {
  return WAVEFORM_FIELDS.every((f) => {
    const x = a[f.key];
    const y = b[f.key];
    return (
      x.constructor === y.constructor &&
      Buffer.from(x.buffer, x.byteOffset, x.byteLength).equals(Buffer.from(y.buffer, y.byteOffset, y.byteLength))
    );
  });
}

function slice(w: Waveforms, n: number): Waveforms {
  return {
    t: w.t.subarray(0, n),
    paw: w.paw.subarray(0, n),
    flow: w.flow.subarray(0, n),
    volume: w.volume.subarray(0, n),
    pmus: w.pmus.subarray(0, n),
    arm: w.arm.subarray(0, n),
    step: w.step.subarray(0, n),
  };
}

/** The window by definition, written out independently: equal-count buckets, plain scan, min/max in order. */
function plainWindow(w: Waveforms, req: Required<Pick<WindowRequest, "from" | "to" | "points">> & { signals: readonly (typeof WAVEFORM_SIGNALS)[number][] }) {
  const idx: number[] = [];
  for (let i = 0; i < w.t.length; i++) if (w.t[i] >= req.from && w.t[i] <= req.to) idx.push(i);
  const start = idx[0];
  const count = idx.length;
  const buckets = Math.floor(req.points / 2);
  const t: number[] = [];
  const signals: Record<string, number[]> = {};
  for (const s of req.signals) signals[s] = [];
  for (let b = 0; b < buckets; b++) {
    const i0 = start + Math.floor((b * count) / buckets);
    const i1 = start + Math.floor(((b + 1) * count) / buckets);
    t.push(w.t[i0], w.t[i1 - 1]);
    for (const s of req.signals) {
      let iMin = i0;
      let iMax = i0;
      for (let i = i0; i < i1; i++) {
        if (w[s][i] < w[s][iMin]) iMin = i;
        if (w[s][i] > w[s][iMax]) iMax = i;
      }
      signals[s].push(...(iMin <= iMax ? [w[s][iMin], w[s][iMax]] : [w[s][iMax], w[s][iMin]]));
    }
  }
  return { t, signals };
}

describe("waveform layout v2", () => {
  it("round-trips every array bit-exact, with t stored when it is not on the engine's grid", () => {
    const { w } = syntheticWaveforms(130); // t = i·dt from 0: not the engine's clock
    for (const options of [{}, { shuffle: false, level: 6 }, { chunk: 7777 }, { timeGrid: { dtS: 0.001, scanS: 0.01 } }]) {
      const blob = encodeWaveforms(w, options);
      const opened = openWaveforms(blob);
      expect(opened).toBeInstanceOf(StoredWaveforms);
      expect((opened as StoredWaveforms).timeOnGrid).toBe(false);
      expect(bitExact(w, decodeWaveforms(blob))).toBe(true);
    }
  });

  it("recomputes the engine's t bit for bit from its time grid instead of storing it", () => {
    const definition = getTemplate("pressure-control")!.definition;
    for (const rig of [DEFAULT_RIG, "ideal"] as const) {
      const r = simulate({ definition, patient: SEED_CASES[0].patient, rig, durationS: 20, seed: 2 });
      const scanS = rig === "ideal" ? 0.01 : DEFAULT_RIG.scanPeriodS;
      const hint = { dtS: 0.001, scanS };
      expect(matchTimeGrid(r.waveforms.t, hint)).not.toBeNull();
      const blob = encodeWaveforms(r.waveforms, { timeGrid: hint });
      const opened = openWaveforms(blob) as StoredWaveforms;
      expect(opened.timeOnGrid).toBe(true);
      const back = opened.full();
      expect(Buffer.from(back.t.buffer).equals(Buffer.from(r.waveforms.t.buffer, r.waveforms.t.byteOffset, r.waveforms.t.byteLength))).toBe(true);
      for (let i = 0; i < back.t.length; i += 997) expect(Object.is(opened.time(i), r.waveforms.t[i])).toBe(true);
      expect(bitExact(r.waveforms, back)).toBe(true);
      // A wrong hint is caught: t is then stored.
      expect(matchTimeGrid(r.waveforms.t, { dtS: 0.001, scanS: 0.005 })).toBeNull();
      expect((openWaveforms(encodeWaveforms(r.waveforms, { timeGrid: { dtS: 0.001, scanS: 0.005 } })) as StoredWaveforms).timeOnGrid).toBe(false);
    }
  });

  it("still decodes v1 blobs bit-exact", () => {
    const { w } = syntheticWaveforms(30);
    for (const options of [{}, { shuffle: false }]) {
      const v1 = encodeWaveformsV1(w, options);
      expect(v1[4]).toBe(1);
      const opened = openWaveforms(v1);
      expect(opened).not.toBeInstanceOf(StoredWaveforms);
      expect(bitExact(w, decodeWaveforms(v1))).toBe(true);
    }
  });

  it("serves windows from the overview and the chunks equal to the plain min–max over full resolution", () => {
    // 10 minutes at 1 kHz on the engine's clock (t_k = (k+1) ms as the engine computes it).
    const w = slice(syntheticWaveforms(600).w, 600_000);
    const grid = { dtS: 0.001, scanS: 0.01, stepsPerScan: 10, sampleEvery: 1 };
    for (let k = 0; k < w.t.length; k++) w.t[k] = gridTime(grid, k);
    const blob = encodeWaveforms(w, { timeGrid: grid });
    expect(new StoredWaveforms(blob).timeOnGrid).toBe(true);
    const signals = ["paw", "flow", "volume", "pmus"] as const;
    const tEnd = w.t[w.t.length - 1];

    // Whole run in 1000 buckets of 600 samples: every bucket is whole overview blocks, nothing inflates.
    const whole = new StoredWaveforms(blob);
    const req = { from: 0, to: tEnd, points: 2000, signals };
    const got = sourceWindow(whole, [], req);
    expect(whole.inflatedChunks).toBe(0);
    const truth = plainWindow(w, req);
    expect(got.t).toEqual(truth.t);
    for (const s of signals) expect(got.signals[s]).toEqual(truth.signals[s]);

    // Unaligned and narrow windows: overview blocks plus the chunks at bucket edges.
    for (const [from, to, points] of [
      [0, tEnd, 1999],
      [12.3456, 319.87, 777],
      [300, 306, 1500],
      [59.99, 60.02, 20],
      [100, 101, 50],
    ] as const) {
      const src = new StoredWaveforms(blob);
      const r = { from, to, points, signals };
      const win = sourceWindow(src, [], r);
      const plain = plainWindow(w, r);
      expect(win.t).toEqual(plain.t);
      for (const s of signals) expect(win.signals[s]).toEqual(plain.signals[s]);
      // And the same as the in-memory window over decoded arrays.
      expect(win).toEqual(waveformWindow(w, [], r));
      if (to - from < 10) expect(src.inflatedChunks).toBeLessThanOrEqual(2 * signals.length);
    }
  });

  it("returns raw samples of a short window from its chunks", () => {
    const { w } = syntheticWaveforms(200);
    const src = new StoredWaveforms(encodeWaveforms(w));
    const req = { from: 150, to: 150.2, points: 500, signals: WAVEFORM_SIGNALS };
    expect(sourceWindow(src, [], req)).toEqual(waveformWindow(w, [], req));
  });

  it("gives the same CSV as the arrays it was encoded from", () => {
    const { w, stepNames } = syntheticWaveforms(20);
    const csv = (x: Waveforms) => [...csvChunks(x, stepNames)].join("");
    expect(csv(decodeWaveforms(encodeWaveforms(w)))).toBe(csv(w));
  });

  it("rejects a corrupt chunk when a window reads it", () => {
    const { w } = syntheticWaveforms(130);
    const blob = encodeWaveforms(w).slice();
    const table = new DataView(blob.buffer, blob.byteOffset + HEADER_V2_BYTES);
    const dataStart = HEADER_V2_BYTES + 4 * (Math.ceil(w.t.length / 60_000) * 7 + WAVEFORM_SIGNALS.length);
    let offset = dataStart;
    for (let i = 0; i < 2 * Math.ceil(w.t.length / 60_000); i++) offset += table.getUint32(i * 4, true); // past the t and paw chunks
    blob.fill(0x55, offset + 2, offset + 40); // inside flow chunk 0
    const src = new StoredWaveforms(blob);
    expect(() => sourceWindow(src, [], { from: 0, to: 10, points: 100, signals: ["paw"] })).not.toThrow();
    expect(() => sourceWindow(src, [], { from: 0, to: 10, points: 100, signals: ["flow"] })).toThrow(WaveformFormatError);
  });
});
