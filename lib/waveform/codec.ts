/**
 * Stored waveform codec: encode (re-exported from ./encode) and decode. Server-only: the browser gets
 * windows and CSV from the API, never the blob.
 */
import "server-only";
import { inflateSync } from "node:zlib";
import type { Waveforms } from "@/lib/sim/types";
import { HEADER_BYTES, WaveformFormatError, readHeader, unpackBody } from "./format";

export { encodeWaveforms, type EncodeOptions } from "./encode";
export { WaveformFormatError } from "./format";

export function decodeWaveforms(bytes: Uint8Array): Waveforms {
  const header = readHeader(bytes);
  let body: Uint8Array;
  try {
    body = inflateSync(bytes.subarray(HEADER_BYTES), { maxOutputLength: Math.max(header.bodyLength, 1) });
  } catch (cause) {
    throw new WaveformFormatError(`waveform body does not inflate: ${(cause as Error).message}`);
  }
  return unpackBody(body, header.n, header.shuffled);
}

/** Sample count without inflating the body. */
export function waveformSampleCount(bytes: Uint8Array): number {
  return readHeader(bytes).n;
}
