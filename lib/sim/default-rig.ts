/**
 * The default rig profile: invented demo hardware (a bag-compressor build), plausible values of our own.
 * Not a real product; every number is either a requirement we cite or a round figure of the trade.
 */
import { rigSchema, type Rig } from "./types";

export const DEFAULT_RIG: Rig = rigSchema.parse({
  name: "Demo bag-compressor rig (invented)",
  actuator: {
    // 1.8° hybrid stepper: 200 full steps per revolution (common practice).
    stepsPerRev: 200,
    microstepping: 8,
    // 5:1 belt reduction between motor and arm (invented): 22.2 pulses per degree of arm travel.
    driveRatio: 5,
    // 20 kHz → 900 deg/s arm speed, ample for 100 L/min on this bag (invented driver limit).
    maxPulseRateHz: 20000,
    // 200 kHz/s: full speed in 0.1 s; 60 L/min reached in about 10 ms (invented).
    maxAccelHzPerS: 200000,
    // Bag-compressor arms usually travel about a quarter turn (common practice).
    armTravelDeg: 90,
    returnSpeedDegPerS: 180,
  },
  // Adult self-inflating bag squeezed by the arm: slow start while the paddle meets the bag, steepest
  // mid-travel, flattening as the bag empties (invented calibration, 670 mL at full travel).
  bagCalibration: [
    { angleDeg: 0, volumeMl: 0 },
    { angleDeg: 10, volumeMl: 40 },
    { angleDeg: 20, volumeMl: 110 },
    { angleDeg: 30, volumeMl: 200 },
    { angleDeg: 40, volumeMl: 300 },
    { angleDeg: 50, volumeMl: 400 },
    { angleDeg: 60, volumeMl: 490 },
    { angleDeg: 70, volumeMl: 570 },
    { angleDeg: 80, volumeMl: 630 },
    { angleDeg: 90, volumeMl: 670 },
  ],
  circuit: {
    // Adult tubing and mask: about 1 mL/cmH2O (common practice order of magnitude).
    complianceMlPerCmH2O: 1,
    leak: { kind: "none", coefficient: 0 },
    expiratoryResistanceCmH2OPerLps: 3,
    // Duckbill inlet valve cracking at ~1 cmH2O below ambient (invented, typical order).
    inletCrackingCmH2O: 1,
    inletResistanceCmH2OPerLps: 2,
  },
  // An adjustable PEEP valve that follows the sequence's PEEP setting. A fixed spring valve near 0.1 psi
  // (≈ 7.03 cmH2O: 1 psi = 6894.757 Pa, 1 cmH2O = 98.0665 Pa; derived) is the usual alternative on such builds: set peepValveCmH2O to 7.03.
  peepValveCmH2O: null,
  // Mechanical failsafe at 40 cmH2O: MHRA RMVS v1 (20 March 2020) — patient never exposed to more than 40 cmH2O.
  reliefValveCmH2O: 40,
  reliefResistanceCmH2OPerLps: 1,
  sensor: {
    // Invented board-level pressure sensor: 5 ms lag, 0.1 cmH2O noise and resolution.
    pressureLagS: 0.005,
    pressureNoiseCmH2O: 0.1,
    pressureResolutionCmH2O: 0.1,
    flowLagS: 0.01,
    flowNoiseLpm: 0.3,
    flowResolutionLpm: 0.1,
  },
  scanPeriodS: 0.01,
});
