/**
 * Settings calculators for the designer and the CLI: breath timing, predicted body weight and tidal
 * volume, and the pulse rate a rig needs for a flow. Inputs may carry units (parsed through mathjs in
 * lib/units.ts); outputs are canonical (s, kg, mL, Hz, deg/s).
 */
import { bagSlopeLPerDeg, bagTable, pulsesPerDeg } from "@/lib/sim/drivers";
import type { RigInput } from "@/lib/sim/types";
import { rigSchema } from "@/lib/sim/types";
import { UnitError, parseQuantity } from "@/lib/units";

export interface BreathTiming {
  /** Breath period, s. */
  periodS: number;
  tiS: number;
  teS: number;
}

/** Parse an I:E ratio: "1:2" → 2, "1:1.5" → 1.5, 2 → 2 (Te/Ti). */
export function parseIeRatio(ie: string | number): number {
  if (typeof ie === "number") {
    if (!(ie > 0)) throw new UnitError(`I:E must be above 0, got ${ie}`);
    return ie;
  }
  const m = /^\s*([0-9.]+)\s*:\s*([0-9.]+)\s*$/.exec(ie);
  const x = m ? Number(m[2]) / Number(m[1]) : Number(ie);
  if (!(x > 0) || !Number.isFinite(x)) throw new UnitError(`I:E should look like "1:2", got "${ie}"`);
  return x;
}

/** Ti and Te from the rate and I:E (Te/Ti): Ti = (60/RR)/(1 + x), Te = Ti·x. */
export function breathTiming(rate: string | number, ie: string | number): BreathTiming {
  const rr = parseQuantity(rate, "rate");
  if (!(rr > 0)) throw new UnitError(`rate must be above 0, got ${rr}`);
  const x = parseIeRatio(ie);
  const periodS = 60 / rr;
  const tiS = periodS / (1 + x);
  return { periodS, tiS, teS: periodS - tiS };
}

export type Sex = "male" | "female";

const CM_PER_INCH = 2.54; // exact, by definition of the inch

/**
 * Predicted body weight, kg (NIH NHLBI ARDS Network protocol):
 * male 50 + 2.3 × (height in inches − 60); female 45.5 + 2.3 × (height in inches − 60).
 * Height as a number (cm) or text with units ("170 cm", "67 in", "5.5 ft").
 */
export function predictedBodyWeightKg(sex: Sex, height: string | number): number {
  const cm = parseQuantity(height, "length");
  if (!(cm > 0)) throw new UnitError(`height must be above 0, got ${cm} cm`);
  const inches = cm / CM_PER_INCH;
  return (sex === "male" ? 50 : 45.5) + 2.3 * (inches - 60);
}

/** Tidal volume at a chosen mL/kg of predicted body weight (ARDS Network target 6 mL/kg, range 4–8). */
export function tidalVolumeMl(sex: Sex, height: string | number, mlPerKg = 6): number {
  if (!(mlPerKg > 0)) throw new UnitError(`mL/kg must be above 0, got ${mlPerKg}`);
  return predictedBodyWeightKg(sex, height) * mlPerKg;
}

export interface PulseRateForFlow {
  /** Step pulse rate the driver must produce, Hz. */
  pulseRateHz: number;
  armSpeedDegPerS: number;
  /** Bag calibration slope used, mL/deg. */
  slopeMlPerDeg: number;
  /** Whether the rate exceeds the actuator's maximum. */
  exceedsMax: boolean;
  maxPulseRateHz: number;
}

/**
 * The pulse rate a rig needs to deliver a flow: arm speed = flow ÷ dV/dθ (the bag calibration slope at the
 * given arm angle, or the mean slope over the arm's travel), pulse rate = arm speed × steps/rev ×
 * microstepping × drive ratio ÷ 360.
 */
export function pulseRateForFlow(flow: string | number, rigInput: RigInput, angleDeg?: number): PulseRateForFlow {
  const rig = rigSchema.parse(rigInput);
  const flowLps = parseQuantity(flow, "flow") / 60;
  if (!(flowLps >= 0)) throw new UnitError(`flow cannot be negative, got ${flowLps * 60} L/min`);
  const table = bagTable(rig.bagCalibration);
  let slopeLPerDeg: number;
  if (angleDeg === undefined) {
    const n = table.angleDeg.length;
    const travel = Math.min(rig.actuator.armTravelDeg, table.angleDeg[n - 1]);
    const vAt = (a: number) => {
      let v = table.volumeL[0];
      for (let i = 1; i < n; i++) {
        if (a <= table.angleDeg[i]) {
          const f = (a - table.angleDeg[i - 1]) / (table.angleDeg[i] - table.angleDeg[i - 1]);
          return table.volumeL[i - 1] + f * (table.volumeL[i] - table.volumeL[i - 1]);
        }
        v = table.volumeL[i];
      }
      return v;
    };
    slopeLPerDeg = (vAt(travel) - vAt(table.angleDeg[0])) / (travel - table.angleDeg[0]);
  } else {
    slopeLPerDeg = bagSlopeLPerDeg(table, angleDeg);
  }
  if (!(slopeLPerDeg > 0)) throw new UnitError(`the bag calibration has no slope at ${angleDeg ?? "its travel"} deg`);
  const armSpeedDegPerS = flowLps / slopeLPerDeg;
  const pulseRateHz = armSpeedDegPerS * pulsesPerDeg(rig.actuator);
  return {
    pulseRateHz,
    armSpeedDegPerS,
    slopeMlPerDeg: slopeLPerDeg * 1000,
    exceedsMax: pulseRateHz > rig.actuator.maxPulseRateHz,
    maxPulseRateHz: rig.actuator.maxPulseRateHz,
  };
}
