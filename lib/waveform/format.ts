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
 * Layout version 2 (what the encoder writes): each array stored as independently deflated chunks, so a
 * window inflates only the signals and the stretches it needs, plus a min–max overview per signal, so
 * windows whose buckets fall on overview blocks need no signal inflated at all:
 *
 *   header (48 bytes, little-endian, uncompressed)
 *     0  "TWW1"  magic
 *     4  u8      layout version (2)
 *     5  u8      flags (bit 0: byte-shuffled; bit 1: t is the engine's time grid, not stored)
 *     6  u16     reserved (0)
 *     8  u32     sample count n
 *    12  u32     samples per chunk
 *    16  u32     overview block (samples)
 *    20  u32     time grid: samples are taken every `sampleEvery` physics steps
 *    24  u32     time grid: physics steps per controller scan
 *    28  u32     reserved (0)
 *    32  f64     time grid: physics step dt (s)
 *    40  f64     time grid: scan period (s)
 *   chunk table: per array in WAVEFORM_FIELDS order, ⌈n/chunk⌉ u32 compressed lengths (none for t on
 *     the time grid); then per OVERVIEW_SIGNALS signal one u32 compressed length of its overview
 *   data: the chunks (each a zlib stream of one array's samples [k·chunk, (k+1)·chunk), shuffled per
 *     chunk), then the overviews (each a zlib stream of min f32[B] · max f32[B] (each shuffled) · the
 *     offsets within its block of the min u16[B] and of the max u16[B], B = ⌈n/block⌉), in table order.
 *
 * Time grid: the engine takes sample k at physics step g = k·sampleEvery + sampleEvery − 1 and stamps
 * it ⌊g/S⌋·scanS + (g mod S + 1)·dt (lib/sim/simulate.ts scan start + lib/sim/plant.ts step end). The
 * encoder writes the flag only when that formula reproduces every stored t bit for bit; otherwise t is
 * stored like the other arrays.
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
export const WAVEFORM_LAYOUT_V2 = 2;
export const HEADER_V2_BYTES = 48;
export const FLAG_TIME_GRID = 2;
/** Signals with a stored min–max overview: the ones a window can ask for. */
export const OVERVIEW_SIGNALS = ["paw", "flow", "volume", "pmus", "arm"] as const;

/** The engine's sample clock (see the v2 layout above). */
export interface TimeGrid {
  dtS: number;
  scanS: number;
  stepsPerScan: number;
  sampleEvery: number;
}

/** Time of sample k on the grid, computed exactly as the engine computes it. */
export function gridTime(grid: TimeGrid, k: number): number {
  const g = k * grid.sampleEvery + grid.sampleEvery - 1;
  const scan = Math.floor(g / grid.stepsPerScan);
  return scan * grid.scanS + ((g - scan * grid.stepsPerScan) + 1) * grid.dtS;
}

export interface WaveformHeaderV2 {
  n: number;
  shuffled: boolean;
  chunk: number;
  block: number;
  grid: TimeGrid | null;
}

export function layoutVersion(bytes: Uint8Array): number {
  if (bytes.length < HEADER_BYTES) throw new WaveformFormatError("waveform blob is shorter than its header");
  const view = new DataView(bytes.buffer, bytes.byteOffset, HEADER_BYTES);
  if (view.getUint32(0, true) !== WAVEFORM_MAGIC) throw new WaveformFormatError("not a Tidewright waveform blob");
  return view.getUint8(4);
}

export function writeHeaderV2(h: WaveformHeaderV2): Uint8Array {
  const header = new Uint8Array(HEADER_V2_BYTES);
  const view = new DataView(header.buffer);
  view.setUint32(0, WAVEFORM_MAGIC, true);
  view.setUint8(4, WAVEFORM_LAYOUT_V2);
  view.setUint8(5, (h.shuffled ? FLAG_SHUFFLED : 0) | (h.grid ? FLAG_TIME_GRID : 0));
  view.setUint32(8, h.n, true);
  view.setUint32(12, h.chunk, true);
  view.setUint32(16, h.block, true);
  view.setUint32(20, h.grid?.sampleEvery ?? 0, true);
  view.setUint32(24, h.grid?.stepsPerScan ?? 0, true);
  view.setFloat64(32, h.grid?.dtS ?? 0, true);
  view.setFloat64(40, h.grid?.scanS ?? 0, true);
  return header;
}

export function readHeaderV2(bytes: Uint8Array): WaveformHeaderV2 {
  if (bytes.length < HEADER_V2_BYTES) throw new WaveformFormatError("waveform blob is shorter than its header");
  const view = new DataView(bytes.buffer, bytes.byteOffset, HEADER_V2_BYTES);
  if (view.getUint32(0, true) !== WAVEFORM_MAGIC || view.getUint8(4) !== WAVEFORM_LAYOUT_V2) {
    throw new WaveformFormatError("not a version 2 Tidewright waveform blob");
  }
  const flags = view.getUint8(5);
  const n = view.getUint32(8, true);
  const chunk = view.getUint32(12, true);
  const block = view.getUint32(16, true);
  if (chunk < 1 || block < 1 || block > 65_536) throw new WaveformFormatError("waveform header is inconsistent");
  const grid: TimeGrid | null =
    (flags & FLAG_TIME_GRID) !== 0
      ? { sampleEvery: view.getUint32(20, true), stepsPerScan: view.getUint32(24, true), dtS: view.getFloat64(32, true), scanS: view.getFloat64(40, true) }
      : null;
  if (grid && (grid.sampleEvery < 1 || grid.stepsPerScan < 1)) throw new WaveformFormatError("waveform time grid is inconsistent");
  return { n, shuffled: (flags & FLAG_SHUFFLED) !== 0, chunk, block, grid };
}

/** Chunks of one array in a v2 blob (t on the time grid has none). */
export function chunkCount(h: WaveformHeaderV2, key: keyof Waveforms): number {
  return key === "t" && h.grid ? 0 : Math.ceil(h.n / h.chunk);
}

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

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * unshuffleFrom into a whole, aligned typed array, assembling whole words: several times faster than
 * the byte-by-byte loop, which was most of the cost of decoding a run.
 */
export function unshuffleInto(src: Uint8Array, dst: Float64Array | Float32Array | Uint16Array): void {
  const n = dst.length;
  if (src.length !== dst.byteLength) throw new WaveformFormatError("waveform chunk has the wrong length");
  if (!LITTLE_ENDIAN || dst.byteOffset % 4 !== 0) {
    unshuffleFrom(src, 0, dst.BYTES_PER_ELEMENT, new Uint8Array(dst.buffer, dst.byteOffset, dst.byteLength));
    return;
  }
  if (dst instanceof Uint16Array) {
    for (let i = 0; i < n; i++) dst[i] = src[i] | (src[n + i] << 8);
    return;
  }
  const words = new Uint32Array(dst.buffer, dst.byteOffset, dst.byteLength / 4);
  if (dst instanceof Float32Array) {
    const n2 = 2 * n;
    const n3 = 3 * n;
    for (let i = 0; i < n; i++) words[i] = (src[i] | (src[n + i] << 8) | (src[n2 + i] << 16) | (src[n3 + i] << 24)) >>> 0;
    return;
  }
  for (let i = 0; i < n; i++) {
    words[2 * i] = (src[i] | (src[n + i] << 8) | (src[2 * n + i] << 16) | (src[3 * n + i] << 24)) >>> 0;
    words[2 * i + 1] = (src[4 * n + i] | (src[5 * n + i] << 8) | (src[6 * n + i] << 16) | (src[7 * n + i] << 24)) >>> 0;
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
