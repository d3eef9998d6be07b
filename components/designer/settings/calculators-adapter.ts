/**
 * The settings calculators the table offers. lib/calculators.ts (engine) is meant to own these; it
 * had not landed when this was written, so the same standard formulas live here until it does —
 * switch the three functions to re-exports then.
 */
import type { Rig } from "@/lib/sim/types";

/** Ti and Te from the rate and the I:E ratio written as 1:x. */
export function timesFromRateAndIE(rrPerMin: number, eOverI: number): { tiS: number; teS: number; periodS: number } {
  const periodS = 60 / rrPerMin;
  const tiS = periodS / (1 + eOverI);
  return { tiS, teS: periodS - tiS, periodS };
}

/**
 * Predicted body weight (ARDS Network, after Devine 1974): male 50 + 0.91 (height cm − 152.4),
 * female 45.5 + 0.91 (height cm − 152.4), in kg.
 */
export function predictedBodyWeightKg(heightCm: number, sex: "male" | "female"): number {
  return (sex === "male" ? 50 : 45.5) + 0.91 * (heightCm - 152.4);
}

export function tidalVolumeMl(heightCm: number, sex: "male" | "female", mlPerKg: number): { pbwKg: number; vtMl: number } {
  const pbwKg = predictedBodyWeightKg(heightCm, sex);
  return { pbwKg, vtMl: pbwKg * mlPerKg };
}

/**
 * Step pulse rate that displaces `flowLpm` from the bag, using the calibration's average slope
 * (mL per degree over its whole range) and the drive train's pulses per arm degree.
 */
export function pulseRateForFlow(rig: Rig, flowLpm: number): { pulseRateHz: number; degPerS: number; withinLimit: boolean } {
  const cal = rig.bagCalibration;
  const first = cal[0];
  const last = cal[cal.length - 1];
  const mlPerDeg = (last.volumeMl - first.volumeMl) / Math.max(1e-9, last.angleDeg - first.angleDeg);
  const degPerS = (flowLpm * 1000) / 60 / mlPerDeg;
  const a = rig.actuator;
  const pulsesPerDeg = (a.stepsPerRev * a.microstepping * a.driveRatio) / 360;
  const pulseRateHz = degPerS * pulsesPerDeg;
  return { pulseRateHz, degPerS, withinLimit: pulseRateHz <= a.maxPulseRateHz };
}
