/**
 * Waveforms → compressed bytes. Used inside the simulation worker (plain Node, no React server
 * condition), hence no `server-only` here; decoding lives in ./codec.ts, which is server-only.
 */
import { deflateSync, constants } from "node:zlib";
import type { Waveforms } from "@/lib/sim/types";
import { FLAG_SHUFFLED, HEADER_BYTES, packBody, sampleCount, writeHeader } from "./format";

export interface EncodeOptions {
  /** zlib level 0–9; 1 is several times faster than 6 and, on shuffled traces, nearly as small. */
  level?: number;
  shuffle?: boolean;
}

export function encodeWaveforms(w: Waveforms, options: EncodeOptions = {}): Uint8Array {
  const shuffle = options.shuffle ?? true;
  const n = sampleCount(w);
  const body = packBody(w, shuffle);
  const compressed = deflateSync(body, { level: options.level ?? 1, strategy: constants.Z_DEFAULT_STRATEGY });
  const out = new Uint8Array(HEADER_BYTES + compressed.length);
  out.set(writeHeader(n, body.length, shuffle ? FLAG_SHUFFLED : 0), 0);
  out.set(compressed, HEADER_BYTES);
  return out;
}
