/**
 * What the editor edits: the definition and its canvas layout, always together, so an undo step
 * restores both (moving a step and renaming it are one history).
 */
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { TransitionRef } from "@/machines/graph";

export interface EditorDoc {
  definition: SequenceDefinition;
  layout: SequenceLayout;
}

export interface Selection {
  steps: string[];
  transitions: TransitionRef[];
  /** A setting picked from the problems panel (highlighted in the settings table). */
  setting?: string;
}

export const EMPTY_SELECTION: Selection = { steps: [], transitions: [] };

/** A structural copy: edits build new objects, but a deep copy keeps callers from sharing nested state. */
export function cloneDefinition(def: SequenceDefinition): SequenceDefinition {
  return structuredClone(def);
}
