/** A plant built directly (ideal flow/pressure drivers, chosen circuit) for integrator checks. */
import { bagTable } from "@/lib/sim/drivers";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { effortSchedule } from "@/lib/sim/effort";
import { Plant } from "@/lib/sim/plant";
import { createRng } from "@/lib/sim/rng";
import type { CircuitParams } from "@/lib/sim/circuit";

export interface PlantCase {
  cMlPerCmH2O: number;
  rCmH2OPerLps: number;
  peepCmH2O: number;
  circuit: Partial<CircuitParams>;
  dtS?: number;
  durationS: number;
}

export function makePlant(k: PlantCase): Plant {
  const none = effortSchedule(
    { shape: "none", amplitudeCmH2O: 0, ratePerMin: 15, effortTimeS: 0.8, onsetS: 1, variability: 0 },
    k.durationS,
    createRng(1),
  );
  const dtS = k.dtS ?? 0.001;
  return new Plant({
    dtS,
    lung: { p0CmH2O: k.peepCmH2O, e1CmH2OPerL: 1000 / k.cMlPerCmH2O, e2CmH2OPerL2: 0, resistanceCmH2OPerLps: k.rCmH2OPerLps },
    circuit: {
      complianceLPerCmH2O: 0,
      peepValveCmH2O: k.peepCmH2O,
      expiratoryResistanceCmH2OPerLps: 3,
      reliefOpenCmH2O: Infinity,
      reliefResistanceCmH2OPerLps: 1,
      leakKind: 0,
      leakCoefficient: 0,
      inletCrackingCmH2O: 1,
      inletResistanceCmH2OPerLps: 2,
      ...k.circuit,
    },
    driver: {
      ideal: true,
      pulsesPerDeg: 22.2,
      maxPulseRateHz: 20000,
      maxAccelHzPerS: 2e5,
      armTravelDeg: 90,
      returnSpeedDegPerS: 180,
      bag: bagTable(DEFAULT_RIG.bagCalibration),
    },
    sensors: { pressureLagS: 0, flowLagS: 0 },
    effort: none,
    sampleEvery: 1,
    capacity: Math.ceil(k.durationS / dtS) + 2,
  });
}
