/** Step intervals for the band plugin: which are visible, and a stable tone per step name. */
import type { StepInterval } from "@/lib/sim/types";

/** Intervals overlapping [from, to]; `steps` sorted by `from`. */
export function visibleSteps(steps: readonly StepInterval[], from: number, to: number): StepInterval[] {
  return steps.filter((s) => s.to > from && s.from < to);
}

/**
 * Index of a step's tone: by its place in `stepNames` (the sequence's order), so the same step keeps its tone
 * across zooms and between the run view and its legend.
 */
export function stepToneIndex(stepNames: readonly string[], step: string, tones: number): number {
  const at = stepNames.indexOf(step);
  const index = at >= 0 ? at : hashName(step);
  return ((index % tones) + tones) % tones;
}

function hashName(name: string): number {
  let h = 0;
  for (let i = 0; i < name.length; i += 1) h = (h * 31 + name.charCodeAt(i)) | 0;
  return Math.abs(h);
}

/** Step names in first-appearance order when the run did not send its list. */
export function stepNamesOf(steps: readonly StepInterval[], declared: readonly string[] | null | undefined): string[] {
  if (declared && declared.length > 0) return [...declared];
  const names: string[] = [];
  for (const s of steps) if (!names.includes(s.step)) names.push(s.step);
  return names;
}
