/**
 * The engine's entry points: `createSimulation()` (advanced in pieces, the designer's live preview) and
 * `simulate()` (a whole run). Pure TypeScript, no Node imports: the same code runs on the server and in
 * the browser.
 *
 * Each controller scan (default 10 ms): read the sensors into the formula slots, check the monitors,
 * advance the simulated clock (XState `after` timers fire), deliver operator events, then the SCAN event
 * (see SimOptions.sendEveryScan), then run the physics for the scan's steps with the active command.
 */
import { createActor, type AnyActorRef } from "xstate";
import { ZodError } from "zod";
import { compile, SequenceError, type CompiledSequence, type CompiledStep, type SettingValues } from "@/machines/compile";
import { SIGNALS, type BreathCause, type SequenceEvent, type StepKind } from "@/machines/schema";
import { ScanClock } from "./clock";
import { LEAK_LINEAR, LEAK_NONE, LEAK_ORIFICE, type CircuitParams } from "./circuit";
import { DEFAULT_RIG } from "./default-rig";
import { CMD_ARM, CMD_FLOW, CMD_HOLD, CMD_PRESSURE, CMD_RELEASE, bagTable, pulsesPerDeg } from "./drivers";
import { effortSchedule, type EffortSchedule } from "./effort";
import { SimError } from "./errors";
import { computeMetrics, type BreathRecord } from "./metrics";
import { Plant, type PlantParams } from "./plant";
import { createRng, type Rng } from "./rng";
import {
  patientSchema,
  rigSchema,
  type Alarm,
  type LiveSimulation,
  type Patient,
  type Rig,
  type SimOptions,
  type SimResult,
  type StepInterval,
  type TriggerSource,
} from "./types";

export { SimError } from "./errors";

/** Longest run, s (ENGINE.md: a run never hangs). */
export const MAX_DURATION_S = 600;
const DEFAULT_WALL_BUDGET_MS = 20000;
const DEFAULT_MAX_TRANSITIONS = 32;
/** Check wall time, cancellation and progress every this many scans. */
const HOUSEKEEPING_SCANS = 50;

/** The "ideal" circuit's valve resistances, cmH2O/(L/s): small enough to be negligible, finite for the solver. */
const IDEAL_VALVE_RESISTANCE = 1e-4;

const now = (): number => (typeof performance !== "undefined" ? performance.now() : Date.now());

function zodMessage(what: string, e: ZodError): string {
  return `${what}: ` + e.issues.map((i) => `${i.path.join(".") || "(value)"}: ${i.message}`).join("; ");
}

function parseOrBadInput<T>(what: string, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof ZodError) throw new SimError("bad-input", zodMessage(what, e));
    throw e;
  }
}

interface PreparedRun {
  sequence: CompiledSequence;
  settings: SettingValues;
  patient: Patient;
  rig: Rig;
  ideal: boolean;
  dtS: number;
  scanS: number;
  stepsPerScan: number;
  durationS: number;
}

/**
 * Recently compiled sequences, keyed by the definition's JSON: the designer's preview and the benchmark
 * re-run the same definition, and compiling (zod, formulas, XState setup) costs more than a short run.
 * Keyed by content, not identity, so a definition edited in place is recompiled.
 */
const COMPILE_CACHE_SIZE = 16;
const compiled = new Map<string, CompiledSequence>();
function compileCached(definition: unknown): CompiledSequence {
  let key: string;
  try {
    key = JSON.stringify(definition);
  } catch {
    return compile(definition);
  }
  const hit = compiled.get(key);
  if (hit) return hit;
  const c = compile(definition);
  if (compiled.size >= COMPILE_CACHE_SIZE) compiled.delete(compiled.keys().next().value as string);
  compiled.set(key, c);
  return c;
}

function prepare(opts: SimOptions): PreparedRun {
  const sequence = compileCached(opts.definition);
  const settings = sequence.resolveSettings(opts.settings);
  const patient = parseOrBadInput("patient", () => patientSchema.parse(opts.patient));
  const ideal = opts.rig === "ideal";
  const rig = ideal ? DEFAULT_RIG : parseOrBadInput("rig", () => rigSchema.parse(opts.rig));
  const durationS = opts.durationS;
  if (!(durationS > 0) || !Number.isFinite(durationS)) throw new SimError("bad-input", `duration must be above 0 s (got ${durationS})`);
  if (durationS > MAX_DURATION_S) {
    throw new SimError("bad-input", `duration ${durationS} s is above the ${MAX_DURATION_S} s cap`);
  }
  const dtS = opts.dtS ?? 0.001;
  if (!(dtS >= 1e-5 && dtS <= 0.01)) throw new SimError("bad-input", `time step dt must be between 0.00001 and 0.01 s (got ${dtS})`);
  const scanS = opts.scanS ?? (ideal ? 0.01 : rig.scanPeriodS);
  if (!(scanS > 0 && scanS <= 1)) throw new SimError("bad-input", `scan period must be above 0 and at most 1 s (got ${scanS})`);
  const stepsPerScan = Math.round(scanS / dtS);
  if (stepsPerScan < 1 || Math.abs(stepsPerScan * dtS - scanS) > 1e-9 * Math.max(1, scanS)) {
    throw new SimError("bad-input", `scan period ${scanS} s must be a whole number of time steps (dt ${dtS} s)`);
  }
  return { sequence, settings, patient, rig, ideal, dtS, scanS, stepsPerScan, durationS };
}

function leakParams(kind: "none" | "orifice" | "linear", coefficientLpm: number): { kind: number; coefficient: number } {
  // Leak coefficients are given in L/min (at 10 cmH2O for the orifice, per cmH2O for the linear leak).
  if (kind === "none" || coefficientLpm === 0) return { kind: LEAK_NONE, coefficient: 0 };
  return { kind: kind === "orifice" ? LEAK_ORIFICE : LEAK_LINEAR, coefficient: coefficientLpm / 60 };
}

function circuitParams(run: PreparedRun): CircuitParams {
  const { rig, ideal, patient, settings } = run;
  const peepSetting = typeof settings.PEEP === "number" ? settings.PEEP : 0;
  const peepValve = ideal ? peepSetting : (rig.peepValveCmH2O ?? peepSetting);
  // Patient (mask) and circuit leaks both vent at the node; two leaks of the same law add.
  const pl = leakParams(patient.leak.kind, patient.leak.coefficient);
  const cl = ideal ? { kind: LEAK_NONE, coefficient: 0 } : leakParams(rig.circuit.leak.kind, rig.circuit.leak.coefficient);
  let leak = pl.kind !== LEAK_NONE ? pl : cl;
  if (pl.kind !== LEAK_NONE && cl.kind !== LEAK_NONE) {
    if (pl.kind !== cl.kind) {
      throw new SimError("bad-input", "patient and circuit leaks use different laws (orifice vs linear): use one law for both");
    }
    leak = { kind: pl.kind, coefficient: pl.coefficient + cl.coefficient };
  }
  return {
    complianceLPerCmH2O: ideal ? 0 : rig.circuit.complianceMlPerCmH2O / 1000,
    peepValveCmH2O: peepValve,
    expiratoryResistanceCmH2OPerLps: ideal ? IDEAL_VALVE_RESISTANCE : rig.circuit.expiratoryResistanceCmH2OPerLps,
    reliefOpenCmH2O: ideal ? Infinity : rig.reliefValveCmH2O,
    reliefResistanceCmH2OPerLps: rig.reliefResistanceCmH2OPerLps,
    leakKind: leak.kind,
    leakCoefficient: leak.coefficient,
    inletCrackingCmH2O: ideal ? 0 : rig.circuit.inletCrackingCmH2O,
    inletResistanceCmH2OPerLps: ideal ? IDEAL_VALVE_RESISTANCE : rig.circuit.inletResistanceCmH2OPerLps,
  };
}

function plantParams(run: PreparedRun, circuit: CircuitParams, effort: EffortSchedule, sampleEvery: number): PlantParams {
  const { rig, ideal, patient, dtS, durationS } = run;
  const a = rig.actuator;
  return {
    dtS,
    lung: {
      // The run starts with the lung at rest at the PEEP valve's pressure: V = 0 there (ENGINE.md P0).
      p0CmH2O: circuit.peepValveCmH2O,
      e1CmH2OPerL: 1000 / patient.complianceMlPerCmH2O,
      e2CmH2OPerL2: patient.e2CmH2OPerL2,
      resistanceCmH2OPerLps: patient.resistanceCmH2OPerLps,
    },
    circuit,
    driver: {
      ideal,
      pulsesPerDeg: pulsesPerDeg(a),
      maxPulseRateHz: a.maxPulseRateHz,
      maxAccelHzPerS: a.maxAccelHzPerS,
      armTravelDeg: a.armTravelDeg,
      returnSpeedDegPerS: a.returnSpeedDegPerS,
      bag: bagTable(rig.bagCalibration),
    },
    sensors: ideal ? { pressureLagS: 0, flowLagS: 0 } : { pressureLagS: rig.sensor.pressureLagS, flowLagS: rig.sensor.flowLagS },
    effort,
    sampleEvery,
    capacity: Math.ceil(Math.round(durationS / dtS) / sampleEvery) + 2,
  };
}

const EXPIRATORY: ReadonlySet<StepKind> = new Set(["exhale", "wait-for-trigger", "safe"]);

/** Start a simulation that can be advanced scan by scan. Throws SequenceError or SimError on bad input. */
export function createSimulation(opts: SimOptions): LiveSimulation {
  const run = prepare(opts);
  const { sequence, settings, rig, ideal, scanS, stepsPerScan, durationS } = run;
  const seed = opts.seed ?? 1;
  const effortRng: Rng = createRng(opts.effortSeed ?? seed);
  const noiseRng: Rng = createRng(seed * 7919 + 17);
  const effort = effortSchedule(run.patient.effort, durationS, effortRng);
  const circuit = circuitParams(run);
  const sampleEvery = Math.max(1, Math.floor(opts.sampleEvery ?? 1));
  const plant = new Plant(plantParams(run, circuit, effort, sampleEvery));
  const sensor = ideal
    ? { pressureNoiseCmH2O: 0, pressureResolutionCmH2O: 0, flowNoiseLpm: 0, flowResolutionLpm: 0 }
    : rig.sensor;
  const maxTransitions = Math.max(1, opts.maxTransitionsPerScan ?? DEFAULT_MAX_TRANSITIONS);
  const wallBudgetMs = opts.wallBudgetMs ?? DEFAULT_WALL_BUDGET_MS;
  const totalScans = Math.round(durationS / scanS + 1e-9);
  const stepKinds: Record<string, StepKind> = Object.fromEntries(sequence.stepNames.map((n) => [n, sequence.steps[n].kind]));

  // Controller state.
  let scanIndex = 0;
  // The controller's clock readings live in an object's fields, not in `let` variables: the closures below
  // capture their variables in a context, and each double stored into a context slot is a fresh heap number
  // (several per scan); an object field holding only numbers is updated in place.
  const ctl = { timeS: 0, stepStartS: 0, breathStartS: 0 };
  let current: CompiledStep = sequence.steps[sequence.definition.machine.initial];
  let pendingCause: BreathCause | null = null;
  let open: BreathRecord | null = null;
  const records: BreathRecord[] = [];
  const alarms: Alarm[] = [];
  const steps: StepInterval[] = [];
  let transitionsThisScan = 0;
  // Steps entered in the current scan (for the zero-time-loop message). A count over a reused array:
  // clearing an array's length every scan releases and reallocates its backing store.
  const visited: string[] = [];
  let visitedCount = 0;
  const monitorState = new Uint8Array(sequence.monitors.length);
  const events: SequenceEvent[] = [];
  let actorError: unknown = null;
  let started = false;
  const wallStart = now();
  let drainFrom = 0;

  const runtime = sequence.createRuntime(settings, {
    onCause(cause) {
      pendingCause = cause;
    },
    onEnter(stepName) {
      enterStep(stepName);
    },
  });
  const slots = runtime.slots;
  const sig = runtime.signal;

  function raise(spec: { kind: string; message: string; priority: Alarm["priority"] }): void {
    alarms.push({ t: ctl.timeS, kind: spec.kind, message: spec.message, priority: spec.priority });
  }

  function closeBreath(): void {
    if (!open) return;
    open.pip = plant.accPipCmH2O;
    open.vtiL = plant.accVtiL;
    open.vteL = plant.accVteL;
    open.peakFlowLps = plant.accPeakFlowLps;
    open.reliefL = plant.accReliefL;
    open.end = ctl.timeS;
    open.peep = plant.pawCmH2O;
  }

  function commandValue(expr: string, what: string): number {
    const v = runtime.value(expr);
    if (!Number.isFinite(v)) runtime.problems.push(`step ${current.name}: ${what} "${expr}" evaluated to ${v}`);
    return v;
  }

  function applyCommand(step: CompiledStep): void {
    const c = step.command;
    switch (c.kind) {
      case "flow":
        plant.setCommand(CMD_FLOW, ctl.timeS, commandValue(c.flow, "flow") / 60);
        break;
      case "pressure":
        plant.setCommand(CMD_PRESSURE, ctl.timeS, commandValue(c.target, "pressure target"), Math.max(0, commandValue(c.rise, "rise")));
        break;
      case "arm":
        plant.setCommand(CMD_ARM, ctl.timeS, commandValue(c.angle, "arm angle"), Math.max(0, commandValue(c.pulseRate, "pulse rate")));
        break;
      case "hold":
        plant.setCommand(CMD_HOLD, ctl.timeS);
        break;
      default:
        plant.setCommand(CMD_RELEASE, ctl.timeS);
    }
  }

  function enterStep(name: string): void {
    const step = sequence.steps[name];
    const previous = started ? current : null;
    transitionsThisScan++;
    visited[visitedCount++] = name;
    if (steps.length) steps[steps.length - 1].to = ctl.timeS;
    steps.push({ step: name, from: ctl.timeS, to: Infinity });
    if (previous && previous.kind === "hold" && open) open.pplat = plant.pawCmH2O;
    current = step;
    started = true;
    ctl.stepStartS = ctl.timeS;
    slots[sig.tStep] = 0;
    plant.stepCode = step.index;
    if (step.breathStart) {
      closeBreath();
      const trigger: TriggerSource = pendingCause ?? "timer";
      open = {
        start: ctl.timeS,
        trigger,
        inspEnd: null,
        end: null,
        pip: plant.pawCmH2O,
        pplat: null,
        peep: null,
        vtiL: 0,
        vteL: 0,
        peakFlowLps: 0,
        reliefL: 0,
      };
      records.push(open);
      plant.resetBreath();
      plant.inspiratory = true;
      ctl.breathStartS = ctl.timeS;
      slots[sig.breathCount] += 1;
      slots[sig.tBreath] = 0;
      slots[sig.vol] = 0;
      slots[sig.peakFlow] = 0;
      slots[sig.peakPaw] = slots[sig.paw];
    } else if (EXPIRATORY.has(step.kind) && open && open.inspEnd === null) {
      open.inspEnd = ctl.timeS;
      plant.inspiratory = false;
    }
    pendingCause = null;
    for (const a of step.alarms) raise(a);
    applyCommand(step);
  }

  const clock = new ScanClock();
  const actor: AnyActorRef = createActor(sequence.machine, { input: { runtime }, clock });
  actor.subscribe({
    error(e: unknown) {
      actorError = e;
    },
  });
  actor.start();

  function loopError(): SimError {
    const tail = visited.slice(Math.max(0, visitedCount - 12), visitedCount);
    const names = [...new Set(tail)];
    return new SimError(
      "loop",
      `steps ${names.join(" → ")} keep transitioning without time passing (${tail.join(" → ")} …): more than ${maxTransitions} transitions in one scan at t = ${ctl.timeS.toFixed(3)} s. Give one of their timers a delay above 0.`,
    );
  }

  function checkAfterControl(): void {
    if (transitionsThisScan > maxTransitions) throw loopError();
    if (actorError) {
      const msg = actorError instanceof Error ? actorError.message : String(actorError);
      throw new SimError("bad-input", `the sequence failed at t = ${ctl.timeS.toFixed(3)} s: ${msg}`);
    }
    if (runtime.problems.length) {
      throw new SimError("bad-input", `at t = ${ctl.timeS.toFixed(3)} s: ${runtime.problems.join("; ")}`);
    }
  }

  // Sensor constants and the signal slots, hoisted out of the scan.
  const pNoise = sensor.pressureNoiseCmH2O;
  const pRes = sensor.pressureResolutionCmH2O;
  const fNoise = sensor.flowNoiseLpm;
  const fRes = sensor.flowResolutionLpm;
  const sPaw = sig.paw;
  const sFlow = sig.flow;
  const sVol = sig.vol;
  const sPeakFlow = sig.peakFlow;
  const sPeakPaw = sig.peakPaw;
  const sTStep = sig.tStep;
  const sTBreath = sig.tBreath;
  const sArm = sig.arm;

  function readSignals(): void {
    // sensors.ts sensorReading(), written out: each reading goes straight into its slot, with no double
    // passed to or returned from a call (each would be boxed). Same operations in the same order, so the
    // same values and the same draws from the noise generator.
    let paw = plant.pawLaggedCmH2O;
    if (pNoise > 0) paw = paw + pNoise * noiseRng.gaussian();
    if (pRes > 0) paw = Math.round(paw / pRes) * pRes;
    let flow = plant.flowLaggedLpm;
    if (fNoise > 0) flow = flow + fNoise * noiseRng.gaussian();
    if (fRes > 0) flow = Math.round(flow / fRes) * fRes;
    slots[sPaw] = paw;
    slots[sFlow] = flow;
    if (open) {
      slots[sVol] += (flow * scanS * 1000) / 60;
      if (flow > slots[sPeakFlow]) slots[sPeakFlow] = flow;
      if (paw > slots[sPeakPaw]) slots[sPeakPaw] = paw;
    }
    slots[sTStep] = ctl.timeS - ctl.stepStartS;
    slots[sTBreath] = ctl.timeS - ctl.breathStartS;
    slots[sArm] = plant.armDeg;
  }

  // Bound formulas looked up once (runtime.test() looks each up by its text on every call).
  const monitorFns = sequence.monitors.map((m) => runtime.fn(m.when.expr));
  const monitorAlarms = sequence.monitors.map((m) => m.alarm);
  const scanGuardFns: Array<Array<(() => number) | null>> = [];
  for (const name of sequence.stepNames) {
    const st = sequence.steps[name];
    scanGuardFns[st.index] = st.scan.map((t) => (t.guard === null ? null : runtime.fn(t.guard.expr)));
  }

  function checkMonitors(): void {
    for (let i = 0; i < monitorFns.length; i++) {
      const on = monitorFns[i]() !== 0 ? 1 : 0;
      if (on && !monitorState[i]) raise(monitorAlarms[i]);
      monitorState[i] = on;
    }
  }

  function scanEnabled(step: CompiledStep): boolean {
    const guards = scanGuardFns[step.index];
    for (let i = 0; i < guards.length; i++) {
      const g = guards[i];
      if (g === null || g() !== 0) return true;
    }
    return false;
  }

  function housekeeping(): void {
    if (now() - wallStart > wallBudgetMs) {
      throw new SimError("budget", `the run took longer than its wall-time budget of ${wallBudgetMs} ms (at t = ${ctl.timeS.toFixed(2)} s)`);
    }
    if (opts.shouldStop?.()) throw new SimError("cancelled", `cancelled at t = ${ctl.timeS.toFixed(2)} s`);
    opts.onProgress?.(scanIndex / totalScans);
  }

  // Entry into the initial step happened in actor.start(): check it like any scan.
  checkAfterControl();

  function stepScan(): void {
    if (scanIndex >= totalScans) return;
    ctl.timeS = scanIndex * scanS;
    transitionsThisScan = 0;
    visitedCount = 0;
    visited[visitedCount++] = current.name;
    readSignals();
    checkMonitors();
    if (!clock.advanceTo(ctl.timeS * 1000, maxTransitions)) throw loopError();
    checkAfterControl();
    while (events.length) actor.send({ type: events.shift() as SequenceEvent });
    if (opts.sendEveryScan || scanEnabled(current)) actor.send({ type: "SCAN" });
    checkAfterControl();
    plant.run(ctl.timeS, stepsPerScan);
    scanIndex++;
    ctl.timeS = scanIndex * scanS;
    if (scanIndex % HOUSEKEEPING_SCANS === 0) housekeeping();
  }

  function result(): SimResult {
    const w = plant.wave;
    const n = plant.samples;
    const recordsNow = records.map((r) => ({ ...r }));
    const last = recordsNow[recordsNow.length - 1];
    if (last && open && last.end === null) {
      last.pip = plant.accPipCmH2O;
      last.vtiL = plant.accVtiL;
      last.vteL = plant.accVteL;
      last.peakFlowLps = plant.accPeakFlowLps;
      last.reliefL = plant.accReliefL;
      last.end = ctl.timeS;
      last.peep = plant.pawCmH2O;
    }
    const stepsNow = steps.map((s, i) => ({ ...s, to: i === steps.length - 1 ? ctl.timeS : s.to }));
    const pawAt = (t: number): number => {
      // Last sample at or before t (samples are ascending in time).
      let lo = 0;
      let hi = n - 1;
      if (n === 0) return plant.pawCmH2O;
      if (t < w.t[0]) return w.paw[0];
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (w.t[mid] <= t + 1e-12) lo = mid;
        else hi = mid - 1;
      }
      return w.paw[lo];
    };
    const metrics = computeMetrics({ records: recordsNow, efforts: effort, steps: stepsNow, stepKinds, timeS: ctl.timeS, pawAt });
    return {
      stepNames: sequence.stepNames,
      waveforms: {
        t: w.t.subarray(0, n),
        paw: w.paw.subarray(0, n),
        flow: w.flow.subarray(0, n),
        volume: w.volume.subarray(0, n),
        pmus: w.pmus.subarray(0, n),
        arm: w.arm.subarray(0, n),
        step: w.step.subarray(0, n),
      },
      steps: stepsNow,
      breaths: metrics.breaths,
      efforts: metrics.efforts,
      alarms: [...alarms],
      summary: metrics.summary,
      wallMs: now() - wallStart,
    };
  }

  const live: LiveSimulation = {
    get time() {
      return ctl.timeS;
    },
    get activeStep() {
      return current.name;
    },
    advance(seconds: number) {
      const target = Math.min(totalScans, Math.round((ctl.timeS + Math.max(0, seconds)) / scanS + 1e-9));
      while (scanIndex < target) stepScan();
    },
    stepScan,
    send(event: SequenceEvent) {
      events.push(event);
    },
    drain() {
      const n = plant.samples;
      const w = plant.wave;
      const out = { t: [] as number[], paw: [] as number[], flow: [] as number[], volume: [] as number[], step: [] as string[] };
      for (let i = drainFrom; i < n; i++) {
        out.t.push(w.t[i]);
        out.paw.push(w.paw[i]);
        out.flow.push(w.flow[i]);
        out.volume.push(w.volume[i]);
        out.step.push(sequence.stepNames[w.step[i]]);
      }
      drainFrom = n;
      return out;
    },
    result,
  };
  return live;
}

/** Run a whole simulation. Throws SequenceError (invalid definition or settings) or SimError. */
export function simulate(opts: SimOptions): SimResult {
  const sim = createSimulation(opts);
  sim.advance(opts.durationS);
  const r = sim.result();
  return r;
}

/** Signals formulas can read, re-exported for the designer's help text. */
export const SIGNAL_HELP = SIGNALS;
export { SequenceError };
