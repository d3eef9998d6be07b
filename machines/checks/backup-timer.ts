/**
 * A wait-for-trigger step needs a timer exit so an apnoeic patient still gets a breath. Warning: a
 * spontaneous-only design may rely on an apnoea alarm instead, which the reviewer must accept.
 */
import { exitsOf, type CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { evaluateRange } from "@/machines/formula-analysis";

export const TRIGGER_NO_BACKUP_TIMER = "trigger-no-backup-timer";

export function checkBackupTimer(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  for (const step of ctx.stepNames) {
    if (ctx.definition.machine.states[step].meta.kind !== "wait-for-trigger") continue;
    const timers = exitsOf(ctx, step).filter((t) => t.via === "after");
    // An infinite delay never fires, so it is no backup.
    const usable = timers.filter((t) => {
      const r = evaluateRange(t.key ?? "", ctx.defaults);
      return !(r.kind === "number" && r.lo === Infinity);
    });
    if (usable.length > 0) continue;
    problems.push({
      id: TRIGGER_NO_BACKUP_TIMER,
      severity: "warning",
      message: `Wait-for-trigger step ${step} has no backup timer: if the patient stops breathing no breath is delivered. Add an \`after\` exit (for example the apnoea interval) to an inhale step.`,
      target: { type: "step", step },
    });
  }
  return problems;
}
