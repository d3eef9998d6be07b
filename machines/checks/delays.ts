/**
 * Timer delays that cannot work: negative (XState would fire them at once, hiding a design error),
 * infinite (the timer never fires), or negative for some allowed setting values (e.g. `60 / RR - Ti`
 * at a high rate and a long Ti).
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { evaluateRange } from "@/machines/formula-analysis";

export const DELAY_NEGATIVE = "delay-negative";
export const DELAY_INVALID = "delay-invalid";
export const DELAY_CAN_BE_NEGATIVE = "delay-can-be-negative";

const seconds = (x: number): string => `${Number(x.toPrecision(4))} s`;

export function checkDelays(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  for (const site of ctx.formulas) {
    if (site.target.type !== "transition" || site.target.via !== "after" || site.expr !== site.target.key) continue;
    if (site.analysis.problems.length > 0) continue;
    const { step } = site.target;
    const saved = evaluateRange(site.expr, ctx.defaults);
    if (saved.kind === "boolean" || saved.kind === "text") {
      problems.push({ id: DELAY_INVALID, severity: "error", message: `The timer \`${site.expr}\` of step ${step} is not a number of seconds.`, target: site.target });
      continue;
    }
    if (saved.kind !== "number") continue;
    if (saved.lo === Infinity || saved.hi === -Infinity) {
      problems.push({ id: DELAY_INVALID, severity: "error", message: `The timer \`${site.expr}\` of step ${step} is infinite, so it would never fire.`, target: site.target });
      continue;
    }
    if (saved.hi < 0) {
      const value = saved.lo === saved.hi ? ` (${seconds(saved.lo)})` : "";
      problems.push({
        id: DELAY_NEGATIVE,
        severity: "error",
        message: `The timer \`${site.expr}\` of step ${step} is negative${value} with the saved setting values.`,
        target: site.target,
      });
      continue;
    }
    const allowed = evaluateRange(site.expr, ctx.bounds);
    if (allowed.kind === "number" && allowed.lo < 0 && Number.isFinite(allowed.lo)) {
      problems.push({
        id: DELAY_CAN_BE_NEGATIVE,
        severity: "warning",
        message: `The timer \`${site.expr}\` of step ${step} can fall below zero (down to ${seconds(allowed.lo)}) for some allowed setting values; narrow the settings' bounds or clamp it with max(…, 0).`,
        target: site.target,
      });
    }
  }
  return problems;
}
