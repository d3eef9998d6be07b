/**
 * Pressure support: every breath is started by the patient and supported at PS above PEEP until the
 * inspiratory flow falls to `cycle` % of its peak. With no trigger for `apnea` s, pressure-control backup
 * breaths (Pinsp, RR, Ti) run until the patient triggers again.
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

const patientTrigger = { target: "support", guard: guard(TRIGGER_GUARD), meta: { label: "patient trigger" } };

export const pressureSupport: SequenceDefinitionInput = {
  format: FORMAT_ID,
  name: "Pressure support",
  description:
    "Patient-triggered breaths supported at PS above PEEP, cycled off when inspiratory flow falls to cycle % of its peak; pressure-control backup after apnea s without a trigger.",
  settings: {
    PEEP,
    PS: {
      label: "Pressure support",
      unit: "cmH2O",
      value: 10,
      min: 1,
      max: 40,
      step: 1,
      description: "Inspiratory pressure above PEEP for supported breaths.",
    },
    rise: RISE,
    cycle: {
      label: "Cycle-off flow",
      unit: "%",
      // 25 % of peak flow is the usual default for flow cycling (common practice).
      value: 25,
      min: 5,
      max: 80,
      step: 5,
      description: "Inspiration ends when flow falls to this percentage of its peak.",
    },
    trigger: TRIGGER,
    sensitivity: SENSITIVITY,
    TiMax: {
      label: "Longest supported inspiration",
      unit: "s",
      value: 2,
      min: 0.5,
      max: 5,
      step: 0.1,
      description: "Time-cycle backup for a supported breath whose flow never falls to the cycle-off level (leak).",
    },
    apnea: { label: "Apnea time", unit: "s", value: 20, min: 5, max: 60, step: 1 },
    Pinsp: PINSP(15, "Backup inspiratory pressure"),
    RR: RR(12, "Backup rate"),
    Ti: TI(1, "Backup inspiratory time"),
    Plimit: PLIMIT,
    Te: { label: "Backup expiratory time", unit: "s", formula: "60 / RR - Ti", min: 0.1, max: 60 },
  },
  monitors: [
    lowPressureMonitor("0.5 * rise + 0.05", "PEEP + 0.25 * min(PS, Pinsp)"),
    apneaMonitor("apnea", "Apnea: no breath for the apnea time; backup breaths started"),
  ],
  machine: {
    id: "pressureSupport",
    initial: "expire",
    states: {
      expire: {
        meta: { kind: "wait-for-trigger", label: "Expiration, waiting for a trigger", command: { kind: "release" } },
        on: { SCAN: [patientTrigger], ...toStandby },
        after: { "max(0, apnea - tBreath)": { target: "backupInhale", meta: { label: "apnea backup" } } },
      },
      support: {
        meta: {
          kind: "inhale",
          label: "Supported inspiration",
          command: { kind: "pressure", target: "PEEP + PS", rise: "rise" },
        },
        on: {
          SCAN: [
            highPressureExit,
            {
              target: "expire",
              guard: guard("tStep >= 0.1 and flow <= cycle / 100 * peakFlow"),
              meta: { label: "flow cycle-off" },
            },
          ],
          ...toStandby,
        },
        after: { TiMax: { target: "expire", meta: { label: "time cycle-off" } } },
      },
      backupInhale: {
        meta: {
          kind: "inhale",
          label: "Backup inspiration",
          command: { kind: "pressure", target: "PEEP + Pinsp", rise: "rise" },
        },
        after: { Ti: { target: "backupExhale" } },
        on: { SCAN: [highPressureExit], ...toStandby },
      },
      backupExhale: {
        meta: { kind: "wait-for-trigger", label: "Backup expiration", command: { kind: "release" } },
        on: { SCAN: [patientTrigger], ...toStandby },
        after: { "max(0, 60 / RR - tBreath)": { target: "backupInhale", meta: { label: "backup breath" } } },
      },
      highPressure: highPressureStep("expire", "0.2"),
      standby: standbyStep("expire"),
    },
  },
};
