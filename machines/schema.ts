/**
 * The Tidewright sequence format, version 1.
 *
 * A sequence is an XState v5 machine config in pure JSON (`machine`) plus our metadata:
 * every state carries `meta.kind` (the step kind) and `meta.command` (what the rig does while in it);
 * transitions are XState `after` timers (the key is a setting name or a formula in seconds),
 * guarded transitions on the controller's `SCAN` event (guard `{ type: "formula", params: { expr } }`),
 * and named operator/fault events. Array order of a step's `SCAN` transitions is their priority.
 *
 * Units inside the definition are canonical: pressure cmH2O, volume mL, flow L/min, time s,
 * rate /min, angle deg, pulse rate Hz. Formulas see plain numbers in these units.
 *
 * This file is the contract shared by the engine, the static checks, the designer and the server:
 * change it only with all of them in mind.
 */
import { z } from "zod";

export const FORMAT_ID = "tidewright.sequence/1" as const;

/** Identifier for steps, settings and signals: starts with a letter, then letters, digits or `_`. */
export const identifier = z
  .string()
  .regex(/^[A-Za-z][A-Za-z0-9_]*$/, "use letters, digits and _ only, starting with a letter")
  .max(40, "keep names to 40 characters");

export const STEP_KINDS = ["inhale", "hold", "exhale", "wait-for-trigger", "safe", "custom"] as const;
export const stepKind = z.enum(STEP_KINDS);
export type StepKind = z.infer<typeof stepKind>;

/** Operator and fault events a sequence may react to (besides the controller's own SCAN). */
export const SEQUENCE_EVENTS = ["START", "STOP", "TAKEOVER", "RESUME", "SENSOR_FAULT", "RESET"] as const;
export const sequenceEvent = z.enum(SEQUENCE_EVENTS);
export type SequenceEvent = z.infer<typeof sequenceEvent>;

/** A formula over signals and settings (mathjs syntax, restricted instance). Evaluated in canonical units. */
export const formula = z.string().trim().min(1, "formula is empty").max(400, "formula is too long");

/**
 * Command to the rig's driver while a step is active.
 * - flow: deliver a constant flow (L/min) into the circuit; expiratory valve closed.
 * - pressure: drive the circuit to `target` (absolute, cmH2O) with a linear rise over `rise` (s); valve closed.
 * - arm: drive the bag-compressor arm to `angle` (deg) at `pulseRate` (Hz) step pulses; valve closed.
 * - release: driver off / arm returns, expiratory path through the PEEP valve open.
 * - hold: driver still, expiratory valve closed (inspiratory pause).
 * Every number is a formula so it can name settings (`"Vt / Ti * 60 / 1000"`).
 */
export const command = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("flow"), flow: formula }),
  z.object({ kind: z.literal("pressure"), target: formula, rise: formula.default("0") }),
  z.object({ kind: z.literal("arm"), angle: formula, pulseRate: formula }),
  z.object({ kind: z.literal("release") }),
  z.object({ kind: z.literal("hold") }),
]);
export type Command = z.infer<typeof command>;

export const alarmPriority = z.enum(["high", "medium", "low"]);
export const alarmSpec = z.object({
  kind: z.string().min(1).max(40),
  message: z.string().min(1).max(200),
  priority: alarmPriority.default("medium"),
});
export type AlarmSpec = z.infer<typeof alarmSpec>;

/** Where a breath came from, for the breath table: inferred from the transition unless `meta.cause` says. */
export const breathCause = z.enum(["patient", "timer", "operator"]);
export type BreathCause = z.infer<typeof breathCause>;

export const transitionMeta = z
  .object({ label: z.string().max(80).optional(), cause: breathCause.optional() })
  .strict();

export const formulaGuard = z
  .object({ type: z.literal("formula"), params: z.object({ expr: formula }).strict() })
  .strict();

export const transition = z
  .object({
    target: identifier,
    guard: formulaGuard.optional(),
    meta: transitionMeta.optional(),
  })
  .strict();
export type Transition = z.infer<typeof transition>;

const transitionList = z.union([transition, z.array(transition)]);

export const stepMeta = z
  .object({
    kind: stepKind,
    label: z.string().max(80).optional(),
    command,
    /** Alarms raised on entry into the step. */
    alarms: z.array(alarmSpec).default([]),
    /** Entering this step starts a breath. Defaults to true for `inhale` steps. */
    breathStart: z.boolean().optional(),
    description: z.string().max(500).optional(),
  })
  .strict();
export type StepMeta = z.infer<typeof stepMeta>;

export const state = z
  .object({
    meta: stepMeta,
    /** Timers: key = setting name or formula (seconds). */
    after: z.record(z.string().min(1), transitionList).optional(),
    /** `SCAN` holds the guarded transitions checked every controller scan, in priority order. */
    on: z.partialRecord(z.enum(["SCAN", ...SEQUENCE_EVENTS]), transitionList).optional(),
  })
  .strict();
export type StateConfig = z.infer<typeof state>;

export const machineConfig = z
  .object({
    id: identifier,
    initial: identifier,
    states: z.record(identifier, state),
  })
  .strict();
export type MachineConfig = z.infer<typeof machineConfig>;

/**
 * A unit that depends on a choice setting: `{ setting: "trigger", units: { pressure: "cmH2O", flow: "L/min" } }`
 * makes a trigger sensitivity cmH2O while `trigger` is "pressure" and L/min while it is "flow". Options
 * not listed keep the setting's own `unit`. That the named setting exists and is a choice whose options
 * include every key is a static check (setting-unit-by-invalid), since it needs the other settings.
 */
export const unitBy = z
  .object({
    setting: identifier,
    units: z.record(z.string().min(1), z.string().max(20)),
  })
  .strict();
export type UnitBy = z.infer<typeof unitBy>;

/**
 * A named value with units and bounds. `value` is the default; `formula` makes it derived
 * (then `value` is ignored). `options` makes it a choice (value is one of the strings).
 */
export const setting = z
  .object({
    label: z.string().max(80).optional(),
    unit: z.string().max(20).default(""),
    /** Optional: the unit follows a choice setting (see `unitBy`); `unit` is the fallback. */
    unitBy: unitBy.optional(),
    value: z.union([z.number(), z.string()]).optional(),
    min: z.number().optional(),
    max: z.number().optional(),
    step: z.number().positive().optional(),
    options: z.array(z.string().min(1)).optional(),
    formula: formula.optional(),
    description: z.string().max(500).optional(),
  })
  .strict();
export type Setting = z.infer<typeof setting>;

/**
 * The unit a setting has right now: the one its `unitBy` lists for the choice's current value, else its
 * own `unit`. `values` overrides the saved choice values (a run's or the CLI's settings).
 */
export function effectiveUnit(
  s: Pick<Setting, "unit" | "unitBy">,
  settings: Readonly<Record<string, Pick<Setting, "value">>>,
  values: Readonly<Record<string, number | string>> = {},
): string {
  if (!s.unitBy) return s.unit ?? "";
  const choice = values[s.unitBy.setting] ?? settings[s.unitBy.setting]?.value;
  return typeof choice === "string" && Object.hasOwn(s.unitBy.units, choice) ? s.unitBy.units[choice] : (s.unit ?? "");
}

/** Conditions watched every scan whatever the step; raise an alarm on the rising edge. */
export const monitor = z
  .object({ when: formula, alarm: alarmSpec })
  .strict();
export type Monitor = z.infer<typeof monitor>;

export const sequenceDefinition = z
  .object({
    format: z.literal(FORMAT_ID),
    name: z.string().min(1).max(120),
    description: z.string().max(2000).optional(),
    settings: z.record(identifier, setting),
    monitors: z.array(monitor).default([]),
    machine: machineConfig,
  })
  .strict();
export type SequenceDefinition = z.infer<typeof sequenceDefinition>;
export type SequenceDefinitionInput = z.input<typeof sequenceDefinition>;

/** Canvas layout, stored beside the definition (not part of its hash). */
export const sequenceLayout = z.object({
  nodes: z.record(z.string(), z.object({ x: z.number(), y: z.number() })),
});
export type SequenceLayout = z.infer<typeof sequenceLayout>;

/**
 * Signals a formula can read each scan (besides every setting). Values are the controller's view:
 * sensor outputs, not the true plant state.
 */
export const SIGNALS = {
  paw: { unit: "cmH2O", description: "airway (mask) pressure as sensed" },
  flow: { unit: "L/min", description: "flow into the patient as sensed (negative when exhaling)" },
  vol: { unit: "mL", description: "volume delivered since the breath started (integrated sensed flow)" },
  peakFlow: { unit: "L/min", description: "highest inspiratory flow so far in this breath" },
  peakPaw: { unit: "cmH2O", description: "highest airway pressure so far in this breath (as sensed)" },
  tStep: { unit: "s", description: "time in the current step" },
  tBreath: { unit: "s", description: "time since the current breath started" },
  arm: { unit: "deg", description: "bag-compressor arm angle (0 = at rest)" },
  breathCount: { unit: "", description: "breaths started so far in the run (0 before the first)" },
} as const;
export type SignalName = keyof typeof SIGNALS;
