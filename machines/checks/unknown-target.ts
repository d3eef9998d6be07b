/**
 * Transitions and the initial step must name steps that exist. The schema only checks that they are
 * identifiers, and XState would fail at creation time with a message about state nodes, not steps.
 */
import type { CheckContext } from "@/machines/checks/context";
import { capitalise, describeTransition } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";

export const UNKNOWN_TARGET = "unknown-target";
export const UNKNOWN_INITIAL = "unknown-initial";

export function checkUnknownTargets(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  const { machine } = ctx.definition;
  if (!(machine.initial in machine.states)) {
    problems.push({
      id: UNKNOWN_INITIAL,
      severity: "error",
      message: `The sequence starts in step ${machine.initial}, which does not exist.`,
      target: { type: "definition" },
    });
  }
  for (const t of ctx.transitions) {
    if (!(t.transition.target in machine.states)) {
      problems.push({
        id: UNKNOWN_TARGET,
        severity: "error",
        message: `${capitalise(describeTransition(t))} goes to step ${t.transition.target}, which does not exist.`,
        target: t.target,
      });
    }
  }
  return problems;
}
