/**
 * Cycles of steps that can be gone round with no time passing. The engine caps transitions per scan
 * and stops such a run with an error; here we find them before a run.
 *
 * An exit is instantaneous when it can fire the moment its step is entered (tStep = 0): a scan exit
 * without a condition or whose condition holds at entry, or a timer whose delay is zero. It is
 * "certain" when it always fires at entry and "possible" when it may (a condition on live signals, a
 * delay whose allowed range reaches zero). A cycle of certain exits is an error; a cycle that needs
 * possible exits is a warning. Operator and fault events are external and never instantaneous.
 */
import type { CheckContext, TransitionSite } from "@/machines/checks/context";
import { conditionVerdict } from "@/machines/checks/exit-conditions";
import type { Problem } from "@/machines/checks/types";
import { evaluateRange } from "@/machines/formula-analysis";
import { cyclePath, cyclicComponents } from "@/machines/checks/cycles";

export const ZERO_TIME_CYCLE = "zero-time-cycle";
export const POSSIBLE_ZERO_TIME_CYCLE = "possible-zero-time-cycle";

type Instant = "certain" | "possible" | "none";

function timerInstant(ctx: CheckContext, t: TransitionSite): Instant {
  const site = ctx.formulas.find((f) => f.target === t.target && f.expr === t.key);
  if (!site || site.analysis.problems.length > 0) return "none";
  const r = evaluateRange(t.key ?? "", ctx.bounds);
  if (r.kind !== "number") return "none";
  if (r.hi <= 0) return "certain";
  return r.lo <= 0 ? "possible" : "none";
}

export function instantaneous(ctx: CheckContext, t: TransitionSite): Instant {
  if (!(t.transition.target in ctx.definition.machine.states)) return "none";
  let base: Instant;
  if (t.via === "SCAN") base = "certain";
  else if (t.via === "after") base = timerInstant(ctx, t);
  else return "none";
  if (base === "none") return "none";
  const verdict = conditionVerdict(ctx, t, ctx.atEntry);
  if (verdict === "never") return "none";
  return verdict === "always" ? base : "possible";
}

function graph(ctx: CheckContext, accept: (i: Instant) => boolean): Map<string, Set<string>> {
  const edges = new Map<string, Set<string>>();
  for (const t of ctx.transitions) {
    if (!accept(instantaneous(ctx, t))) continue;
    if (!edges.has(t.step)) edges.set(t.step, new Set());
    edges.get(t.step)!.add(t.transition.target);
  }
  return edges;
}

export function checkZeroTimeCycles(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  const certain = graph(ctx, (i) => i === "certain");
  const certainCycles = cyclicComponents(ctx.stepNames, certain);
  for (const component of certainCycles) {
    const path = cyclePath(component, certain, ctx.stepNames);
    problems.push({
      id: ZERO_TIME_CYCLE,
      severity: "error",
      message: `Steps ${path.join(" → ")} form a loop that takes no time: each exit fires as soon as its step is entered (no condition, an always-true condition, or a zero delay), so the controller would cycle without end within one scan. Make one of these exits wait for a timer or for a condition that needs time.`,
      target: { type: "step", step: path[0] },
    });
  }
  const covered = new Set(certainCycles.flat());
  const possible = graph(ctx, (i) => i !== "none");
  for (const component of cyclicComponents(ctx.stepNames, possible)) {
    if (component.every((s) => covered.has(s))) continue;
    const path = cyclePath(component, possible, ctx.stepNames);
    problems.push({
      id: POSSIBLE_ZERO_TIME_CYCLE,
      severity: "warning",
      message: `Steps ${path.join(" → ")} can form a loop that takes no time if their exit conditions hold on entry (or their delays are set to zero). Consider a minimum time in one of these steps, for example \`tStep > 0.2 and …\`.`,
      target: { type: "step", step: path[0] },
    });
  }
  return problems;
}
