/**
 * Problems shown live in the editor: the static checks (machines/checks, the same the server runs on
 * save) over the current definition, and what selecting each one means on the canvas.
 */
import { edgeId, type TransitionRef } from "@/machines/graph";
import { runStaticChecks, type Problem, type ProblemTarget } from "@/machines/checks";
import type { SequenceDefinition } from "@/machines/schema";
import type { CanvasDecorations } from "../canvas/decorations";
import type { Selection } from "./doc";

export type { Problem };

export function liveProblems(def: SequenceDefinition): Problem[] {
  try {
    return runStaticChecks(def);
  } catch (err) {
    // A check that crashes must not take the editor down with it; say so instead.
    return [
      {
        id: "checks-failed",
        severity: "warning",
        message: `The static checks could not run on this definition (${err instanceof Error ? err.message : String(err)}). The server runs them again on save.`,
        target: { type: "definition" },
      },
    ];
  }
}

export function refOfTarget(t: ProblemTarget & { type: "transition" }): TransitionRef {
  if (t.via === "after") return { step: t.step, group: "after", key: t.key ?? "", index: t.index };
  return { step: t.step, group: "on", key: t.via, index: t.index };
}

export function selectionOfTarget(t: ProblemTarget): Selection | null {
  switch (t.type) {
    case "step":
      return { steps: [t.step], transitions: [] };
    case "transition":
      return { steps: [], transitions: [refOfTarget(t)] };
    case "setting":
      return { steps: [], transitions: [], setting: t.setting };
    case "definition":
      return null;
  }
}

export function problemDecorations(problems: readonly Problem[]): Pick<CanvasDecorations, "stepProblems" | "edgeProblems"> {
  const stepProblems: NonNullable<CanvasDecorations["stepProblems"]> = {};
  const edgeProblems: NonNullable<CanvasDecorations["edgeProblems"]> = {};
  for (const p of problems) {
    if (p.target.type === "step") {
      const cur = stepProblems[p.target.step];
      stepProblems[p.target.step] = {
        level: cur?.level === "error" || p.severity === "error" ? "error" : "warning",
        count: (cur?.count ?? 0) + 1,
      };
    } else if (p.target.type === "transition") {
      const id = edgeId(refOfTarget(p.target));
      if (edgeProblems[id] !== "error") edgeProblems[id] = p.severity;
    }
  }
  return { stepProblems, edgeProblems };
}

export function countBySeverity(problems: readonly Problem[]): { errors: number; warnings: number } {
  let errors = 0;
  for (const p of problems) if (p.severity === "error") errors++;
  return { errors, warnings: problems.length - errors };
}
