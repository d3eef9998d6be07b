/** Constant-flow volume control: Vt delivered over Ti, optional inspiratory pause, mandatory breaths at RR. */
import { FORMAT_ID, type SequenceDefinitionInput } from "../schema";
import {
  PEEP,
  PLIMIT,
  RR,
  SHORTEST_PERIOD_S,
  TI,
  apneaMonitor,
  guard,
  highPressureExit,
  highPressureStep,
  lowPressureMonitor,
  standbyStep,
  toStandby,
} from "./common";

type Settings = SequenceDefinitionInput["settings"];

/** Longest pause; the flow time gets the rest of the shortest period, so Ti + pause never outlasts a breath. */
const PAUSE_MAX_S = 0.5;

export const VOLUME_SETTINGS: Settings = {
  PEEP,
  // 400 mL is the tidal volume MHRA RMVS v1 requires (ideally 350–450, optionally 250–600).
  Vt: { label: "Tidal volume", unit: "mL", value: 400, min: 50, max: 2000, step: 10 },
  RR: RR(15),
  Ti: TI(1, "Flow time", SHORTEST_PERIOD_S - PAUSE_MAX_S),
  pause: {
    label: "Inspiratory pause",
    unit: "s",
    value: 0.2,
    min: 0,
    max: PAUSE_MAX_S,
    step: 0.05,
    description: "Hold after the flow, valve closed: the plateau pressure is read at its end.",
  },
  Plimit: PLIMIT,
  Finsp: { label: "Inspiratory flow", unit: "L/min", formula: "Vt / Ti * 60 / 1000", min: 1, max: 180 },
  Te: { label: "Expiratory time", unit: "s", formula: "60 / RR - Ti - pause", min: 0.1, max: 60 },
};

export const volumeInhale = {
  meta: { kind: "inhale" as const, label: "Inspiration (flow)", command: { kind: "flow" as const, flow: "Finsp" } },
  after: {
    Ti: [
      { target: "hold", guard: guard("pause > 0"), meta: { label: "pause" } },
      { target: "exhaleStep", meta: { label: "no pause" } },
    ],
  },
  on: { SCAN: [highPressureExit], ...toStandby },
};

export const volumeHold = {
  meta: {
    kind: "hold" as const,
    label: "Inspiratory pause",
    command: { kind: "hold" as const },
  },
  after: { pause: { target: "exhaleStep" } },
  on: { SCAN: [highPressureExit], ...toStandby },
};

/** Replace the placeholder target `exhaleStep` by the template's own expiratory step. */
export function withExhaleTarget<T>(state: T, target: string): T {
  return JSON.parse(JSON.stringify(state).replaceAll('"exhaleStep"', JSON.stringify(target))) as T;
}

export const volumeControl: SequenceDefinitionInput = {
  format: FORMAT_ID,
  name: "Volume control",
  description:
    "Constant-flow breaths: Vt over Ti, an optional pause for the plateau reading, expiration for 60/RR − Ti − pause.",
  settings: VOLUME_SETTINGS,
  monitors: [
    lowPressureMonitor("Ti", "PEEP + 2"),
    apneaMonitor("60 / RR + 5", "No breath for 5 s past the set breath period"),
  ],
  machine: {
    id: "volumeControl",
    initial: "inhale",
    states: {
      inhale: withExhaleTarget(volumeInhale, "exhale"),
      hold: withExhaleTarget(volumeHold, "exhale"),
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
