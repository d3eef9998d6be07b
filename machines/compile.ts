/**
 * Compile a sequence definition (JSON) into an XState v5 machine.
 *
 * Machines are data, implementations are code: the generated config names guards (`formula`),
 * actions (`enterStep`, `markCause`) and delays (`delay_N`) that `setup()` registers here. Formulas are
 * compiled once (machines/formula.ts); at run time they read a Float64Array of slots (signals, then
 * settings) owned by a `SequenceRuntime`, which the engine updates every scan.
 *
 * Every problem is collected as { path, message } naming the step, transition or setting, and thrown
 * together as a SequenceError.
 */
import { setup, type AnyStateMachine } from "xstate";
import {
  SIGNALS,
  sequenceDefinition,
  type AlarmSpec,
  type BreathCause,
  type Command,
  type SequenceDefinition,
  type SequenceEvent,
  type Setting,
  type StepKind,
  type Transition,
} from "./schema";
import {
  FORMULA_CONSTANTS,
  FORMULA_FUNCTIONS,
  FormulaError,
  compileFormula,
  internString,
  type CompiledFormula,
  type FormulaScope,
  type SlotLayout,
} from "./formula";

export interface SequenceIssue {
  /** Dotted path into the definition, e.g. `machine.states.inhale.after.Ti[0].target`. */
  path: string;
  message: string;
}

/** An invalid sequence definition or setting value; `issues` lists every problem found. */
export class SequenceError extends Error {
  constructor(readonly issues: SequenceIssue[]) {
    super(
      issues.length === 1
        ? `${issues[0].path}: ${issues[0].message}`
        : `${issues.length} problems in the sequence:\n` + issues.map((i) => `  ${i.path}: ${i.message}`).join("\n"),
    );
    this.name = "SequenceError";
  }
}

export type SettingValues = Record<string, number | string>;

export interface CompiledTransition {
  target: string;
  guard: CompiledFormula | null;
  cause: BreathCause | null;
}

export interface CompiledStep {
  name: string;
  index: number;
  kind: StepKind;
  label?: string;
  command: Command;
  alarms: AlarmSpec[];
  breathStart: boolean;
  /** SCAN transitions in priority order. */
  scan: CompiledTransition[];
  /** Timers: the delay formula (seconds) and its transitions. */
  after: Array<{ delay: CompiledFormula; transitions: CompiledTransition[] }>;
  /** Operator/fault events handled by this step. */
  events: Partial<Record<SequenceEvent, CompiledTransition[]>>;
}

export interface CompiledMonitor {
  when: CompiledFormula;
  alarm: AlarmSpec;
}

/** Callbacks the machine's actions call (the engine's controller implements them). */
export interface SequenceCallbacks {
  /** Entry into a step (after any transition's `markCause`). */
  onEnter?(step: string): void;
  /** A transition was taken; cause is meta.cause or inferred (SCAN → patient, timer → timer, event → operator). */
  onCause?(cause: BreathCause): void;
}

/** Slots and bound formulas for one run of a compiled sequence. */
export interface SequenceRuntime {
  readonly slots: Float64Array;
  readonly layout: SlotLayout;
  /** Slot index of each signal. */
  readonly signal: Record<keyof typeof SIGNALS, number>;
  readonly settings: SettingValues;
  callbacks: SequenceCallbacks;
  /** Value of a formula compiled with this sequence (booleans 1/0). */
  value(expr: string): number;
  test(expr: string): boolean;
  /**
   * The function of a formula compiled with this sequence, for the engine's scan loop: value() without the
   * lookup by text, and with the settings folded in as constants (CompiledFormula.bindFolded). Settings are
   * fixed for a runtime's life (resolved when it is created; only signal slots change during a run).
   */
  fn(expr: string): () => number;
  /** A delay formula in ms (negative → 0). Non-finite values are recorded in `problems` and give 0. */
  delayMs(expr: string): number;
  /** Run-time problems (non-finite delays or commands), checked by the engine after each scan. */
  problems: string[];
}

export interface SequenceContext {
  runtime: SequenceRuntime;
}
export type SequenceMachineEvent = { type: "SCAN" } | { type: SequenceEvent };

export interface CompiledSequence {
  definition: SequenceDefinition;
  machine: AnyStateMachine;
  stepNames: string[];
  steps: Record<string, CompiledStep>;
  monitors: CompiledMonitor[];
  /** Setting names in dependency order (inputs before derived). */
  settingOrder: string[];
  /** Setting values at the definition's defaults (derived ones computed). */
  defaults: SettingValues;
  /** Validate overrides and compute derived settings. Throws SequenceError. */
  resolveSettings(overrides?: Record<string, number | string>): SettingValues;
  /** A runtime (slots + bound formulas) for the given resolved settings (default: `defaults`). */
  createRuntime(settings?: SettingValues, callbacks?: SequenceCallbacks): SequenceRuntime;
}

const SIGNAL_NAMES = Object.keys(SIGNALS) as Array<keyof typeof SIGNALS>;
const RESERVED = new Set<string>([...SIGNAL_NAMES, ...Object.keys(FORMULA_CONSTANTS), ...FORMULA_FUNCTIONS]);

function zodPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const p of path) {
    if (typeof p === "number") out += `[${p}]`;
    else out += out ? `.${String(p)}` : String(p);
  }
  return out || "(definition)";
}

function listOf(t: Transition | Transition[] | undefined): Transition[] {
  return t === undefined ? [] : Array.isArray(t) ? t : [t];
}

function describeNames(names: string[]): string {
  return names.length ? names.join(", ") : "none";
}

// --- settings -------------------------------------------------------------------------------------

interface SettingPlan {
  order: string[];
  formulas: Map<string, CompiledFormula>;
}

function planSettings(def: SequenceDefinition, issues: SequenceIssue[]): SettingPlan {
  const names = Object.keys(def.settings);
  const formulas = new Map<string, CompiledFormula>();
  for (const name of names) {
    const s = def.settings[name];
    const path = `settings.${name}`;
    if (RESERVED.has(name)) {
      issues.push({ path, message: `setting "${name}" clashes with a signal, constant or function of the same name` });
    }
    if (s.min !== undefined && s.max !== undefined && s.min > s.max) {
      issues.push({ path: `${path}.min`, message: `setting ${name}: min ${s.min} is above max ${s.max}` });
    }
    if (s.options) {
      if (s.formula) issues.push({ path, message: `setting ${name} cannot have both options and a formula` });
      if (new Set(s.options).size !== s.options.length) {
        issues.push({ path: `${path}.options`, message: `setting ${name} lists an option twice` });
      }
      if (s.value !== undefined && !s.options.includes(String(s.value))) {
        issues.push({
          path: `${path}.value`,
          message: `setting ${name}: "${s.value}" is not one of its options (${s.options.join(", ")})`,
        });
      }
      continue;
    }
    if (s.formula) {
      try {
        const f = compileFormula(s.formula);
        const unknown = f.symbols.filter((x) => !(x in def.settings));
        for (const u of unknown) {
          issues.push({
            path: `${path}.formula`,
            message:
              u in SIGNALS
                ? `setting ${name} uses the signal "${u}": derived settings may use only other settings`
                : `setting ${name} uses an unknown name "${u}" (settings: ${describeNames(names)})`,
          });
        }
        formulas.set(name, f);
      } catch (e) {
        issues.push({ path: `${path}.formula`, message: `setting ${name}: ${(e as Error).message}` });
      }
      continue;
    }
    if (s.value === undefined) {
      issues.push({ path: `${path}.value`, message: `setting ${name} needs a value (or a formula or options)` });
    } else if (typeof s.value !== "number") {
      issues.push({ path: `${path}.value`, message: `setting ${name}: value "${s.value}" must be a number` });
    } else {
      boundsIssue(name, s, s.value, `${path}.value`, issues, "its default");
    }
  }
  // Dependency order (depth-first); a cycle is reported with its path.
  const order: string[] = [];
  const state = new Map<string, "visiting" | "done">();
  const visit = (name: string, stack: string[]) => {
    const st = state.get(name);
    if (st === "done") return;
    if (st === "visiting") {
      const cycle = [...stack.slice(stack.indexOf(name)), name];
      issues.push({
        path: `settings.${name}.formula`,
        message: `derived settings depend on each other in a cycle: ${cycle.join(" → ")}`,
      });
      return;
    }
    state.set(name, "visiting");
    const f = formulas.get(name);
    if (f) for (const dep of f.symbols) if (dep in def.settings) visit(dep, [...stack, name]);
    state.set(name, "done");
    order.push(name);
  };
  for (const name of names) visit(name, []);
  return { order, formulas };
}

function boundsIssue(
  name: string,
  s: Setting,
  v: number,
  path: string,
  issues: SequenceIssue[],
  what: string,
): void {
  if (!Number.isFinite(v)) {
    issues.push({ path, message: `setting ${name}: ${what} is not a finite number (${v})` });
    return;
  }
  const unit = s.unit ? ` ${s.unit}` : "";
  if (s.min !== undefined && v < s.min - 1e-9) {
    issues.push({ path, message: `setting ${name}: ${what} ${fmt(v)}${unit} is below its minimum ${s.min}${unit}` });
  } else if (s.max !== undefined && v > s.max + 1e-9) {
    issues.push({ path, message: `setting ${name}: ${what} ${fmt(v)}${unit} is above its maximum ${s.max}${unit}` });
  }
}

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(6)));
}

function resolveWith(
  def: SequenceDefinition,
  plan: SettingPlan,
  overrides: Record<string, number | string> = {},
): SettingValues {
  const issues: SequenceIssue[] = [];
  const values: SettingValues = {};
  for (const [name, v] of Object.entries(overrides)) {
    const s = def.settings[name];
    const path = `settings.${name}`;
    if (!s) {
      issues.push({ path, message: `unknown setting "${name}" (settings: ${describeNames(Object.keys(def.settings))})` });
      continue;
    }
    if (s.formula) {
      issues.push({ path, message: `setting ${name} is derived (${s.formula}); set the settings it is computed from` });
      continue;
    }
    if (s.options) {
      if (!s.options.includes(String(v))) {
        issues.push({ path, message: `setting ${name}: "${v}" is not one of its options (${s.options.join(", ")})` });
      }
      continue;
    }
    const n = typeof v === "number" ? v : Number(v);
    if (typeof v === "string" && (v.trim() === "" || !Number.isFinite(n))) {
      issues.push({ path, message: `setting ${name}: "${v}" is not a number` });
      continue;
    }
    boundsIssue(name, s, n, path, issues, "value");
  }
  if (issues.length) throw new SequenceError(issues);
  for (const name of plan.order) {
    const s = def.settings[name];
    const f = plan.formulas.get(name);
    if (f) {
      const scope: FormulaScope = {};
      for (const dep of f.symbols) scope[dep] = values[dep];
      let v: number;
      try {
        const r = f.evaluate(scope);
        if (typeof r === "string") throw new Error(`gives text "${r}"`);
        v = typeof r === "boolean" ? (r ? 1 : 0) : r;
      } catch (e) {
        issues.push({ path: `settings.${name}.formula`, message: `setting ${name} (${s.formula}): ${(e as Error).message}` });
        continue;
      }
      const inputs = f.symbols.map((d) => `${d} = ${typeof values[d] === "number" ? fmt(values[d] as number) : values[d]}`);
      boundsIssue(name, s, v, `settings.${name}`, issues, `derived value ${s.formula} =`);
      if (issues.length && issues[issues.length - 1].path === `settings.${name}`) {
        issues[issues.length - 1].message += ` (with ${inputs.join(", ")})`;
      }
      values[name] = v;
    } else if (name in overrides) {
      values[name] = s.options ? String(overrides[name]) : Number(overrides[name]);
    } else if (s.options) {
      values[name] = s.value !== undefined ? String(s.value) : s.options[0];
    } else {
      values[name] = s.value as number;
    }
  }
  if (issues.length) throw new SequenceError(issues);
  return values;
}

// --- formulas in steps ----------------------------------------------------------------------------

interface FormulaChecker {
  (expr: string, path: string, where: string): CompiledFormula | null;
}

function makeChecker(def: SequenceDefinition, issues: SequenceIssue[]): FormulaChecker {
  const known = new Set<string>([...Object.keys(def.settings), ...SIGNAL_NAMES]);
  const optionsOf = new Map<string, string[]>();
  for (const [n, s] of Object.entries(def.settings)) if (s.options) optionsOf.set(n, s.options);
  return (expr, path, where) => {
    let f: CompiledFormula;
    try {
      f = compileFormula(expr);
    } catch (e) {
      issues.push({ path, message: `${where}: ${(e as FormulaError).message}` });
      return null;
    }
    let ok = true;
    for (const s of f.symbols) {
      if (!known.has(s)) {
        ok = false;
        issues.push({
          path,
          message: `${where}: unknown name "${s}" in "${expr}" (settings: ${describeNames(Object.keys(def.settings))}; signals: ${SIGNAL_NAMES.join(", ")})`,
        });
      }
    }
    if (f.strings.length) {
      const allowed = new Set<string>();
      for (const s of f.symbols) for (const o of optionsOf.get(s) ?? []) allowed.add(o);
      for (const str of f.strings) {
        if (!allowed.has(str)) {
          ok = false;
          issues.push({
            path,
            message: `${where}: "${str}" in "${expr}" is not an option of the choice settings it uses${allowed.size ? ` (${[...allowed].join(", ")})` : ""}`,
          });
        }
      }
    }
    return ok ? f : null;
  };
}

function commandFormulas(c: Command): Array<[string, string]> {
  switch (c.kind) {
    case "flow":
      return [["flow", c.flow]];
    case "pressure":
      return [
        ["target", c.target],
        ["rise", c.rise],
      ];
    case "arm":
      return [
        ["angle", c.angle],
        ["pulseRate", c.pulseRate],
      ];
    default:
      return [];
  }
}

// --- compile ---------------------------------------------------------------------------------------

/**
 * Validate a definition (unknown JSON) and compile it. Throws SequenceError listing every problem.
 */
export function compile(input: unknown): CompiledSequence {
  const parsed = sequenceDefinition.safeParse(input);
  if (!parsed.success) {
    throw new SequenceError(parsed.error.issues.map((i) => ({ path: zodPath(i.path), message: i.message })));
  }
  const def = parsed.data;
  const issues: SequenceIssue[] = [];
  const plan = planSettings(def, issues);
  const checkFormula = makeChecker(def, issues);
  const stepNames = Object.keys(def.machine.states);
  const stepSet = new Set(stepNames);

  if (!stepSet.has(def.machine.initial)) {
    issues.push({
      path: "machine.initial",
      message: `initial step "${def.machine.initial}" does not exist (steps: ${describeNames(stepNames)})`,
    });
  }

  const steps: Record<string, CompiledStep> = {};
  const delayNames = new Map<string, string>(); // delay expr → delay_N
  const delayFormulas = new Map<string, CompiledFormula>();
  const allFormulas = new Map<string, CompiledFormula>();
  const remember = (f: CompiledFormula | null) => {
    if (f) allFormulas.set(f.expr, f);
    return f;
  };

  const compileTransitions = (
    list: Transition[],
    basePath: string,
    where: string,
  ): CompiledTransition[] =>
    list.map((t, i) => {
      const path = `${basePath}[${i}]`;
      if (!stepSet.has(t.target)) {
        issues.push({
          path: `${path}.target`,
          message: `${where}: unknown target step "${t.target}" (steps: ${describeNames(stepNames)})`,
        });
      }
      const guard = t.guard ? remember(checkFormula(t.guard.params.expr, `${path}.guard.params.expr`, `${where} guard`)) : null;
      return { target: t.target, guard, cause: t.meta?.cause ?? null };
    });

  stepNames.forEach((name, index) => {
    const st = def.machine.states[name];
    const base = `machine.states.${name}`;
    const cmd = st.meta.command;
    for (const [field, expr] of commandFormulas(cmd)) {
      remember(checkFormula(expr, `${base}.meta.command.${field}`, `step ${name} command ${cmd.kind}.${field}`));
    }
    const after: CompiledStep["after"] = [];
    for (const [key, tl] of Object.entries(st.after ?? {})) {
      const where = `step ${name} timer "${key}"`;
      const delay = remember(checkFormula(key, `${base}.after.${key}`, where));
      const transitions = compileTransitions(listOf(tl), `${base}.after.${key}`, where);
      if (delay) {
        if (!delayNames.has(key)) delayNames.set(key, `delay_${delayNames.size}`);
        delayFormulas.set(key, delay);
        after.push({ delay, transitions });
      }
    }
    const scan = compileTransitions(listOf(st.on?.SCAN), `${base}.on.SCAN`, `step ${name} SCAN transition`);
    const events: CompiledStep["events"] = {};
    for (const [ev, tl] of Object.entries(st.on ?? {})) {
      if (ev === "SCAN") continue;
      events[ev as SequenceEvent] = compileTransitions(listOf(tl), `${base}.on.${ev}`, `step ${name} ${ev} transition`);
    }
    steps[name] = {
      name,
      index,
      kind: st.meta.kind,
      label: st.meta.label,
      command: cmd,
      alarms: st.meta.alarms,
      breathStart: st.meta.breathStart ?? st.meta.kind === "inhale",
      scan,
      after,
      events,
    };
  });

  const monitors: CompiledMonitor[] = [];
  def.monitors.forEach((m, i) => {
    const f = remember(checkFormula(m.when, `monitors[${i}].when`, `monitor "${m.alarm.kind}"`));
    if (f) monitors.push({ when: f, alarm: m.alarm });
  });

  let defaults: SettingValues = {};
  if (issues.length === 0) {
    try {
      defaults = resolveWith(def, plan);
    } catch (e) {
      if (e instanceof SequenceError) issues.push(...e.issues);
      else throw e;
    }
  }
  if (issues.length) throw new SequenceError(issues);

  const machine = buildMachine(def, steps, delayNames);
  const settingOrder = plan.order;

  const createRuntime = (settings: SettingValues = defaults, callbacks: SequenceCallbacks = {}): SequenceRuntime =>
    makeRuntime(settingOrder, settings, allFormulas, callbacks);

  return {
    definition: def,
    machine,
    stepNames,
    steps,
    monitors,
    settingOrder,
    defaults,
    resolveSettings: (overrides) => resolveWith(def, plan, overrides),
    createRuntime,
  };
}

/** Like compile(), but returns the issues instead of throwing. */
export function tryCompile(input: unknown): { ok: true; sequence: CompiledSequence } | { ok: false; issues: SequenceIssue[] } {
  try {
    return { ok: true, sequence: compile(input) };
  } catch (e) {
    if (e instanceof SequenceError) return { ok: false, issues: e.issues };
    throw e;
  }
}

function makeRuntime(
  settingOrder: string[],
  settings: SettingValues,
  formulas: Map<string, CompiledFormula>,
  callbacks: SequenceCallbacks,
): SequenceRuntime {
  const names = [...SIGNAL_NAMES, ...settingOrder];
  const index = new Map(names.map((n, i) => [n, i]));
  const layout: SlotLayout = { index };
  const slots = new Float64Array(names.length);
  for (const n of settingOrder) {
    const v = settings[n];
    slots[index.get(n) as number] = typeof v === "string" ? internString(v) : v;
  }
  const bound = new Map<string, () => number>();
  for (const [expr, f] of formulas) bound.set(expr, f.bind(layout, slots));
  const isSetting = (slot: number) => slot >= SIGNAL_NAMES.length;
  const folded = new Map<string, () => number>();
  const getFolded = (expr: string) => {
    let fn = folded.get(expr);
    if (!fn) {
      const f = formulas.get(expr);
      if (!f) throw new Error(`formula "${expr}" was not compiled with this sequence`);
      fn = f.bindFolded(layout, slots, isSetting);
      folded.set(expr, fn);
    }
    return fn;
  };
  const get = (expr: string) => {
    const fn = bound.get(expr);
    if (!fn) throw new Error(`formula "${expr}" was not compiled with this sequence`);
    return fn;
  };
  const signal = Object.fromEntries(SIGNAL_NAMES.map((n) => [n, index.get(n) as number])) as SequenceRuntime["signal"];
  const runtime: SequenceRuntime = {
    slots,
    layout,
    signal,
    settings,
    callbacks,
    problems: [],
    value: (expr) => get(expr)(),
    fn: getFolded,
    test: (expr) => get(expr)() !== 0,
    delayMs(expr) {
      const s = get(expr)();
      if (!Number.isFinite(s)) {
        runtime.problems.push(`timer "${expr}" evaluated to ${s}`);
        return 0;
      }
      return s > 0 ? s * 1000 : 0;
    },
  };
  return runtime;
}

// XState config types are generic over the implementations; the generated config is data, so it is typed
// loosely here and checked by our own schema above.
type XConfig = Record<string, unknown>;

function buildMachine(
  def: SequenceDefinition,
  steps: Record<string, CompiledStep>,
  delayNames: Map<string, string>,
): AnyStateMachine {
  const toX = (t: CompiledTransition, inferred: BreathCause) => {
    const x: XConfig = {
      target: t.target,
      reenter: true,
      actions: [{ type: "markCause", params: { cause: t.cause ?? inferred } }],
    };
    if (t.guard) x.guard = { type: "formula", params: { expr: t.guard.expr } };
    return x;
  };
  const states: Record<string, XConfig> = {};
  for (const [name, st] of Object.entries(def.machine.states)) {
    const cs = steps[name];
    const x: XConfig = {
      meta: st.meta,
      entry: [{ type: "enterStep", params: { step: name } }],
    };
    if (cs.after.length) {
      const after: Record<string, unknown> = {};
      for (const a of cs.after) after[delayNames.get(a.delay.expr) as string] = a.transitions.map((t) => toX(t, "timer"));
      x.after = after;
    }
    const on: Record<string, unknown> = {};
    if (cs.scan.length) on.SCAN = cs.scan.map((t) => toX(t, "patient"));
    for (const [ev, list] of Object.entries(cs.events)) on[ev] = (list ?? []).map((t) => toX(t, "operator"));
    if (Object.keys(on).length) x.on = on;
    states[name] = x;
  }
  const delays: Record<string, (args: { context: SequenceContext }) => number> = {};
  for (const [expr, dname] of delayNames) delays[dname] = ({ context }) => context.runtime.delayMs(expr);

  const machineSetup = setup({
    types: {} as {
      context: SequenceContext;
      input: { runtime: SequenceRuntime };
      events: SequenceMachineEvent;
    },
    guards: {
      formula: ({ context }, params: { expr: string }) => context.runtime.test(params.expr),
    },
    actions: {
      enterStep: ({ context }, params: { step: string }) => context.runtime.callbacks.onEnter?.(params.step),
      markCause: ({ context }, params: { cause: BreathCause }) => context.runtime.callbacks.onCause?.(params.cause),
    },
    delays,
  });
  const config = {
    id: def.machine.id,
    initial: def.machine.initial,
    context: ({ input }: { input: { runtime: SequenceRuntime } }) => ({ runtime: input.runtime }),
    states,
  };
  return machineSetup.createMachine(config as unknown as Parameters<typeof machineSetup.createMachine>[0]);
}
