/**
 * The numeric fields of the rig profile form, grouped as the page shows them, with the canonical unit
 * each is stored in (lib/sim/types.ts names the units in the keys; this is the label side of that).
 */
import type { FieldPath } from "react-hook-form";
import type { RigInput } from "@/lib/sim/types";
import type { Quantity } from "@/lib/units";
import type { Editable } from "@/components/forms/unit-field";

// Generic, so it lives with the shared unit helpers; re-exported for the rig form's existing imports.
export type { Editable };

/**
 * What the form holds while the user types: every number of the profile may be text with units
 * ("0.1 psi") until the resolver converts it to the canonical unit (rig-units.ts).
 */
export type RigFormValues = Editable<RigInput>;

export interface RigField {
  path: FieldPath<RigFormValues>;
  label: string;
  /** The canonical unit the value is stored in, shown beside the input. */
  unit: string;
  /** The quantity typed units are converted as (lib/units); plain counts and ratios take bare numbers. */
  quantity: Quantity | ((values: RigFormValues) => Quantity);
  hint?: string;
}

export interface RigFieldGroup {
  title: string;
  description: string;
  fields: RigField[];
}

/** The orifice coefficient is a flow (at 10 cmH2O); the linear one a flow per cmH2O, taken as a bare number. */
const leakQuantity = (values: RigFormValues): Quantity => (values.circuit?.leak?.kind === "orifice" ? "flow" : "dimensionless");

export const RIG_FIELD_GROUPS: RigFieldGroup[] = [
  {
    title: "Actuator",
    description: "Stepper drive and arm: sets how fast the arm can squeeze the bag.",
    fields: [
      { path: "actuator.stepsPerRev", label: "Steps per revolution", unit: "steps", quantity: "dimensionless" },
      { path: "actuator.microstepping", label: "Microstepping", unit: "×", quantity: "dimensionless" },
      { path: "actuator.driveRatio", label: "Drive ratio", unit: "motor rev / arm rev", quantity: "dimensionless" },
      { path: "actuator.maxPulseRateHz", label: "Maximum pulse rate", unit: "Hz", quantity: "frequency" },
      { path: "actuator.maxAccelHzPerS", label: "Maximum acceleration", unit: "Hz/s", quantity: "pulseAcceleration" },
      { path: "actuator.armTravelDeg", label: "Arm travel", unit: "deg", quantity: "angle", hint: "rest to full squeeze" },
      { path: "actuator.returnSpeedDegPerS", label: "Arm return speed", unit: "deg/s", quantity: "angularSpeed" },
    ],
  },
  {
    title: "Circuit",
    description: "Tubing and mask between the bag and the patient.",
    fields: [
      { path: "circuit.complianceMlPerCmH2O", label: "Circuit compliance", unit: "mL/cmH2O", quantity: "compliance" },
      {
        path: "circuit.expiratoryResistanceCmH2OPerLps",
        label: "Expiratory resistance",
        unit: "cmH2O/(L/s)",
        quantity: "resistance",
      },
      { path: "circuit.inletCrackingCmH2O", label: "Inlet valve cracking pressure", unit: "cmH2O", quantity: "pressure" },
      {
        path: "circuit.leak.coefficient",
        label: "Leak coefficient",
        unit: "L/min",
        quantity: leakQuantity,
        hint: "orifice: L/min at 10 cmH2O; linear: L/min per cmH2O (a bare number)",
      },
    ],
  },
  {
    title: "Valves",
    description: "Mechanical valves on the expiratory limb and the relief port.",
    fields: [{ path: "reliefValveCmH2O", label: "Relief valve opening pressure", unit: "cmH2O", quantity: "pressure" }],
  },
  {
    title: "Sensor",
    description: "What the controller sees: lag, noise and resolution of the pressure and flow sensors.",
    fields: [
      { path: "sensor.pressureLagS", label: "Pressure lag", unit: "s", quantity: "time" },
      { path: "sensor.pressureNoiseCmH2O", label: "Pressure noise", unit: "cmH2O", quantity: "pressure" },
      { path: "sensor.pressureResolutionCmH2O", label: "Pressure resolution", unit: "cmH2O", quantity: "pressure" },
      { path: "sensor.flowLagS", label: "Flow lag", unit: "s", quantity: "time" },
      { path: "sensor.flowNoiseLpm", label: "Flow noise", unit: "L/min", quantity: "flow" },
      { path: "sensor.flowResolutionLpm", label: "Flow resolution", unit: "L/min", quantity: "flow" },
    ],
  },
  {
    title: "Controller",
    description: "How often the sequence runs its checks.",
    fields: [{ path: "scanPeriodS", label: "Scan period", unit: "s", quantity: "time", hint: "0.01 s = 100 scans per second" }],
  },
];

/** The PEEP valve has its own input (it may follow the sequence instead); typed like the fields above. */
export const PEEP_VALVE_FIELD: RigField = {
  path: "peepValveCmH2O",
  label: "PEEP valve",
  unit: "cmH2O",
  quantity: "pressure",
};

/** The bag calibration columns, per row. */
export const CALIBRATION_FIELDS = {
  angleDeg: { label: "Angle", unit: "deg", quantity: "angle" },
  volumeMl: { label: "Bag volume", unit: "mL", quantity: "volume" },
} as const satisfies Record<string, { label: string; unit: string; quantity: Quantity }>;
