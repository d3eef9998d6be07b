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

export function createRng(seed: number): Rng {
  let a = (Math.floor(seed) ^ 0x9e3779b9) >>> 0;
  let spare = NaN;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    symmetric: () => 2 * next() - 1,
    gaussian() {
      if (!Number.isNaN(spare)) {
        const s = spare;
        spare = NaN;
        return s;
      }
      let u = next();
      while (u <= 1e-12) u = next();
      const v = next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
  };
}
