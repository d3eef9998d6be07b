/**
 * Exit conditions that can never hold for any allowed setting value (e.g. `tStep < 0`, or
 * `PEEP > 30` with PEEP limited to 0..20): the exit is dead. A warning, since the sequence still runs.
 */
import { capitalise, describeTransition, type CheckContext } from "@/machines/checks/context";
import { conditionVerdict } from "@/machines/checks/exit-conditions";
import type { Problem } from "@/machines/checks/types";

export const EXIT_NEVER_TRUE = "exit-never-true";

export function checkExitNeverTrue(ctx: CheckContext): Problem[] {
  return ctx.transitions
    .filter((t) => t.transition.guard && conditionVerdict(ctx, t, ctx.bounds) === "never")
    .map((t) => ({
      id: EXIT_NEVER_TRUE,
      severity: "warning" as const,
      message: `${capitalise(describeTransition(t))} can never be taken: its condition is false for every allowed value of the settings and signals it reads.`,
      target: t.target,
    }));
}
