/**
 * Derived settings must be computable once from other settings: no cycles (Ti from Te from Ti), and
 * no live signals (a setting is a value with bounds in the settings table, not a per-scan quantity).
 */
import type { CheckContext } from "@/machines/checks/context";
import { cyclePath, cyclicComponents } from "@/machines/checks/cycles";
import type { Problem } from "@/machines/checks/types";

export const SETTING_CYCLE = "setting-cycle";
export const SETTING_USES_SIGNAL = "setting-uses-signal";

export function checkSettingFormulas(ctx: CheckContext): Problem[] {
  const problems: Problem[] = [];
  const settings = ctx.definition.settings;
  const names = Object.keys(settings);
  const edges = new Map<string, Set<string>>();
  for (const site of ctx.formulas) {
    if (site.target.type !== "setting") continue;
    const name = site.target.setting;
    const reads = site.analysis.symbols;
    edges.set(name, new Set(reads.filter((r) => r in settings)));
    const signals = reads.filter((r) => ctx.scope.get(r)?.source === "signal");
    if (signals.length > 0) {
      problems.push({
        id: SETTING_USES_SIGNAL,
        severity: "error",
        message: `Setting ${name} is derived from the live signal${signals.length > 1 ? "s" : ""} ${signals.join(", ")}; a setting may only be computed from other settings.`,
        target: site.target,
      });
    }
  }
  for (const component of cyclicComponents(names, edges)) {
    const path = cyclePath(component, edges, names);
    problems.push({
      id: SETTING_CYCLE,
      severity: "error",
      message: `Settings ${path.join(" → ")} are each computed from the next, so none of them has a value. Give one of them a plain value.`,
      target: { type: "setting", setting: path[0] },
    });
  }
  return problems;
}
