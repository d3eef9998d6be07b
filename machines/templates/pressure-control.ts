/** Time-cycled pressure control: every breath is mandatory, at RR, with Pinsp above PEEP for Ti. */
import { FORMAT_ID, type SequenceDefinitionInput } from "../schema";
import {
  PEEP,
  PINSP,
  PLIMIT,
  RISE,
  RR,
  TI,
  apneaMonitor,
  highPressureExit,
  highPressureStep,
  lowPressureMonitor,
  standbyStep,
  toStandby,
} from "./common";

export const pressureControl: SequenceDefinitionInput = {
  format: FORMAT_ID,
  name: "Pressure control",
  description: "Time-cycled breaths at a set rate; the driver holds PEEP + Pinsp for Ti, then releases to PEEP.",
  settings: {
    PEEP,
    Pinsp: PINSP(15),
    RR: RR(15),
    Ti: TI(1),
    rise: RISE,
    Plimit: PLIMIT,
    Te: { label: "Expiratory time", unit: "s", formula: "60 / RR - Ti", min: 0.1, max: 60 },
  },
  monitors: [
    lowPressureMonitor("min(Ti, rise + 0.3)", "PEEP + 0.5 * Pinsp"),
    apneaMonitor("60 / RR + 5", "No breath for 5 s past the set breath period"),
  ],
  machine: {
    id: "pressureControl",
    initial: "inhale",
    states: {
      inhale: {
        meta: {
          kind: "inhale",
          label: "Inspiration",
          command: { kind: "pressure", target: "PEEP + Pinsp", rise: "rise" },
        },
        after: { Ti: { target: "exhale" } },
        on: { SCAN: [highPressureExit], ...toStandby },
      },
      exhale: {
        meta: { kind: "exhale", label: "Expiration", command: { kind: "release" } },
        after: { Te: { target: "inhale", meta: { label: "next breath" } } },
        on: toStandby,
      },
      highPressure: highPressureStep("inhale", "max(0.2, 60 / RR - tBreath)"),
      standby: standbyStep("inhale"),
    },
  },
};
