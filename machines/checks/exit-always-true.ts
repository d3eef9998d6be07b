/**
 * Exits that always fire and so hide what comes after them. XState takes the first enabled
 * transition of a trigger's list, so an always-true (or missing) condition shadows every later entry
 * of that list; a scan exit that is always true also leaves before any timer of the step can run.
 */
import { capitalise, describeTransition, type CheckContext, type TransitionSite } from "@/machines/checks/context";
import { conditionVerdict, laterInList } from "@/machines/checks/exit-conditions";
import type { Problem } from "@/machines/checks/types";

export const EXIT_ALWAYS_TRUE = "exit-always-true";
export const EXIT_SHADOWS_LATER = "exit-shadows-later";

function shadowedBy(ctx: CheckContext, t: TransitionSite): TransitionSite[] {
  const later = laterInList(ctx, t);
  if (t.via !== "SCAN") return later;
  // The first scan comes one scan period after entry; a timer can only win if it is due by then, which
  // we do not assume.
  const timers = ctx.transitions.filter((o) => o.step === t.step && o.via === "after");
  return [...later, ...timers];
}

function list(sites: TransitionSite[]): string {
  return sites.map((s) => `to ${s.transition.target} ${s.via === "after" ? `after \`${s.key}\`` : s.via === "SCAN" ? "on scan" : `on ${s.via}`}`).join(", ");
}

export function checkExitAlwaysTrue(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  for (const t of ctx.transitions) {
    if (conditionVerdict(ctx, t, ctx.bounds) !== "always") continue;
    const hidden = shadowedBy(ctx, t);
    if (t.transition.guard) {
      // A redundant condition on a timer or event exit hides nothing; it only matters on scans or when it shadows.
      if (hidden.length === 0 && t.via !== "SCAN") continue;
      const consequence =
        hidden.length > 0
          ? `so the exits after it (${list(hidden)}) are never taken`
          : `so step ${t.step} is left on its first scan`;
      problems.push({
        id: EXIT_ALWAYS_TRUE,
        severity: "warning",
        message: `The condition of ${describeTransition(t)} is always true for the allowed setting values, ${consequence}.`,
        target: t.target,
      });
    } else if (hidden.length > 0) {
      problems.push({
        id: EXIT_SHADOWS_LATER,
        severity: "warning",
        message: `${capitalise(describeTransition(t))} has no condition, so the exits after it (${list(hidden)}) are never taken.`,
        target: t.target,
      });
    }
  }
  return problems;
}
