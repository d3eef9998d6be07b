/**
 * Steps no path from the initial step reaches. Every transition counts, whatever its trigger or
 * condition, so a step is only reported when nothing at all can lead to it.
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";

export const UNREACHABLE_STEP = "unreachable-step";

export function reachableSteps(ctx: CheckContext): Set<string> {
  const { initial, states } = ctx.definition.machine;
  const seen = new Set<string>();
  if (!(initial in states)) return seen;
  const queue = [initial];
  seen.add(initial);
  while (queue.length > 0) {
    const step = queue.shift()!;
    for (const t of ctx.transitions) {
      const next = t.transition.target;
      if (t.step === step && next in states && !seen.has(next)) {
        seen.add(next);
        queue.push(next);
      }
    }
  }
  return seen;
}

export function checkUnreachableSteps(ctx: CheckContext): Problem[] {
  const { initial, states } = ctx.definition.machine;
  // With no valid initial step every step would be "unreachable"; unknown-initial says it once.
  if (!(initial in states)) return [];
  const reachable = reachableSteps(ctx);
  return ctx.stepNames
    .filter((step) => !reachable.has(step))
    .map((step) => ({
      id: UNREACHABLE_STEP,
      severity: "warning" as const,
      message: `Step ${step} can never be entered: no transition path leads to it from the initial step ${initial}.`,
      target: { type: "step" as const, step },
    }));
}
