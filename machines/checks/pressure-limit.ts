/**
 * Every inhale step should be able to end early on high airway pressure: a scan condition that
 * compares `paw` from above (paw > limit, limit < paw, …) and leads to a safe or exhaling step. A
 * warning, not an error: the relief valve and a pressure command also bound pressure, but the
 * reviewer should see that the sequence itself does not.
 */
import type { MathNode } from "mathjs";
import { exitsOf, type CheckContext, type TransitionSite } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { guardVerdict, parseFormula } from "@/machines/formula-analysis";

export const INHALE_NO_PRESSURE_LIMIT = "inhale-no-pressure-limit";

type Compared = { fn: string; args: MathNode[] };

function isPaw(node: MathNode): boolean {
  let n: MathNode = node;
  while (n.type === "ParenthesisNode") n = (n as unknown as { content: MathNode }).content;
  return n.type === "SymbolNode" && (n as unknown as { name: string }).name === "paw";
}

/** True when the expression contains a comparison that holds for high enough `paw`. */
export function comparesPawFromAbove(expr: string): boolean {
  const parsed = parseFormula(expr);
  if (!parsed.ok) return false;
  const found = parsed.ast.filter((node) => {
    if (node.type !== "OperatorNode") return false;
    const { fn, args } = node as unknown as Compared;
    if (args.length !== 2) return false;
    if ((fn === "larger" || fn === "largerEq") && isPaw(args[0])) return true;
    if ((fn === "smaller" || fn === "smallerEq") && isPaw(args[1])) return true;
    return false;
  });
  return found.length > 0;
}

function isPressureLimitExit(ctx: CheckContext, t: TransitionSite): boolean {
  if (t.via !== "SCAN" || !t.transition.guard) return false;
  const expr = t.transition.guard.params.expr;
  if (!comparesPawFromAbove(expr) || guardVerdict(expr, ctx.bounds) === "never") return false;
  const target = ctx.definition.machine.states[t.transition.target];
  if (!target) return false;
  return target.meta.kind === "safe" || target.meta.kind === "exhale" || target.meta.command.kind === "release";
}

export function checkInhalePressureLimit(ctx: CheckContext): Problem[] {
  return ctx.stepNames
    .filter((step) => ctx.definition.machine.states[step].meta.kind === "inhale")
    .filter((step) => !exitsOf(ctx, step).some((t) => isPressureLimitExit(ctx, t)))
    .map((step) => ({
      id: INHALE_NO_PRESSURE_LIMIT,
      severity: "warning" as const,
      message: `Inhale step ${step} has no pressure-limit exit: add a scan condition such as \`paw > Pmax\` leading to an exhale or safe step, so a blocked airway or a cough ends the breath.`,
      target: { type: "step" as const, step },
    }));
}
