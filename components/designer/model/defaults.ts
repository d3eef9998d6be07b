/**
 * Starting values for steps added from the palette. Each kind gets the command it usually has, so
 * a new step simulates at once; the numbers are placeholders the engineer replaces in the inspector.
 */
import type { Command, SequenceDefinition, StepKind } from "@/machines/schema";

export const STEP_KIND_LABELS: Record<StepKind, string> = {
  inhale: "Inhale",
  hold: "Hold",
  exhale: "Exhale",
  "wait-for-trigger": "Wait for trigger",
  safe: "Safe state",
  custom: "Custom",
};

const BASE_NAMES: Record<StepKind, string> = {
  inhale: "inhale",
  hold: "hold",
  exhale: "exhale",
  "wait-for-trigger": "wait",
  safe: "safe",
  custom: "step",
};

export function defaultCommand(kind: StepKind): Command {
  switch (kind) {
    case "inhale":
      // 30 L/min is a moderate adult inspiratory flow: it moves the lung without tripping relief valves.
      return { kind: "flow", flow: "30" };
    case "hold":
      return { kind: "hold" };
    case "custom":
      return { kind: "hold" };
    default:
      return { kind: "release" };
  }
}

/** `base`, or `base2`, `base3`… — the first name no step uses yet. */
export function uniqueStepName(def: SequenceDefinition, base: string): string {
  const taken = new Set(Object.keys(def.machine.states));
  if (!taken.has(base)) return base;
  for (let i = 2; ; i++) if (!taken.has(`${base}${i}`)) return `${base}${i}`;
}

export function defaultStepName(def: SequenceDefinition, kind: StepKind): string {
  return uniqueStepName(def, BASE_NAMES[kind]);
}
