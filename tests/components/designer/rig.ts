/** A rig profile for tests (the engine's DEFAULT_RIG had not landed when these were written). */
import { rigSchema, type Rig } from "@/lib/sim/types";

export const DEFAULT_RIG_FOR_TESTS: Rig = rigSchema.parse({
  name: "Test rig",
  actuator: { stepsPerRev: 200, microstepping: 8, driveRatio: 5, maxPulseRateHz: 40000, maxAccelHzPerS: 200000, armTravelDeg: 90 },
  bagCalibration: [
    { angleDeg: 0, volumeMl: 0 },
    { angleDeg: 90, volumeMl: 900 },
  ],
  circuit: { complianceMlPerCmH2O: 1 },
  reliefValveCmH2O: 40,
  sensor: { pressureLagS: 0.01, pressureNoiseCmH2O: 0, pressureResolutionCmH2O: 0.1, flowLagS: 0.01, flowNoiseLpm: 0, flowResolutionLpm: 0.1 },
  scanPeriodS: 0.01,
});
