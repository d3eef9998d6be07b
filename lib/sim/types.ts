/**
 * Contract of the simulation engine: what goes in (patient case, rig profile, run options) and
 * what comes out (waveforms, breaths, summary, alarms). Pure data, shared by the CLI, the server
 * runs, the designer's live preview and the database (patient cases and rig profiles are stored
 * as these shapes in JSON columns, validated on write and on read).
 *
 * Units in these shapes are the product's canonical display units (the names say so);
 * the engine converts to its internal units (cmH2O, L, L/s, s) at the edge.
 */
import { z } from "zod";

const positive = (what: string) => z.number({ error: `${what} must be a number` }).positive(`${what} must be above 0`);
const nonNegative = (what: string) =>
  z.number({ error: `${what} must be a number` }).min(0, `${what} cannot be negative`);

export const EFFORT_SHAPES = ["none", "half-sine", "ramp", "parabolic-exp"] as const;

export const effortSchema = z
  .object({
    shape: z.enum(EFFORT_SHAPES).default("none"),
    /** Peak muscle pressure, cmH2O. */
    amplitudeCmH2O: nonNegative("effort amplitude").max(50).default(0),
    /** Patient's own breathing rate, /min. */
    ratePerMin: positive("effort rate").max(80).default(15),
    /** Inspiratory effort duration, s. */
    effortTimeS: positive("effort time").max(5).default(0.8),
    /** Time of the first effort onset after the run starts, s. */
    onsetS: nonNegative("effort onset").max(600).default(1),
    /** Breath-to-breath variability as a fraction (0 = regular, 0.3 = ±30 % interval and amplitude). */
    variability: nonNegative("effort variability").max(1).default(0),
  })
  .strict();
export type Effort = z.infer<typeof effortSchema>;

export const leakSchema = z
  .object({
    kind: z.enum(["none", "orifice", "linear"]).default("none"),
    /** orifice: L/min at 10 cmH2O (Q ∝ √P); linear: L/min per cmH2O. */
    coefficient: nonNegative("leak coefficient").max(200).default(0),
  })
  .strict();
export type Leak = z.infer<typeof leakSchema>;

export const patientSchema = z
  .object({
    complianceMlPerCmH2O: positive("compliance").max(500),
    resistanceCmH2OPerLps: positive("resistance").max(500),
    /** Non-linear elastance term E2 in E(V) = E1 + E2·V, cmH2O/L² (0 = linear lung). */
    e2CmH2OPerL2: nonNegative("non-linear elastance").max(500).default(0),
    effort: effortSchema.default({
      shape: "none",
      amplitudeCmH2O: 0,
      ratePerMin: 15,
      effortTimeS: 0.8,
      onsetS: 1,
      variability: 0,
    }),
    leak: leakSchema.default({ kind: "none", coefficient: 0 }),
  })
  .strict();
export type Patient = z.infer<typeof patientSchema>;
export type PatientInput = z.input<typeof patientSchema>;

export const calibrationPoint = z.object({ angleDeg: nonNegative("angle"), volumeMl: nonNegative("bag volume") }).strict();

export const rigSchema = z
  .object({
    name: z.string().min(1).max(120).default("Rig"),
    actuator: z
      .object({
        stepsPerRev: positive("steps per revolution").int().max(100000),
        microstepping: positive("microstepping").int().max(256),
        /** Motor revolutions per arm revolution. */
        driveRatio: positive("drive ratio").max(1000),
        maxPulseRateHz: positive("maximum pulse rate").max(1e6),
        maxAccelHzPerS: positive("maximum acceleration").max(1e8),
        /** Arm travel from rest to full squeeze, deg. */
        armTravelDeg: positive("arm travel").max(360),
        /** Arm return speed during release, deg/s. */
        returnSpeedDegPerS: positive("arm return speed").max(10000).default(180),
      })
      .strict(),
    /** Bag displaced volume versus arm angle, ascending angle; first point should be (0, 0). */
    bagCalibration: z.array(calibrationPoint).min(2, "the bag calibration needs at least two points"),
    circuit: z
      .object({
        complianceMlPerCmH2O: nonNegative("circuit compliance").max(50),
        leak: leakSchema.default({ kind: "none", coefficient: 0 }),
        /** Expiratory limb resistance, cmH2O/(L/s). */
        expiratoryResistanceCmH2OPerLps: positive("expiratory resistance").max(200).default(3),
        /** Inspiratory inlet (one-way) valve cracking pressure below ambient, cmH2O. */
        inletCrackingCmH2O: nonNegative("inlet cracking pressure").max(20).default(1),
        /** Inlet valve resistance once open, cmH2O/(L/s). */
        inletResistanceCmH2OPerLps: positive("inlet resistance").max(200).default(2),
      })
      .strict(),
    /** Mechanical PEEP valve setting, cmH2O; null = the valve follows the sequence's PEEP setting. */
    peepValveCmH2O: nonNegative("PEEP valve").max(40).nullable().default(null),
    /** Relief (pop-off) valve opening pressure, cmH2O. */
    reliefValveCmH2O: positive("relief valve").max(120),
    /** Relief valve resistance above its opening pressure, cmH2O/(L/s) (its flow curve, linearised). */
    reliefResistanceCmH2OPerLps: positive("relief valve resistance").max(100).default(1),
    sensor: z
      .object({
        pressureLagS: nonNegative("pressure sensor lag").max(1),
        pressureNoiseCmH2O: nonNegative("pressure noise").max(5),
        pressureResolutionCmH2O: nonNegative("pressure resolution").max(5),
        flowLagS: nonNegative("flow sensor lag").max(1),
        flowNoiseLpm: nonNegative("flow noise").max(20),
        flowResolutionLpm: nonNegative("flow resolution").max(20),
      })
      .strict(),
    scanPeriodS: positive("scan period").max(1),
  })
  .strict();
export type Rig = z.infer<typeof rigSchema>;
export type RigInput = z.input<typeof rigSchema>;

export type TriggerSource = "patient" | "timer" | "operator";

export interface Breath {
  index: number;
  start: number; // s
  trigger: TriggerSource;
  effortOnset: number | null; // s
  latencyMs: number | null;
  pip: number; // cmH2O
  pplat: number | null; // cmH2O
  peep: number; // cmH2O, end-expiratory
  vti: number; // mL
  vte: number; // mL
  ti: number; // s
  te: number; // s
  ie: number | null; // Te/Ti expressed as 1:x → x
  peakFlow: number; // L/min
  reliefVolume: number; // mL
  /** asynchrony flags on this breath */
  flags: Array<"double-trigger" | "auto-trigger" | "short-cycle" | "prolonged-cycle">;
}

export interface Alarm {
  t: number; // s
  kind: string;
  message: string;
  priority: "high" | "medium" | "low";
}

export interface Summary {
  breaths: number;
  pip: number | null;
  pplat: number | null;
  peep: number | null;
  vti: number | null;
  vte: number | null;
  rr: number | null; // /min
  ie: number | null;
  minuteVolume: number | null; // L/min
  peakFlow: number | null;
  triggerLatencyMs: { mean: number | null; p95: number | null; max: number | null; n: number };
  asynchronyIndex: number | null; // %
  ineffectiveEfforts: number;
  doubleTriggers: number;
  autoTriggers: number;
  shortCycles: number;
  prolongedCycles: number;
  efforts: number;
}

/** Full-resolution waveforms, one sample per physics step (or per `sampleEvery` steps). */
export interface Waveforms {
  t: Float64Array; // s
  paw: Float32Array; // cmH2O, true airway pressure
  flow: Float32Array; // L/min into the patient
  volume: Float32Array; // mL above relaxed volume
  pmus: Float32Array; // cmH2O
  arm: Float32Array; // deg
  step: Uint16Array; // index into stepNames
}

export interface StepInterval {
  step: string;
  from: number;
  to: number;
}

export interface SimResult {
  stepNames: string[];
  waveforms: Waveforms;
  steps: StepInterval[];
  breaths: Breath[];
  efforts: Array<{ onset: number; end: number; amplitude: number; triggered: boolean }>;
  alarms: Alarm[];
  summary: Summary;
  /** Wall time the engine took, ms. */
  wallMs: number;
}

/** Options of one simulation. `lib/sim/simulate.ts` exports `simulate(options): SimResult`. */
export interface SimOptions {
  definition: import("@/machines/schema").SequenceDefinition;
  /** Overrides of the definition's setting values (canonical units). */
  settings?: Record<string, number | string>;
  patient: PatientInput;
  /** A rig profile, or "ideal": no circuit compliance, no leak, ideal PEEP valve, ideal driver. */
  rig: RigInput | "ideal";
  durationS: number; // 0 < d ≤ 600
  dtS?: number; // default 0.001
  /** Controller scan period; default the rig's scanPeriodS, or 0.01 on the ideal circuit. */
  scanS?: number;
  seed?: number; // default 1
  /** Seed of the effort variability alone (default: `seed`), so noise and effort can be varied apart. */
  effortSeed?: number;
  /** Wall-time budget, ms (default 20000): past it the run stops with an error. */
  wallBudgetMs?: number;
  /** Called now and then with the simulated fraction done (0..1). */
  onProgress?: (fraction: number) => void;
  /** Checked now and then; when it returns true the run stops with a "cancelled" error. */
  shouldStop?: () => boolean;
  /** Record one waveform sample every N physics steps (default 1 = full resolution). */
  sampleEvery?: number;
  /** Cap on step transitions within one scan (default 32); past it the run fails naming the looping steps. */
  maxTransitionsPerScan?: number;
  /**
   * Send the SCAN event to the actor on every scan (true) or only on scans where one of the active
   * step's SCAN guards passes (false, default). A SCAN that no guard accepts is a no-op in XState,
   * so both give identical runs; the default saves the actor's ~3.5 µs per idle scan.
   */
  sendEveryScan?: boolean;
}

/**
 * A simulation advanced in pieces (the designer's live preview). `lib/sim/simulate.ts` exports
 * `createSimulation(options): LiveSimulation`; `simulate()` is built on it.
 */
export interface LiveSimulation {
  readonly time: number; // s simulated so far
  readonly activeStep: string;
  /** Advance by whole scans until `seconds` more have been simulated. */
  advance(seconds: number): void;
  /** Advance exactly one controller scan. */
  stepScan(): void;
  /** Deliver an operator/fault event (START, STOP, TAKEOVER, RESUME, SENSOR_FAULT, RESET) at the next scan. */
  send(event: import("@/machines/schema").SequenceEvent): void;
  /** Samples recorded since the last call (for a scrolling trace), then forgets them. */
  drain(): { t: number[]; paw: number[]; flow: number[]; volume: number[]; step: string[] };
  /** Metrics so far (breaths, alarms, summary) and all waveforms recorded. */
  result(): SimResult;
}
