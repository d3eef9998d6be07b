/** Verdicts on exit conditions shared by the never-true, always-true and zero-time checks. */
import type { CheckContext, TransitionSite } from "@/machines/checks/context";
import { guardVerdict, type GuardVerdict, type RangeEnvironment } from "@/machines/formula-analysis";

/**
 * Verdict on a transition's condition over `env`; an unguarded transition is "always". A condition
 * whose formula has problems is "depends": its own checks report it and a verdict would mislead.
 */
export function conditionVerdict(ctx: CheckContext, t: TransitionSite, env: RangeEnvironment): GuardVerdict {
  const guard = t.transition.guard;
  if (!guard) return "always";
  const site = ctx.formulas.find((f) => f.target === t.target && f.expr === guard.params.expr);
  if (!site || site.analysis.problems.length > 0) return "depends";
  return guardVerdict(guard.params.expr, env);
}

/** Transitions of the same step and trigger list that come after `t` (lower priority). */
export function laterInList(ctx: CheckContext, t: TransitionSite): TransitionSite[] {
  return ctx.transitions.filter((o) => o.step === t.step && o.via === t.via && o.key === t.key && o.index > t.index);
}
