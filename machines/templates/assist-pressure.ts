/**
 * Assisted pressure control: pressure-control breaths that the patient may start; a mandatory breath
 * follows when no trigger comes within 60/RR of the last breath start.
 */
import { FORMAT_ID, type SequenceDefinitionInput } from "../schema";
import {
  PEEP,
  PINSP,
  PLIMIT,
  RISE,
  RR,
  SENSITIVITY,
  TI,
  TRIGGER,
  TRIGGER_GUARD,
  apneaMonitor,
  guard,
  highPressureExit,
  highPressureStep,
  lowPressureMonitor,
  standbyStep,
  toStandby,
} from "./common";

export const assistPressure: SequenceDefinitionInput = {
  format: FORMAT_ID,
  name: "Assisted pressure control",
  description:
    "Pressure-control breaths started by the patient's effort (pressure or flow trigger) or, failing one within 60/RR of the last breath, by the timer.",
  settings: {
    PEEP,
    Pinsp: PINSP(15),
    RR: RR(15),
    Ti: TI(1),
    rise: RISE,
    trigger: TRIGGER,
    sensitivity: SENSITIVITY,
    Plimit: PLIMIT,
    Te: { label: "Expiratory time (mandatory)", unit: "s", formula: "60 / RR - Ti", min: 0.1, max: 60 },
  },
  monitors: [
    lowPressureMonitor("min(Ti, rise + 0.3)", "PEEP + 0.5 * Pinsp"),
    apneaMonitor("60 / RR + 5", "No breath for 5 s past the set breath period"),
  ],
  machine: {
    id: "assistPressure",
    initial: "inhale",
    states: {
      inhale: {
        meta: {
          kind: "inhale",
          label: "Inspiration",
          command: { kind: "pressure", target: "PEEP + Pinsp", rise: "rise" },
        },
        after: { Ti: { target: "expire" } },
        on: { SCAN: [highPressureExit], ...toStandby },
      },
      expire: {
        meta: {
          kind: "wait-for-trigger",
          label: "Expiration, waiting for a trigger",
          command: { kind: "release" },
        },
        on: { SCAN: [{ target: "inhale", guard: guard(TRIGGER_GUARD), meta: { label: "patient trigger" } }], ...toStandby },
        after: { "max(0, 60 / RR - tBreath)": { target: "inhale", meta: { label: "mandatory breath" } } },
      },
      highPressure: highPressureStep("expire", "0.2"),
      standby: standbyStep("inhale"),
    },
  },
};
