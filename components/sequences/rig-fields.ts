/**
 * The numeric fields of the rig profile form, grouped as the page shows them, with the canonical unit
 * each is stored in (lib/sim/types.ts names the units in the keys; this is the label side of that).
 */
import type { FieldPath } from "react-hook-form";
import type { RigInput } from "@/lib/sim/types";

export interface RigField {
  path: FieldPath<RigInput>;
  label: string;
  unit: string;
  step: number | "any";
  hint?: string;
}

export interface RigFieldGroup {
  title: string;
  description: string;
  fields: RigField[];
}

export const RIG_FIELD_GROUPS: RigFieldGroup[] = [
  {
    title: "Actuator",
    description: "Stepper drive and arm: sets how fast the arm can squeeze the bag.",
    fields: [
      { path: "actuator.stepsPerRev", label: "Steps per revolution", unit: "steps", step: 1 },
      { path: "actuator.microstepping", label: "Microstepping", unit: "×", step: 1 },
      { path: "actuator.driveRatio", label: "Drive ratio", unit: "motor rev / arm rev", step: "any" },
      { path: "actuator.maxPulseRateHz", label: "Maximum pulse rate", unit: "Hz", step: "any" },
      { path: "actuator.maxAccelHzPerS", label: "Maximum acceleration", unit: "Hz/s", step: "any" },
      { path: "actuator.armTravelDeg", label: "Arm travel", unit: "deg", step: "any", hint: "rest to full squeeze" },
      { path: "actuator.returnSpeedDegPerS", label: "Arm return speed", unit: "deg/s", step: "any" },
    ],
  },
  {
    title: "Circuit",
    description: "Tubing and mask between the bag and the patient.",
    fields: [
      { path: "circuit.complianceMlPerCmH2O", label: "Circuit compliance", unit: "mL/cmH2O", step: "any" },
      {
        path: "circuit.expiratoryResistanceCmH2OPerLps",
        label: "Expiratory resistance",
        unit: "cmH2O/(L/s)",
        step: "any",
      },
      { path: "circuit.inletCrackingCmH2O", label: "Inlet valve cracking pressure", unit: "cmH2O", step: "any" },
      {
        path: "circuit.leak.coefficient",
        label: "Leak coefficient",
        unit: "L/min",
        step: "any",
        hint: "orifice: L/min at 10 cmH2O; linear: L/min per cmH2O",
      },
    ],
  },
  {
    title: "Valves",
    description: "Mechanical valves on the expiratory limb and the relief port.",
    fields: [{ path: "reliefValveCmH2O", label: "Relief valve opening pressure", unit: "cmH2O", step: "any" }],
  },
  {
    title: "Sensor",
    description: "What the controller sees: lag, noise and resolution of the pressure and flow sensors.",
    fields: [
      { path: "sensor.pressureLagS", label: "Pressure lag", unit: "s", step: "any" },
      { path: "sensor.pressureNoiseCmH2O", label: "Pressure noise", unit: "cmH2O", step: "any" },
      { path: "sensor.pressureResolutionCmH2O", label: "Pressure resolution", unit: "cmH2O", step: "any" },
      { path: "sensor.flowLagS", label: "Flow lag", unit: "s", step: "any" },
      { path: "sensor.flowNoiseLpm", label: "Flow noise", unit: "L/min", step: "any" },
      { path: "sensor.flowResolutionLpm", label: "Flow resolution", unit: "L/min", step: "any" },
    ],
  },
  {
    title: "Controller",
    description: "How often the sequence runs its checks.",
    fields: [{ path: "scanPeriodS", label: "Scan period", unit: "s", step: "any", hint: "0.01 s = 100 scans per second" }],
  },
];
