import { describe, expect, it } from "vitest";
import { CSV_HEADER, csvChunks, csvStream, formatFloat32 } from "@/lib/waveform/csv";
import { syntheticWaveforms } from "./fixtures";

describe("waveform CSV", () => {
  it("names every column with its unit in the header", () => {
    expect(CSV_HEADER).toBe("t (s),paw (cmH2O),flow (L/min),volume (mL),pmus (cmH2O),arm (deg),step");
  });

  it("writes one row per sample, values reading back to the stored float32", async () => {
    const { w, stepNames } = syntheticWaveforms(2);
    const text = await new Response(csvStream(w, stepNames)).text();
    const lines = text.trimEnd().split("\n");
    expect(lines[0]).toBe(CSV_HEADER);
    expect(lines.length).toBe(w.t.length + 1);
    for (const i of [0, 1, 500, 1500, w.t.length - 1]) {
      const cells = lines[i + 1].split(",");
      expect(Number(cells[0])).toBeCloseTo(w.t[i], 9);
      expect(Math.fround(Number(cells[1]))).toBe(w.paw[i]);
      expect(Math.fround(Number(cells[2]))).toBe(w.flow[i]);
      expect(Math.fround(Number(cells[3]))).toBe(w.volume[i]);
      expect(cells[6]).toBe(stepNames[w.step[i]]);
    }
  });

  it("formats float32 values shortly and exactly", () => {
    for (const v of [0, 0.1, 5.0999999, 123456.789, -3.3e-7, 1e30]) {
      const f = Math.fround(v);
      expect(Math.fround(Number(formatFloat32(f)))).toBe(f);
    }
    expect(formatFloat32(Math.fround(0.1))).toBe("0.1");
    expect(formatFloat32(5)).toBe("5");
  });

  it("chunks the rows", () => {
    const { w, stepNames } = syntheticWaveforms(1);
    const chunks = [...csvChunks(w, stepNames, 100)];
    expect(chunks.length).toBe(1 + Math.ceil(w.t.length / 100));
  });
});
