/**
 * Waveforms → compressed bytes. Used inside the simulation worker (plain Node, no React server
 * condition), hence no `server-only` here; decoding lives in ./codec.ts, which is server-only.
 */
import { deflateSync, constants } from "node:zlib";
import type { Waveforms } from "@/lib/sim/types";
import { buildSignalIndex, INDEX_BLOCK, type SignalIndex } from "./downsample";
import {
  FLAG_SHUFFLED,
  HEADER_BYTES,
  OVERVIEW_SIGNALS,
  WAVEFORM_FIELDS,
  chunkCount,
  gridTime,
  packBody,
  sampleCount,
  shuffleInto,
  writeHeader,
  writeHeaderV2,
  type TimeGrid,
  type WaveformHeaderV2,
} from "./format";

export interface EncodeOptions {
  /** zlib level 0–9; 1 is several times faster than 6 and, on shuffled traces, nearly as small. */
  level?: number;
  shuffle?: boolean;
  /**
   * The engine's sample clock. When it reproduces every t exactly, t is not stored (4.8 MB of a
   * 10-minute run, and its inflate on every cold read); otherwise t is stored as is.
   */
  timeGrid?: { dtS: number; scanS: number; sampleEvery?: number };
  /** Samples per independently inflatable chunk (default 10 000: 10 s at 1 kHz). */
  chunk?: number;
}

/**
 * Default chunk: 60 s at 1 kHz. Steady breathing repeats every few seconds and deflate's 32 KB window
 * finds those repeats, but each chunk pays for its first breath in full: 10 s chunks made a 10-minute
 * run 2.4 MB against 0.87 MB at 60 s, and the larger blob costs more to read than the inflate it saves.
 */
export const DEFAULT_CHUNK = 60_000;

/**
 * Overview section of one signal: min f32[B] · max f32[B] (byte-shuffled when `shuffle`), then the
 * positions of the min and the max as u16 offsets within their block (block ≤ 65 536).
 */
function packOverview(index: SignalIndex, shuffle: boolean): Uint8Array {
  const blocks = index.min.length;
  const body = new Uint8Array(blocks * 12);
  const place = (src: Uint8Array, size: number, at: number) => (shuffle ? shuffleInto(src, size, body, at) : body.set(src, at));
  place(bytesOf(index.min), 4, 0);
  place(bytesOf(index.max), 4, blocks * 4);
  const offsets = new Uint16Array(blocks * 2);
  for (let b = 0; b < blocks; b++) {
    offsets[b] = index.iMin[b] - b * index.block;
    offsets[blocks + b] = index.iMax[b] - b * index.block;
  }
  body.set(bytesOf(offsets), blocks * 8);
  return body;
}

/** The grid, if it gives every stored t bit for bit (the decoder recomputes t from it). */
export function matchTimeGrid(t: Float64Array, hint: EncodeOptions["timeGrid"]): TimeGrid | null {
  if (!hint || !(hint.dtS > 0) || !(hint.scanS > 0)) return null;
  const stepsPerScan = Math.round(hint.scanS / hint.dtS);
  const sampleEvery = Math.max(1, Math.floor(hint.sampleEvery ?? 1));
  if (stepsPerScan < 1) return null;
  const grid: TimeGrid = { dtS: hint.dtS, scanS: hint.scanS, stepsPerScan, sampleEvery };
  for (let k = 0; k < t.length; k++) {
    // Object.is: the same bits for every finite value the engine writes (and tells -0 from 0).
    if (!Object.is(gridTime(grid, k), t[k])) return null;
  }
  return grid;
}

function bytesOf(a: ArrayBufferView): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

/** Layout version 2 (lib/waveform/format.ts): chunked arrays, min–max overview, t from the time grid. */
export function encodeWaveforms(w: Waveforms, options: EncodeOptions = {}): Uint8Array {
  const shuffle = options.shuffle ?? true;
  const level = options.level ?? 1;
  const n = sampleCount(w);
  const chunk = Math.max(1, Math.floor(options.chunk ?? DEFAULT_CHUNK));
  const header: WaveformHeaderV2 = { n, shuffled: shuffle, chunk, block: INDEX_BLOCK, grid: matchTimeGrid(w.t, options.timeGrid) };
  const deflate = (b: Uint8Array) => deflateSync(b, { level, strategy: constants.Z_DEFAULT_STRATEGY });
  const parts: Uint8Array[] = [];
  for (const f of WAVEFORM_FIELDS) {
    const all = bytesOf(w[f.key]);
    for (let c = 0; c < chunkCount(header, f.key); c++) {
      const raw = all.subarray(c * chunk * f.bytes, Math.min(n, (c + 1) * chunk) * f.bytes);
      let body = raw;
      if (shuffle) {
        body = new Uint8Array(raw.length);
        shuffleInto(raw, f.bytes, body, 0);
      }
      parts.push(deflate(body));
    }
  }
  for (const s of OVERVIEW_SIGNALS) parts.push(deflate(packOverview(buildSignalIndex(w[s], header.block), shuffle)));
  const head = writeHeaderV2(header);
  const table = new Uint8Array(parts.length * 4);
  const view = new DataView(table.buffer);
  parts.forEach((p, i) => view.setUint32(i * 4, p.length, true));
  const total = head.length + table.length + parts.reduce((sum, p) => sum + p.length, 0);
  const out = new Uint8Array(total);
  out.set(head, 0);
  out.set(table, head.length);
  let offset = head.length + table.length;
  for (const p of parts) {
    out.set(p, offset);
    offset += p.length;
  }
  return out;
}

/** Layout version 1 (one deflate stream of every array). Kept for tests that check v1 blobs still read. */
export function encodeWaveformsV1(w: Waveforms, options: EncodeOptions = {}): Uint8Array {
  const shuffle = options.shuffle ?? true;
  const n = sampleCount(w);
  const body = packBody(w, shuffle);
  const compressed = deflateSync(body, { level: options.level ?? 1, strategy: constants.Z_DEFAULT_STRATEGY });
  const out = new Uint8Array(HEADER_BYTES + compressed.length);
  out.set(writeHeader(n, body.length, shuffle ? FLAG_SHUFFLED : 0), 0);
  out.set(compressed, HEADER_BYTES);
  return out;
}
