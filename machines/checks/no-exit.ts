/**
 * Steps the sequence can enter but never leave. A non-safe step is transient by its kind (an inhale
 * that never ends stops ventilation with the valve closed), so a missing exit is an error. A safe step
 * may latch on purpose; we only warn, because without even a RESET exit the operator cannot recover
 * without restarting the controller.
 */
import { exitsOf, type CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";

export const NO_EXIT = "no-exit";
export const SAFE_STEP_NO_EXIT = "safe-step-no-exit";

export function checkNoExit(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  for (const step of ctx.stepNames) {
    if (exitsOf(ctx, step).length > 0) continue;
    const kind = ctx.definition.machine.states[step].meta.kind;
    if (kind === "safe") {
      problems.push({
        id: SAFE_STEP_NO_EXIT,
        severity: "warning",
        message: `Safe step ${step} has no exit, so once it is entered only a controller restart leaves it; add a RESET exit if the operator should be able to recover.`,
        target: { type: "step", step },
      });
    } else {
      problems.push({
        id: NO_EXIT,
        severity: "error",
        message: `Step ${step} (${kind}) has no exit to another step, so the sequence would stay in it for ever.`,
        target: { type: "step", step },
      });
    }
  }
  return problems;
}
