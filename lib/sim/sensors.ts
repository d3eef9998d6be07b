/**
 * Sensors: first-order lag, seeded Gaussian noise, quantisation. The controller sees these outputs,
 * never the true plant state.
 */
import type { Rng } from "./rng";

/** Per-step smoothing factor of a first-order lag with time constant lag (exact discretisation). */
export function lagFactor(dtS: number, lagS: number): number {
  return lagS > 0 ? -Math.expm1(-dtS / lagS) : 1;
}

export function firstOrderLag(previous: number, input: number, factor: number): number {
  return previous + (input - previous) * factor;
}

export function quantise(value: number, resolution: number): number {
  return resolution > 0 ? Math.round(value / resolution) * resolution : value;
}

/** What the controller reads: the lagged value plus noise, quantised. */
export function sensorReading(lagged: number, noiseSd: number, resolution: number, rng: Rng): number {
  return quantise(noiseSd > 0 ? lagged + noiseSd * rng.gaussian() : lagged, resolution);
}
