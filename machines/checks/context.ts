/**
 * Everything the checks share, computed once per run: the flattened transitions, every formula with
 * the place it sits in and what it must produce, and the value ranges of signals and settings.
 */
import type { SequenceDefinition, StateConfig, Transition } from "@/machines/schema";
import {
  DIMENSIONS,
  analyseFormula,
  formulaScope,
  rangeEnvironment,
  type Expectation,
  type FormulaAnalysis,
  type FormulaScope,
  type RangeEnvironment,
} from "@/machines/formula-analysis";
import type { ProblemTarget, TransitionVia } from "@/machines/checks/types";

export interface TransitionSite {
  step: string;
  via: TransitionVia;
  /** Timer key (a setting name or formula, seconds) for `after`. */
  key?: string;
  /** Position within its trigger's list: its priority there. */
  index: number;
  transition: Transition;
  target: ProblemTarget & { type: "transition" };
}

export interface FormulaSite {
  expr: string;
  expect: Expectation;
  target: ProblemTarget;
  /** Names the place in a sentence: "the condition of the exit from inhale to exhale". */
  place: string;
  analysis: FormulaAnalysis;
}

export interface CheckContext {
  definition: SequenceDefinition;
  stepNames: string[];
  transitions: TransitionSite[];
  formulas: FormulaSite[];
  scope: FormulaScope;
  /** Settings over their allowed ranges (min..max). */
  bounds: RangeEnvironment;
  /** Settings at their saved values. */
  defaults: RangeEnvironment;
  /** As `bounds`, at the instant a step is entered (tStep = 0): what can fire with no time passing. */
  atEntry: RangeEnvironment;
}

function asList(t: Transition | Transition[] | undefined): Transition[] {
  if (t === undefined) return [];
  return Array.isArray(t) ? t : [t];
}

export function describeVia(site: Pick<TransitionSite, "via" | "key">): string {
  if (site.via === "after") return `timer \`${site.key}\``;
  if (site.via === "SCAN") return "scan condition";
  return `${site.via} event`;
}

export function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** "the timer `Ti` exit from inhale to exhale" — how messages name a transition. */
export function describeTransition(site: TransitionSite, withCondition = true): string {
  const guard = withCondition && site.transition.guard ? ` when \`${site.transition.guard.params.expr}\`` : "";
  const trigger = site.via === "after" ? `after \`${site.key}\`` : site.via === "SCAN" ? "on scan" : `on ${site.via}`;
  return `the exit from ${site.step} to ${site.transition.target} ${trigger}${guard}`;
}

function stepTransitions(step: string, config: StateConfig): TransitionSite[] {
  const sites: TransitionSite[] = [];
  for (const [key, list] of Object.entries(config.after ?? {})) {
    asList(list).forEach((transition, index) =>
      sites.push({ step, via: "after", key, index, transition, target: { type: "transition", step, via: "after", key, index } }),
    );
  }
  for (const [event, list] of Object.entries(config.on ?? {}) as Array<[TransitionVia, Transition | Transition[] | undefined]>) {
    asList(list).forEach((transition, index) =>
      sites.push({ step, via: event, index, transition, target: { type: "transition", step, via: event, index } }),
    );
  }
  return sites;
}

function commandFormulas(step: string, config: StateConfig): Array<Omit<FormulaSite, "analysis">> {
  const c = config.meta.command;
  const at = (field: string, expr: string, expect: Expectation, what: string): Omit<FormulaSite, "analysis"> => ({
    expr,
    expect,
    target: { type: "step", step, field: `command.${field}` },
    place: `the ${what} of step ${step}`,
  });
  switch (c.kind) {
    case "flow":
      return [at("flow", c.flow, DIMENSIONS.flow, "delivered flow")];
    case "pressure":
      return [at("target", c.target, DIMENSIONS.pressure, "pressure target"), at("rise", c.rise, DIMENSIONS.time, "rise time")];
    case "arm":
      return [at("angle", c.angle, DIMENSIONS.angle, "arm angle"), at("pulseRate", c.pulseRate, DIMENSIONS.frequency, "pulse rate")];
    default:
      return [];
  }
}

function collectFormulas(definition: SequenceDefinition, transitions: TransitionSite[]): Array<Omit<FormulaSite, "analysis">> {
  const sites: Array<Omit<FormulaSite, "analysis">> = [];
  for (const [name, s] of Object.entries(definition.settings)) {
    if (s.formula) {
      sites.push({
        expr: s.formula,
        expect: s.options?.length ? DIMENSIONS.text : "any",
        target: { type: "setting", setting: name },
        place: `the formula of setting ${name}`,
      });
    }
  }
  for (const [step, config] of Object.entries(definition.machine.states)) sites.push(...commandFormulas(step, config));
  const timersSeen = new Set<string>();
  for (const t of transitions) {
    if (t.via === "after" && t.key !== undefined && !timersSeen.has(`${t.step}\u0000${t.key}`)) {
      timersSeen.add(`${t.step}\u0000${t.key}`);
      sites.push({ expr: t.key, expect: DIMENSIONS.time, target: t.target, place: `the timer \`${t.key}\` of step ${t.step}` });
    }
    if (t.transition.guard) {
      sites.push({
        expr: t.transition.guard.params.expr,
        expect: DIMENSIONS.boolean,
        target: t.target,
        place: `the condition of ${describeTransition(t, false)}`,
      });
    }
  }
  definition.monitors.forEach((m, i) =>
    sites.push({ expr: m.when, expect: DIMENSIONS.boolean, target: { type: "definition", monitor: i }, place: `the condition of monitor ${i + 1} (${m.alarm.kind})` }),
  );
  return sites;
}

/** Expected dimension of a derived setting is its own unit; filled in here where the scope is known. */
function expectationFor(site: Omit<FormulaSite, "analysis">, scope: FormulaScope): Expectation {
  if (site.target.type !== "setting" || site.expect !== "any") return site.expect;
  const dim = scope.get(site.target.setting)?.dimension;
  return dim === undefined || dim === "unknown" ? "any" : dim;
}

export function buildContext(definition: SequenceDefinition): CheckContext {
  const states = definition.machine.states;
  const stepNames = Object.keys(states);
  const transitions = stepNames.flatMap((step) => stepTransitions(step, states[step]));
  const scope = formulaScope(definition.settings);
  const formulas = collectFormulas(definition, transitions).map((site) => {
    const expect = expectationFor(site, scope);
    return { ...site, expect, analysis: analyseFormula(site.expr, scope, expect) };
  });
  return {
    definition,
    stepNames,
    transitions,
    formulas,
    scope,
    bounds: rangeEnvironment(definition.settings, "bounds"),
    defaults: rangeEnvironment(definition.settings, "defaults"),
    atEntry: rangeEnvironment(definition.settings, "bounds", { tStep: { kind: "number", lo: 0, hi: 0 } }),
  };
}

/** Transitions that leave their step for an existing, different step. */
export function exitsOf(ctx: CheckContext, step: string): TransitionSite[] {
  return ctx.transitions.filter((t) => t.step === step && t.transition.target !== step && t.transition.target in ctx.definition.machine.states);
}
