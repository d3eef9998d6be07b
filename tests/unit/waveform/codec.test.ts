import { describe, expect, it } from "vitest";
import { decodeWaveforms, encodeWaveforms, waveformSampleCount, WaveformFormatError } from "@/lib/waveform/codec";
import { BYTES_PER_SAMPLE, WAVEFORM_FIELDS } from "@/lib/waveform/format";
import type { Waveforms } from "@/lib/sim/types";
import { syntheticWaveforms } from "./fixtures";

function bytes(a: ArrayBufferView): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

function expectBitExact(a: Waveforms, b: Waveforms) {
  for (const f of WAVEFORM_FIELDS) {
    expect(b[f.key].constructor).toBe(a[f.key].constructor);
    expect(b[f.key].length).toBe(a[f.key].length);
    expect(Buffer.from(bytes(b[f.key])).equals(Buffer.from(bytes(a[f.key])))).toBe(true);
  }
}

describe("waveform codec", () => {
  it("round-trips a 60 s trace bit-exact (shuffled, default)", () => {
    const { w } = syntheticWaveforms(60);
    const blob = encodeWaveforms(w);
    expectBitExact(w, decodeWaveforms(blob));
    expect(waveformSampleCount(blob)).toBe(w.t.length);
    // Compact: well under the raw size of the typed arrays.
    expect(blob.length).toBeLessThan((w.t.length * BYTES_PER_SAMPLE) / 2);
  });

  it("round-trips bit-exact without the byte shuffle and at other levels", () => {
    const { w } = syntheticWaveforms(5);
    expectBitExact(w, decodeWaveforms(encodeWaveforms(w, { shuffle: false, level: 6 })));
    expectBitExact(w, decodeWaveforms(encodeWaveforms(w, { level: 0 })));
  });

  it("keeps NaN payloads, infinities, negative zero and denormals bit-exact", () => {
    const n = 8;
    const w: Waveforms = {
      t: new Float64Array([0, 1e-300, -0, Number.MAX_VALUE, Number.MIN_VALUE, 5, 6, 7]),
      paw: new Float32Array(n),
      flow: new Float32Array([Infinity, -Infinity, -0, 1.4e-45, 3.4e38, 1, 2, 3]),
      volume: new Float32Array(n),
      pmus: new Float32Array(n),
      arm: new Float32Array(n),
      step: new Uint16Array([0, 1, 65535, 3, 4, 5, 6, 7]),
    };
    // Two different NaN bit patterns (quiet NaN with payloads).
    new Uint32Array(w.paw.buffer)[0] = 0x7fc00001;
    new Uint32Array(w.paw.buffer)[1] = 0xffc12345;
    expectBitExact(w, decodeWaveforms(encodeWaveforms(w)));
  });

  it("round-trips views into a larger buffer and an empty trace", () => {
    const { w } = syntheticWaveforms(1);
    const sub: Waveforms = {
      t: w.t.subarray(10, 20),
      paw: w.paw.subarray(10, 20),
      flow: w.flow.subarray(10, 20),
      volume: w.volume.subarray(10, 20),
      pmus: w.pmus.subarray(10, 20),
      arm: w.arm.subarray(10, 20),
      step: w.step.subarray(10, 20),
    };
    expectBitExact(sub, decodeWaveforms(encodeWaveforms(sub)));
    const empty = syntheticWaveforms(0).w;
    const e = { ...empty, t: empty.t.subarray(0, 0), paw: empty.paw.subarray(0, 0), flow: empty.flow.subarray(0, 0), volume: empty.volume.subarray(0, 0), pmus: empty.pmus.subarray(0, 0), arm: empty.arm.subarray(0, 0), step: empty.step.subarray(0, 0) };
    expect(decodeWaveforms(encodeWaveforms(e)).t.length).toBe(0);
  });

  it("rejects arrays of different lengths, foreign and corrupt blobs", () => {
    const { w } = syntheticWaveforms(1);
    expect(() => encodeWaveforms({ ...w, paw: w.paw.subarray(1) })).toThrow(WaveformFormatError);
    expect(() => decodeWaveforms(new Uint8Array([1, 2, 3]))).toThrow(WaveformFormatError);
    expect(() => decodeWaveforms(new Uint8Array(32))).toThrow(WaveformFormatError);
    const blob = encodeWaveforms(w);
    const corrupt = blob.slice();
    corrupt.fill(0xff, 20, 60);
    expect(() => decodeWaveforms(corrupt)).toThrow(WaveformFormatError);
    const truncated = blob.subarray(0, blob.length - 10);
    expect(() => decodeWaveforms(truncated)).toThrow(WaveformFormatError);
  });
});
