/** Turn a definition diff into the marks each side's canvas draws (a = older on the left, b = newer). */
import type { DefinitionDiff, TransitionAddress } from "@/machines/diff";
import { edgeId } from "@/machines/graph";
import type { CanvasDecorations } from "../canvas/decorations";
import { refOfTarget } from "../model/problems";

export function addressEdgeId(at: TransitionAddress): string {
  return edgeId(refOfTarget({ type: "transition", ...at }));
}

export function diffDecorations(diff: DefinitionDiff): { a: CanvasDecorations; b: CanvasDecorations } {
  const a: Required<Pick<CanvasDecorations, "stepDiff" | "edgeDiff">> = { stepDiff: {}, edgeDiff: {} };
  const b: Required<Pick<CanvasDecorations, "stepDiff" | "edgeDiff">> = { stepDiff: {}, edgeDiff: {} };
  for (const s of diff.steps.removed) a.stepDiff[s] = "removed";
  for (const s of diff.steps.added) b.stepDiff[s] = "added";
  for (const { step } of diff.steps.changed) a.stepDiff[step] = b.stepDiff[step] = "changed";
  for (const t of diff.transitions.removed) a.edgeDiff[addressEdgeId(t.at)] = "removed";
  for (const t of diff.transitions.added) b.edgeDiff[addressEdgeId(t.at)] = "added";
  for (const t of diff.transitions.changed) {
    a.edgeDiff[addressEdgeId(t.atA)] = "changed";
    b.edgeDiff[addressEdgeId(t.atB)] = "changed";
  }
  return { a, b };
}
