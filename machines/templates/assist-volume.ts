/**
 * Assisted volume control: volume-control breaths that the patient may start; a mandatory breath follows
 * when no trigger comes within 60/RR of the last breath start.
 */
import { FORMAT_ID, type SequenceDefinitionInput } from "../schema";
import {
  SENSITIVITY,
  TRIGGER,
  TRIGGER_GUARD,
  apneaMonitor,
  guard,
  highPressureStep,
  lowPressureMonitor,
  standbyStep,
  toStandby,
} from "./common";
import { VOLUME_SETTINGS, volumeHold, volumeInhale, withExhaleTarget } from "./volume-control";

export const assistVolume: SequenceDefinitionInput = {
  format: FORMAT_ID,
  name: "Assisted volume control",
  description:
    "Volume-control breaths started by the patient's effort (pressure or flow trigger) or, failing one within 60/RR of the last breath, by the timer.",
  settings: { ...VOLUME_SETTINGS, trigger: TRIGGER, sensitivity: SENSITIVITY },
  monitors: [
    lowPressureMonitor("Ti", "PEEP + 2"),
    apneaMonitor("60 / RR + 5", "No breath for 5 s past the set breath period"),
  ],
  machine: {
    id: "assistVolume",
    initial: "inhale",
    states: {
      inhale: withExhaleTarget(volumeInhale, "expire"),
      hold: withExhaleTarget(volumeHold, "expire"),
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
