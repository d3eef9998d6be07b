/**
 * Building blocks shared by the built-in templates: settings, alarms, guards and the safe steps.
 * Templates are ordinary sequence definitions (machines/schema.ts); these helpers only avoid repeating
 * the same JSON five times.
 */
import type { AlarmSpec, SequenceDefinitionInput } from "../schema";

type Settings = SequenceDefinitionInput["settings"];
type States = SequenceDefinitionInput["machine"]["states"];
type StateInput = States[string];

export const guard = (expr: string) => ({ type: "formula" as const, params: { expr } });

export const PEEP: Settings[string] = {
  label: "PEEP",
  unit: "cmH2O",
  value: 5,
  min: 0,
  // MHRA RMVS v1 asks for PEEP 5–25 cmH2O; 0 is allowed for bench tests without PEEP.
  max: 25,
  step: 1,
  description: "End-expiratory pressure the PEEP valve holds.",
};

/** Fastest rate a template allows: MHRA RMVS v1 asks for 10–30 /min. */
export const RR_MAX = 30;

/**
 * The shortest breath period the templates allow (60 / RR_MAX = 2 s). Inspiration (Ti, plus any pause)
 * must fit inside it at every allowed setting, so the expiratory timer `60 / RR - Ti - …` is never negative.
 */
export const SHORTEST_PERIOD_S = 60 / RR_MAX;

export const RR = (value: number, label = "Rate"): Settings[string] => ({
  label,
  unit: "/min",
  value,
  min: 10,
  max: RR_MAX,
  step: 1,
  description: "Breaths per minute.",
});

/** `max` defaults to the whole shortest period; a template with a pause after Ti passes a smaller one. */
export const TI = (value: number, label = "Inspiratory time", max = SHORTEST_PERIOD_S): Settings[string] => ({
  label,
  unit: "s",
  value,
  min: 0.2,
  max,
  step: 0.05,
});

export const RISE: Settings[string] = {
  label: "Rise time",
  unit: "s",
  value: 0.1,
  min: 0,
  max: 2,
  step: 0.05,
  description: "Time the pressure takes to ramp from PEEP to the inspiratory pressure.",
};

export const PINSP = (value: number, label = "Inspiratory pressure"): Settings[string] => ({
  label,
  unit: "cmH2O",
  value,
  min: 1,
  max: 50,
  step: 1,
  description: "Inspiratory pressure above PEEP.",
});

/**
 * High-pressure limit (absolute, as sensed). Default 38 cmH2O: the electronic limit trips 2 cmH2O before the
 * 40 cmH2O mechanical relief valve that MHRA RMVS v1 requires, and above the highest pressure of the ISO
 * 80601-2-12 Table 201.105 test-lung rows (30 + 5 hPa ≈ 35.7 cmH2O), so those bench cases run untripped.
 */
export const PLIMIT: Settings[string] = {
  label: "High-pressure limit",
  unit: "cmH2O",
  value: 38,
  min: 10,
  max: 60,
  step: 1,
  description: "Inspiration stops, the circuit is released and an alarm is raised when airway pressure exceeds this.",
};

export const TRIGGER: Settings[string] = {
  label: "Trigger",
  options: ["pressure", "flow"],
  value: "pressure",
  description: "What detects the patient's effort: a pressure drop below PEEP, or inspiratory flow.",
};

export const SENSITIVITY: Settings[string] = {
  label: "Trigger sensitivity",
  // One setting serves both triggers, as the product spec asks: cmH2O below PEEP for a pressure trigger,
  // L/min for a flow trigger; typical 1–2 cmH2O or ~2 L/min (textbook reproductions; common practice
  // "Triggering and synchrony"). The bare unit is the fallback for a trigger option unitBy does not list.
  unit: "",
  unitBy: { setting: "trigger", units: { pressure: "cmH2O", flow: "L/min" } },
  value: 2,
  min: 0.2,
  max: 20,
  step: 0.1,
  description: "Pressure trigger: cmH2O below PEEP. Flow trigger: L/min into the patient.",
};

/**
 * Patient trigger, checked every scan while waiting. The 50 ms lockout after entering the step keeps the
 * valve-switching transient at the start of expiration from being taken for an effort (common practice).
 */
export const TRIGGER_GUARD =
  'tStep >= 0.05 and (trigger == "pressure" ? paw <= PEEP - sensitivity : flow >= sensitivity)';

export const HIGH_PRESSURE_ALARM: AlarmSpec = {
  kind: "high-pressure",
  message: "Airway pressure above the limit: inspiration stopped, circuit released",
  priority: "high",
};

export const highPressureExit = {
  target: "highPressure",
  guard: guard("paw > Plimit"),
  meta: { label: "pressure limit" },
};

export const toStandby = { STOP: { target: "standby", meta: { label: "operator stop" } } };

/** Safe step after a high-pressure exit: release, alarm, then resume at `resume` after `delay` s. */
export function highPressureStep(resume: string, delay: string): StateInput {
  return {
    meta: {
      kind: "safe",
      label: "Pressure limit",
      command: { kind: "release" },
      alarms: [HIGH_PRESSURE_ALARM],
      breathStart: false,
      description: "Entered when airway pressure exceeds Plimit during inspiration.",
    },
    after: { [delay]: { target: resume, meta: { label: "resume" } } },
    on: toStandby,
  };
}

export function standbyStep(start: string): StateInput {
  return {
    meta: {
      kind: "safe",
      label: "Standby",
      command: { kind: "release" },
      breathStart: false,
      description: "Not ventilating: the operator stopped the sequence. START resumes.",
    },
    on: { START: { target: start, meta: { label: "operator start", cause: "operator" } } },
  };
}

/**
 * Low pressure / disconnection: by `after` s into a breath the sensed peak pressure should have passed
 * `threshold`; it re-arms at every breath start (tBreath resets), so a disconnection alarms every breath.
 */
export const lowPressureMonitor = (after: string, threshold: string) => ({
  when: `breathCount > 0 and tBreath >= ${after} and peakPaw < ${threshold}`,
  alarm: {
    kind: "low-pressure",
    message: "Inspiratory pressure not reached: check for a disconnection or a large leak",
    priority: "high" as const,
  },
});

export const apneaMonitor = (limit: string, message: string) => ({
  when: `tBreath >= ${limit}`,
  alarm: { kind: "apnea", message, priority: "high" as const },
});
