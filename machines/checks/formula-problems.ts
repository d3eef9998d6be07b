/**
 * Turns the analysis problems of every formula in the definition into check problems; the formula
 * checks differ only in which kinds they report and under which id.
 */
import type { CheckContext } from "@/machines/checks/context";
import type { Problem, Severity } from "@/machines/checks/types";
import type { FormulaProblemKind } from "@/machines/formula-analysis";

export function formulaProblems(
  ctx: CheckContext,
  kind: FormulaProblemKind,
  id: string,
  severity: Severity = "error",
): Problem[] {
  const problems: Problem[] = [];
  for (const site of ctx.formulas) {
    for (const p of site.analysis.problems) {
      if (p.kind !== kind) continue;
      problems.push({
        id,
        severity,
        message: `In ${site.place} (\`${site.expr}\`): ${p.message}`,
        target: site.target,
      });
    }
  }
  return problems;
}
