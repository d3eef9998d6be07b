/**
 * Seeded randomness: the same seed gives the same run (effort variability, sensor noise).
 * mulberry32: a small 32-bit generator with good statistical quality for simulation noise
 * (Tommy Ettinger's public-domain design); Box–Muller for Gaussian samples.
 */
export interface Rng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [-1, 1). */
  symmetric(): number;
  /** Standard normal (mean 0, sd 1). */
  gaussian(): number;
}

/**
 * A class rather than closures: every generator shares the same method code, so V8 can inline
 * `gaussian()` at the controller's call site (closures made per generator are a different function each
 * run, the call site goes megamorphic and each sample comes back boxed in a fresh heap number).
 */
class Mulberry32 implements Rng {
  /**
   * The 32-bit state, kept as a signed int32 (`| 0`): V8 then stores it as a small integer, where the
   * unsigned form (`>>> 0`, above 2³¹ half the time) is a heap number. Every use below goes through a
   * 32-bit conversion (^, |, >>>, Math.imul), so the stream is the same bits as with the unsigned state.
   */
  private a: number;
  /** Second value of the last Box–Muller pair, NaN when used. */
  private spare = NaN;

  constructor(seed: number) {
    this.a = (Math.floor(seed) ^ 0x9e3779b9) | 0;
  }

  next(): number {
    this.a = (this.a + 0x6d2b79f5) | 0;
    let t = this.a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  symmetric(): number {
    return 2 * this.next() - 1;
  }

  gaussian(): number {
    if (!Number.isNaN(this.spare)) {
      const s = this.spare;
      this.spare = NaN;
      return s;
    }
    let u = this.next();
    while (u <= 1e-12) u = this.next();
    const v = this.next();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }
}

export function createRng(seed: number): Rng {
  return new Mulberry32(seed);
}
