/**
 * Full-resolution CSV of a run's waveforms, streamed in chunks (a 10-minute run is 600 000 rows).
 * Header row names each column with its unit.
 */
import type { Waveforms } from "@/lib/sim/types";

export const CSV_COLUMNS = [
  "t (s)",
  "paw (cmH2O)",
  "flow (L/min)",
  "volume (mL)",
  "pmus (cmH2O)",
  "arm (deg)",
  "step",
] as const;

export const CSV_HEADER = CSV_COLUMNS.join(",");

/** Shortest decimal that reads back to the same float32 (7 significant digits, 9 when needed). */
export function formatFloat32(v: number): string {
  if (!Number.isFinite(v)) return Number.isNaN(v) ? "NaN" : v > 0 ? "Inf" : "-Inf";
  const short = Number(v.toPrecision(7));
  return String(Math.fround(short) === v ? short : Number(v.toPrecision(9)));
}

/** Time to the microsecond: steps are ≥ 0.1 ms, and summed steps carry float noise past that. */
export function formatTime(t: number): string {
  return String(Math.round(t * 1e6) / 1e6);
}

function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRow(w: Waveforms, stepNames: readonly string[], i: number): string {
  return [
    formatTime(w.t[i]),
    formatFloat32(w.paw[i]),
    formatFloat32(w.flow[i]),
    formatFloat32(w.volume[i]),
    formatFloat32(w.pmus[i]),
    formatFloat32(w.arm[i]),
    csvField(stepNames[w.step[i]] ?? String(w.step[i])),
  ].join(",");
}

/** Whole CSV as chunks of up to `rowsPerChunk` rows; the first chunk starts with the header. */
export function* csvChunks(w: Waveforms, stepNames: readonly string[], rowsPerChunk = 5000): Generator<string> {
  const n = w.t.length;
  yield `${CSV_HEADER}\n`;
  for (let start = 0; start < n; start += rowsPerChunk) {
    const end = Math.min(n, start + rowsPerChunk);
    const lines = new Array<string>(end - start);
    for (let i = start; i < end; i++) lines[i - start] = csvRow(w, stepNames, i);
    yield `${lines.join("\n")}\n`;
  }
}

/** A byte stream of the CSV that yields to the event loop between chunks. */
export function csvStream(w: Waveforms, stepNames: readonly string[]): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  const chunks = csvChunks(w, stepNames);
  return new ReadableStream<Uint8Array>({
    pull(controller) {
      const next = chunks.next();
      if (next.done) controller.close();
      else controller.enqueue(encoder.encode(next.value));
    },
  });
}
