/**
 * Stored waveform codec: encode (re-exported from ./encode) and decode. Server-only: the browser gets
 * windows and CSV from the API, never the blob.
 */
import "server-only";
import { inflateSync } from "node:zlib";
import type { Waveforms } from "@/lib/sim/types";
import type { WaveformSignal } from "@/lib/validation/runs";
import type { SignalIndex, WaveformSource } from "./downsample";
import {
  HEADER_BYTES,
  HEADER_V2_BYTES,
  OVERVIEW_SIGNALS,
  WAVEFORM_FIELDS,
  WAVEFORM_LAYOUT_V2,
  WaveformFormatError,
  chunkCount,
  gridTime,
  layoutVersion,
  readHeader,
  readHeaderV2,
  unpackBody,
  unshuffleInto,
  type WaveformHeaderV2,
} from "./format";

export { encodeWaveforms, type EncodeOptions } from "./encode";
export { WaveformFormatError } from "./format";

function inflate(bytes: Uint8Array, expected: number): Uint8Array {
  let out: Uint8Array;
  try {
    out = inflateSync(bytes, { maxOutputLength: Math.max(expected, 1) });
  } catch (cause) {
    throw new WaveformFormatError(`waveform body does not inflate: ${(cause as Error).message}`);
  }
  if (out.length !== expected) throw new WaveformFormatError(`waveform section is ${out.length} bytes, expected ${expected}`);
  return out;
}

function decodeV1(bytes: Uint8Array): Waveforms {
  const header = readHeader(bytes);
  const body = inflate(bytes.subarray(HEADER_BYTES), header.bodyLength);
  return unpackBody(body, header.n, header.shuffled);
}

type FieldKey = (typeof WAVEFORM_FIELDS)[number]["key"];
type FieldArray = Float64Array | Float32Array | Uint16Array;

function newArray(key: FieldKey, n: number): FieldArray {
  if (key === "t") return new Float64Array(n);
  if (key === "step") return new Uint16Array(n);
  return new Float32Array(n);
}

/**
 * A v2 blob decoded on demand: a chunk of an array is inflated the first time a sample in it is read,
 * the overview of a signal the first time a window asks for it, and t is computed from the time grid
 * when the blob has one. A cold window of a 10-minute run thus inflates its overview blocks and the
 * chunks its bucket edges fall in, not 18 MB of arrays. `full()` decodes everything (CSV).
 */
export class StoredWaveforms implements WaveformSource {
  readonly length: number;
  private readonly header: WaveformHeaderV2;
  private readonly sections: Array<{ offset: number; length: number }> = [];
  /** Index of each field's first chunk in `sections`. */
  private readonly firstChunk = new Map<FieldKey, number>();
  private readonly firstOverview: number;
  private readonly arrays = new Map<FieldKey, FieldArray>();
  private readonly decoded = new Map<FieldKey, Uint8Array>();
  private readonly overviews = new Map<WaveformSignal, SignalIndex>();
  private whole: Waveforms | undefined;
  private inflated = 0;

  constructor(private readonly bytes: Uint8Array) {
    this.header = readHeaderV2(bytes);
    const h = this.header;
    this.length = h.n;
    let count = 0;
    for (const f of WAVEFORM_FIELDS) {
      this.firstChunk.set(f.key, count);
      count += chunkCount(h, f.key);
    }
    this.firstOverview = count;
    count += OVERVIEW_SIGNALS.length;
    const tableEnd = HEADER_V2_BYTES + count * 4;
    if (bytes.length < tableEnd) throw new WaveformFormatError("waveform blob is shorter than its chunk table");
    const view = new DataView(bytes.buffer, bytes.byteOffset, tableEnd);
    let offset = tableEnd;
    for (let i = 0; i < count; i++) {
      const length = view.getUint32(HEADER_V2_BYTES + i * 4, true);
      this.sections.push({ offset, length });
      offset += length;
    }
    if (offset !== bytes.length) throw new WaveformFormatError(`waveform blob is ${bytes.length} bytes, its chunk table says ${offset}`);
  }

  /** Array chunks inflated so far (overviews not counted): what a window cost. */
  get inflatedChunks(): number {
    return this.inflated;
  }

  /** True when t is computed from the engine's time grid rather than stored. */
  get timeOnGrid(): boolean {
    return this.header.grid !== null;
  }

  /** The blob plus its arrays fully decoded (for the cache's budget; t counted even on the grid). */
  get byteSize(): number {
    return this.bytes.byteLength + this.length * 30;
  }

  time(i: number): number {
    const grid = this.header.grid;
    if (grid) return gridTime(grid, i);
    return this.array("t", i, i + 1)[i];
  }

  values(signal: WaveformSignal, start: number, end: number): ArrayLike<number> {
    return this.array(signal, start, end);
  }

  index(signal: WaveformSignal): SignalIndex | undefined {
    let index = this.overviews.get(signal);
    if (index) return index;
    const k = OVERVIEW_SIGNALS.indexOf(signal);
    if (k < 0) return undefined;
    const blocks = Math.ceil(this.length / this.header.block);
    const s = this.sections[this.firstOverview + k];
    const body = inflate(this.bytes.subarray(s.offset, s.offset + s.length), blocks * 12);
    const block = this.header.block;
    const min = new Float32Array(blocks);
    const max = new Float32Array(blocks);
    // Copies (new Uint8Array of a view; Buffer#slice would not copy): the inflated bytes need not be
    // aligned for typed-array views.
    const copy = (a: number, b: number) => new Uint8Array(body.subarray(a, b)).buffer;
    if (this.header.shuffled) {
      unshuffleInto(body.subarray(0, blocks * 4), min);
      unshuffleInto(body.subarray(blocks * 4, blocks * 8), max);
    } else {
      min.set(new Float32Array(copy(0, blocks * 4)));
      max.set(new Float32Array(copy(blocks * 4, blocks * 8)));
    }
    const offsets = new Uint16Array(copy(blocks * 8, blocks * 12));
    const iMin = new Uint32Array(blocks);
    const iMax = new Uint32Array(blocks);
    for (let b = 0; b < blocks; b++) {
      iMin[b] = b * block + offsets[b];
      iMax[b] = b * block + offsets[blocks + b];
      if (offsets[b] >= block || offsets[blocks + b] >= block) throw new WaveformFormatError("waveform overview is inconsistent");
    }
    index = { block, min, max, iMin, iMax };
    this.overviews.set(signal, index);
    return index;
  }

  /** Every array, fully decoded (bit-exact with what was encoded). */
  full(): Waveforms {
    if (this.whole) return this.whole;
    const n = this.length;
    const t = this.header.grid ? new Float64Array(n) : (this.array("t", 0, n) as Float64Array);
    if (this.header.grid) for (let i = 0; i < n; i++) t[i] = gridTime(this.header.grid, i);
    this.whole = {
      t,
      paw: this.array("paw", 0, n) as Float32Array,
      flow: this.array("flow", 0, n) as Float32Array,
      volume: this.array("volume", 0, n) as Float32Array,
      pmus: this.array("pmus", 0, n) as Float32Array,
      arm: this.array("arm", 0, n) as Float32Array,
      step: this.array("step", 0, n) as Uint16Array,
    };
    return this.whole;
  }

  /** The whole array of `key`, with the chunks covering samples [start, end) inflated. */
  private array(key: FieldKey, start: number, end: number): FieldArray {
    let arr = this.arrays.get(key);
    let done = this.decoded.get(key);
    if (!arr || !done) {
      arr = newArray(key, this.length);
      done = new Uint8Array(Math.ceil(this.length / this.header.chunk));
      this.arrays.set(key, arr);
      this.decoded.set(key, done);
    }
    if (end <= start) return arr;
    const chunk = this.header.chunk;
    const size = arr.BYTES_PER_ELEMENT;
    const first = this.firstChunk.get(key) ?? 0;
    for (let c = Math.floor(start / chunk); c <= Math.floor((end - 1) / chunk); c++) {
      if (done[c]) continue;
      const i0 = c * chunk;
      const i1 = Math.min(this.length, i0 + chunk);
      const s = this.sections[first + c];
      const body = inflate(this.bytes.subarray(s.offset, s.offset + s.length), (i1 - i0) * size);
      const dst = arr.subarray(i0, i1);
      if (this.header.shuffled) unshuffleInto(body, dst);
      else new Uint8Array(dst.buffer, dst.byteOffset, dst.byteLength).set(body);
      done[c] = 1;
      this.inflated++;
    }
    return arr;
  }
}

/** A stored blob, ready for windows: v2 decoded on demand, v1 (older runs) decoded whole. */
export function openWaveforms(bytes: Uint8Array): StoredWaveforms | Waveforms {
  return layoutVersion(bytes) === WAVEFORM_LAYOUT_V2 ? new StoredWaveforms(bytes) : decodeV1(bytes);
}

export function decodeWaveforms(bytes: Uint8Array): Waveforms {
  const opened = openWaveforms(bytes);
  return opened instanceof StoredWaveforms ? opened.full() : opened;
}

/** Sample count without inflating the body. */
export function waveformSampleCount(bytes: Uint8Array): number {
  return layoutVersion(bytes) === WAVEFORM_LAYOUT_V2 ? readHeaderV2(bytes).n : readHeader(bytes).n;
}
