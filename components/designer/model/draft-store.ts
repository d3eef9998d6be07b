/**
 * Unsaved edits kept in the browser (localStorage) so a closed tab, a crash or a reload does not lose
 * them. One draft per sequence; cleared when a save succeeds. A stored draft is validated like an
 * import before it is offered back.
 */
import { z } from "zod";
import { sequenceDefinition, sequenceLayout } from "@/machines/schema";
import type { EditorDoc } from "./doc";

const draftSchema = z.object({
  baseRevision: z.number().int(),
  savedAt: z.string(),
  definition: sequenceDefinition,
  layout: sequenceLayout,
});
export type Draft = { baseRevision: number; savedAt: string; doc: EditorDoc };

const key = (sequenceId: string) => `tidewright.draft.${sequenceId}`;

function storage(): Storage | null {
  try {
    return typeof window === "undefined" ? null : window.localStorage;
  } catch {
    return null; // storage disabled (private mode, policy)
  }
}

export function storeDraft(sequenceId: string, baseRevision: number, doc: EditorDoc): void {
  try {
    storage()?.setItem(key(sequenceId), JSON.stringify({ baseRevision, savedAt: new Date().toISOString(), ...doc }));
  } catch {
    // Quota exceeded: the draft is a convenience, the edits are still in the page.
  }
}

export function readDraft(sequenceId: string): Draft | null {
  const raw = storage()?.getItem(key(sequenceId));
  if (!raw) return null;
  try {
    const parsed = draftSchema.safeParse(JSON.parse(raw));
    if (!parsed.success) return null;
    const { baseRevision, savedAt, definition, layout } = parsed.data;
    return { baseRevision, savedAt, doc: { definition, layout } };
  } catch {
    return null;
  }
}

export function clearDraft(sequenceId: string): void {
  storage()?.removeItem(key(sequenceId));
}
