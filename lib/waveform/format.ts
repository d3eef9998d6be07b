/**
 * Binary layout of stored waveforms (the `runs.waveform` bytea column). Pure: no Node APIs, so the
 * worker, the server and the tests share it.
 *
 *   header (16 bytes, little-endian, uncompressed)
 *     0  "TWW1"  magic
 *     4  u8      layout version (1)
 *     5  u8      flags (bit 0: byte-shuffled)
 *     6  u16     reserved (0)
 *     8  u32     sample count n
 *    12  u32     uncompressed body length in bytes
 *   body (zlib/deflate stream) = t f64[n] · paw f32[n] · flow f32[n] · volume f32[n] · pmus f32[n] · arm f32[n] · step u16[n]
 *
 * Byte shuffle (as in Blosc/HDF5): byte k of every element of one array is stored together. Floats of
 * a smooth trace share sign/exponent bytes, so deflate finds long runs; the transform is a permutation,
 * which keeps the round trip bit-exact.
 */
import type { Waveforms } from "@/lib/sim/types";

export const WAVEFORM_MAGIC = 0x31575754; // "TWW1" read as a little-endian u32
export const WAVEFORM_LAYOUT_VERSION = 1;
export const HEADER_BYTES = 16;
export const FLAG_SHUFFLED = 1;

/** Array order and element sizes in the body. */
export const WAVEFORM_FIELDS = [
  { key: "t", bytes: 8 },
  { key: "paw", bytes: 4 },
  { key: "flow", bytes: 4 },
  { key: "volume", bytes: 4 },
  { key: "pmus", bytes: 4 },
  { key: "arm", bytes: 4 },
  { key: "step", bytes: 2 },
] as const satisfies ReadonlyArray<{ key: keyof Waveforms; bytes: number }>;

export const BYTES_PER_SAMPLE = WAVEFORM_FIELDS.reduce((sum, f) => sum + f.bytes, 0);

export class WaveformFormatError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "WaveformFormatError";
  }
}

/** Every array must have the same length n. */
export function sampleCount(w: Waveforms): number {
  const n = w.t.length;
  for (const f of WAVEFORM_FIELDS) {
    if (w[f.key].length !== n) {
      throw new WaveformFormatError(`waveform arrays differ in length (${f.key}: ${w[f.key].length}, t: ${n})`);
    }
  }
  return n;
}

function bytesOf(a: ArrayBufferView): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

/** Byte-shuffle `src` (elements of `size` bytes) into `dst` at `offset`. */
export function shuffleInto(src: Uint8Array, size: number, dst: Uint8Array, offset: number): void {
  const n = src.length / size;
  for (let b = 0; b < size; b++) {
    let o = offset + b * n;
    for (let i = b; i < src.length; i += size) dst[o++] = src[i];
  }
}

/** Inverse of shuffleInto: `src` holds n·size shuffled bytes starting at `offset`. */
export function unshuffleFrom(src: Uint8Array, offset: number, size: number, dst: Uint8Array): void {
  const n = dst.length / size;
  for (let b = 0; b < size; b++) {
    let o = offset + b * n;
    for (let i = b; i < dst.length; i += size) dst[i] = src[o++];
  }
}

/** Body bytes (before compression) for `w`, shuffled or plain. */
export function packBody(w: Waveforms, shuffle: boolean): Uint8Array {
  const n = sampleCount(w);
  const body = new Uint8Array(n * BYTES_PER_SAMPLE);
  let offset = 0;
  for (const f of WAVEFORM_FIELDS) {
    const src = bytesOf(w[f.key]);
    if (shuffle) shuffleInto(src, f.bytes, body, offset);
    else body.set(src, offset);
    offset += src.length;
  }
  return body;
}

/** Arrays from body bytes; always copies into fresh, aligned buffers the caller owns. */
export function unpackBody(body: Uint8Array, n: number, shuffled: boolean): Waveforms {
  if (body.length !== n * BYTES_PER_SAMPLE) {
    throw new WaveformFormatError(`waveform body is ${body.length} bytes, expected ${n * BYTES_PER_SAMPLE}`);
  }
  const t = new Float64Array(n);
  const paw = new Float32Array(n);
  const flow = new Float32Array(n);
  const volume = new Float32Array(n);
  const pmus = new Float32Array(n);
  const arm = new Float32Array(n);
  const step = new Uint16Array(n);
  const out: Waveforms = { t, paw, flow, volume, pmus, arm, step };
  let offset = 0;
  for (const f of WAVEFORM_FIELDS) {
    const dst = bytesOf(out[f.key]);
    if (shuffled) unshuffleFrom(body, offset, f.bytes, dst);
    else dst.set(body.subarray(offset, offset + dst.length));
    offset += dst.length;
  }
  return out;
}

export function writeHeader(n: number, bodyLength: number, flags: number): Uint8Array {
  const header = new Uint8Array(HEADER_BYTES);
  const view = new DataView(header.buffer);
  view.setUint32(0, WAVEFORM_MAGIC, true);
  view.setUint8(4, WAVEFORM_LAYOUT_VERSION);
  view.setUint8(5, flags);
  view.setUint16(6, 0, true);
  view.setUint32(8, n, true);
  view.setUint32(12, bodyLength, true);
  return header;
}

export interface WaveformHeader {
  n: number;
  bodyLength: number;
  shuffled: boolean;
}

export function readHeader(bytes: Uint8Array): WaveformHeader {
  if (bytes.length < HEADER_BYTES) throw new WaveformFormatError("waveform blob is shorter than its header");
  const view = new DataView(bytes.buffer, bytes.byteOffset, HEADER_BYTES);
  if (view.getUint32(0, true) !== WAVEFORM_MAGIC) throw new WaveformFormatError("not a Tidewright waveform blob");
  const version = view.getUint8(4);
  if (version !== WAVEFORM_LAYOUT_VERSION) throw new WaveformFormatError(`unknown waveform layout version ${version}`);
  const flags = view.getUint8(5);
  const n = view.getUint32(8, true);
  const bodyLength = view.getUint32(12, true);
  if (bodyLength !== n * BYTES_PER_SAMPLE) throw new WaveformFormatError("waveform header is inconsistent");
  return { n, bodyLength, shuffled: (flags & FLAG_SHUFFLED) !== 0 };
}
