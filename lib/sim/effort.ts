/**
 * Patient inspiratory effort Pmus(t) (cmH2O, > 0 while the patient inspires), with seeded breath-to-breath
 * variability and exact onsets: the engine knows every effort, which makes trigger latency and asynchrony exact.
 *
 * Shapes:
 * - half-sine: A·sin(π·t/Ti) over the effort time (common in simulation; common practice);
 * - ramp: linear rise to A over Ti, then release;
 * - parabolic-exp: parabolic rise to A at Ti, exponential relaxation to 0 by the next onset
 *   (after Albanese et al., Am J Physiol Heart Circ Physiol 2016;310:H899 — formula from memory):
 *   rise A·t·(T − t)/(Ti·(T − Ti)); relaxation A·(e^(−(t−Ti)/τ) − e^(−(T−Ti)/τ))/(1 − e^(−(T−Ti)/τ)), τ = (T − Ti)/5.
 */
import type { Effort } from "./types";
import type { Rng } from "./rng";

export const SHAPE_NONE = 0;
export const SHAPE_HALF_SINE = 1;
export const SHAPE_RAMP = 2;
export const SHAPE_PARABOLIC_EXP = 3;

export interface EffortSchedule {
  shape: number;
  count: number;
  onsetS: Float64Array;
  /** End of the inspiratory effort (onset + effort time), s. */
  endS: Float64Array;
  /** Start of the following effort (or +∞), s: the patient's own cycle length. */
  nextS: Float64Array;
  amplitudeCmH2O: Float64Array;
  effortTimeS: number;
}

export function shapeCode(shape: Effort["shape"]): number {
  switch (shape) {
    case "half-sine":
      return SHAPE_HALF_SINE;
    case "ramp":
      return SHAPE_RAMP;
    case "parabolic-exp":
      return SHAPE_PARABOLIC_EXP;
    default:
      return SHAPE_NONE;
  }
}

/** Every effort in [0, duration): onsets at the patient's rate, interval and amplitude varied by ±variability. */
export function effortSchedule(effort: Effort, durationS: number, rng: Rng): EffortSchedule {
  const shape = effort.amplitudeCmH2O > 0 ? shapeCode(effort.shape) : SHAPE_NONE;
  const onsets: number[] = [];
  const amps: number[] = [];
  if (shape !== SHAPE_NONE) {
    const period = 60 / effort.ratePerMin;
    // The patient's cycle cannot be shorter than its own effort plus a little expiration.
    const minInterval = effort.effortTimeS + 0.1;
    let t = effort.onsetS;
    while (t < durationS) {
      onsets.push(t);
      amps.push(Math.max(0, effort.amplitudeCmH2O * (1 + effort.variability * rng.symmetric())));
      t += Math.max(minInterval, period * (1 + effort.variability * rng.symmetric()));
    }
  }
  const n = onsets.length;
  const onsetS = Float64Array.from(onsets);
  const endS = new Float64Array(n);
  const nextS = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    endS[i] = onsetS[i] + effort.effortTimeS;
    nextS[i] = i + 1 < n ? onsetS[i + 1] : Infinity;
  }
  return { shape, count: n, onsetS, endS, nextS, amplitudeCmH2O: Float64Array.from(amps), effortTimeS: effort.effortTimeS };
}

export function halfSinePmusCmH2O(tS: number, effortTimeS: number, amplitudeCmH2O: number): number {
  return tS < effortTimeS ? amplitudeCmH2O * Math.sin((Math.PI * tS) / effortTimeS) : 0;
}

export function rampPmusCmH2O(tS: number, effortTimeS: number, amplitudeCmH2O: number): number {
  return tS < effortTimeS ? (amplitudeCmH2O * tS) / effortTimeS : 0;
}

export function parabolicExpPmusCmH2O(tS: number, effortTimeS: number, cycleS: number, amplitudeCmH2O: number): number {
  const ti = effortTimeS;
  const T = Number.isFinite(cycleS) ? cycleS : ti + 5;
  if (tS <= ti) return (amplitudeCmH2O * tS * (T - tS)) / (ti * (T - ti));
  if (tS >= T) return 0;
  const tau = (T - ti) / 5;
  const tail = Math.exp(-(T - ti) / tau);
  return (amplitudeCmH2O * (Math.exp(-(tS - ti) / tau) - tail)) / (1 - tail);
}

/** Pmus of effort i at time t (s), cmH2O. */
export function effortPmusCmH2O(s: EffortSchedule, i: number, tS: number): number {
  const local = tS - s.onsetS[i];
  if (local < 0) return 0;
  const a = s.amplitudeCmH2O[i];
  switch (s.shape) {
    case SHAPE_HALF_SINE:
      return halfSinePmusCmH2O(local, s.effortTimeS, a);
    case SHAPE_RAMP:
      return rampPmusCmH2O(local, s.effortTimeS, a);
    case SHAPE_PARABOLIC_EXP:
      return parabolicExpPmusCmH2O(local, s.effortTimeS, s.nextS[i] - s.onsetS[i], a);
    default:
      return 0;
  }
}

/**
 * Pmus at the mid-points t0 + (k + ½)·dt of n consecutive steps, written to out[0..n), starting from effort
 * `cursor` (the last effort whose onset has passed, −1 before the first); returns the cursor after the last
 * point. Same values as effortPmusCmH2O point by point. Written for the plant's scan loop: the shape is
 * chosen once per call, and the results go straight into a Float64Array, so no double is boxed (a call
 * to effortPmusCmH2O that V8 does not inline returns its value in a fresh heap number).
 */
export function fillEffortPmusCmH2O(s: EffortSchedule, cursor: number, t0S: number, dtS: number, n: number, out: Float64Array): number {
  const onset = s.onsetS;
  const amp = s.amplitudeCmH2O;
  const count = s.count;
  const ti = s.effortTimeS;
  const shape = s.shape;
  // Most scans fall between efforts: when no onset falls within the window and the current effort (a
  // half-sine or ramp, zero past its effort time) is over at the window's first point, every point is 0.
  // The window's points come from the same expression as below, and t − onset only grows with t, so this
  // is the loop's own answer, without evaluating it point by point.
  if (n > 0 && shape !== SHAPE_PARABOLIC_EXP) {
    const tFirst = t0S + 0.5 * dtS;
    const tLast = t0S + (n - 1 + 0.5) * dtS;
    const nextOnset = cursor + 1 < count ? onset[cursor + 1] : Infinity;
    if (nextOnset > tLast && (cursor < 0 || tFirst - onset[cursor] >= ti)) {
      // A plain loop: for a scan's ten or so points it costs less than calling TypedArray.fill.
      for (let k = 0; k < n; k++) out[k] = 0;
      return cursor;
    }
  }
  for (let k = 0; k < n; k++) {
    const tm = t0S + (k + 0.5) * dtS;
    while (cursor + 1 < count && onset[cursor + 1] <= tm) cursor++;
    let pmus = 0;
    if (cursor >= 0) {
      const local = tm - onset[cursor];
      if (local >= 0) {
        if (shape === SHAPE_HALF_SINE) pmus = halfSinePmusCmH2O(local, ti, amp[cursor]);
        else if (shape === SHAPE_RAMP) pmus = rampPmusCmH2O(local, ti, amp[cursor]);
        else if (shape === SHAPE_PARABOLIC_EXP) pmus = parabolicExpPmusCmH2O(local, ti, s.nextS[cursor] - onset[cursor], amp[cursor]);
      }
    }
    out[k] = pmus;
  }
  return cursor;
}
