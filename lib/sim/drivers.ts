/**
 * Drivers: what pushes gas into the circuit.
 * - ideal flow source: Qin = the commanded flow;
 * - ideal pressure source: Paw follows PEEP-to-target with a linear rise (a hard constraint);
 * - the rig's bag compressor: a stepper drives the arm; arm speed (deg/s) = pulse rate ÷ (steps/rev ×
 *   microstepping × drive ratio) × 360; displaced volume from the bag calibration table; the pulse rate
 *   is limited in rate and acceleration; a one-way valve stops back-flow into the bag.
 */
import type { Rig } from "./types";

/** Driver command kinds (numbers for the physics loop). */
export const CMD_RELEASE = 0;
export const CMD_HOLD = 1;
export const CMD_FLOW = 2;
export const CMD_PRESSURE = 3;
export const CMD_ARM = 4;

/** Target of a pressure command with a linear rise from the pressure at the command's start. */
export function risePressureCmH2O(tS: number, startS: number, startCmH2O: number, targetCmH2O: number, riseS: number): number {
  if (riseS <= 0) return targetCmH2O;
  const f = (tS - startS) / riseS;
  return f >= 1 ? targetCmH2O : startCmH2O + (targetCmH2O - startCmH2O) * (f > 0 ? f : 0);
}

/** Step pulses per degree of arm travel. */
export function pulsesPerDeg(actuator: Rig["actuator"]): number {
  return (actuator.stepsPerRev * actuator.microstepping * actuator.driveRatio) / 360;
}

/** Arm angular speed from the pulse rate. */
export function armSpeedDegPerS(pulseRateHz: number, pulsesPerDegree: number): number {
  return pulseRateHz / pulsesPerDegree;
}

/** Bag calibration as arrays (angle deg ascending, displaced volume L). */
export interface BagTable {
  angleDeg: Float64Array;
  volumeL: Float64Array;
}

export function bagTable(points: Rig["bagCalibration"]): BagTable {
  const sorted = [...points].sort((a, b) => a.angleDeg - b.angleDeg);
  return {
    angleDeg: Float64Array.from(sorted.map((p) => p.angleDeg)),
    volumeL: Float64Array.from(sorted.map((p) => p.volumeMl / 1000)),
  };
}

/** Displaced bag volume at an arm angle (linear interpolation; flat beyond the table). */
export function bagVolumeL(table: BagTable, angleDeg: number): number {
  const a = table.angleDeg;
  const v = table.volumeL;
  const n = a.length;
  if (angleDeg <= a[0]) return v[0];
  if (angleDeg >= a[n - 1]) return v[n - 1];
  let i = 1;
  while (a[i] < angleDeg) i++;
  return v[i - 1] + ((v[i] - v[i - 1]) * (angleDeg - a[i - 1])) / (a[i] - a[i - 1]);
}

/** dV/dθ of the bag at an angle, L/deg (0 beyond the table: the bag is empty). */
export function bagSlopeLPerDeg(table: BagTable, angleDeg: number): number {
  const a = table.angleDeg;
  const v = table.volumeL;
  const n = a.length;
  if (angleDeg < a[0] || angleDeg >= a[n - 1]) return 0;
  let i = 1;
  while (a[i] <= angleDeg) i++;
  return (v[i] - v[i - 1]) / (a[i] - a[i - 1]);
}

/**
 * bagVolumeL and bagSlopeLPerDeg for the step loop, where the arm moves a little each step: the table
 * segment is searched from the one found last time (`hints[slot]`, updated), not from the start. Each finds
 * the same segment as the linear search from the start (the first index ≥ 1 whose angle is ≥ the arm angle,
 * resp. > it, in the ascending table) and interpolates with the same expression, so the values are the same.
 */
export function bagVolumeHintedL(table: BagTable, angleDeg: number, hints: Int32Array, slot: number): number {
  const a = table.angleDeg;
  const v = table.volumeL;
  const n = a.length;
  if (angleDeg <= a[0]) return v[0];
  if (angleDeg >= a[n - 1]) return v[n - 1];
  let i = hints[slot];
  if (i < 1 || i > n - 1) i = 1;
  while (i > 1 && a[i - 1] >= angleDeg) i--;
  while (a[i] < angleDeg) i++;
  hints[slot] = i;
  return v[i - 1] + ((v[i] - v[i - 1]) * (angleDeg - a[i - 1])) / (a[i] - a[i - 1]);
}

export function bagSlopeHintedLPerDeg(table: BagTable, angleDeg: number, hints: Int32Array, slot: number): number {
  const a = table.angleDeg;
  const v = table.volumeL;
  const n = a.length;
  if (angleDeg < a[0] || angleDeg >= a[n - 1]) return 0;
  let i = hints[slot];
  if (i < 1 || i > n - 1) i = 1;
  while (i > 1 && a[i - 1] > angleDeg) i--;
  while (a[i] <= angleDeg) i++;
  hints[slot] = i;
  return (v[i] - v[i - 1]) / (a[i] - a[i - 1]);
}

/** Pulse rate moved toward its target, limited by the maximum acceleration and rate. */
export function slewPulseRateHz(currentHz: number, targetHz: number, maxAccelHzPerS: number, maxRateHz: number, dtS: number): number {
  const t = targetHz < 0 ? 0 : targetHz > maxRateHz ? maxRateHz : targetHz;
  const dmax = maxAccelHzPerS * dtS;
  if (t > currentHz + dmax) return currentHz + dmax;
  if (t < currentHz - dmax) return currentHz - dmax;
  return t;
}

/** Pulse rate that makes the bag deliver a flow at the current angle (∞ demand capped by the caller). */
export function pulseRateForFlowHz(flowLps: number, slopeLPerDeg: number, pulsesPerDegree: number): number {
  if (flowLps <= 0) return 0;
  if (slopeLPerDeg <= 0) return 0;
  return (flowLps / slopeLPerDeg) * pulsesPerDegree;
}

/**
 * Gain of the rig's pressure loop (a pressure command on the bag compressor): flow demand per cmH2O of
 * error, L/s per cmH2O. Invented demo-rig value, chosen so the loop settles in a few tens of ms on the
 * default circuit without ringing.
 */
export const BAG_PRESSURE_GAIN_LPS_PER_CMH2O = 0.4;
