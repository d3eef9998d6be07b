/**
 * Undo/redo over whole editor documents. Edits that arrive in a burst with the same group key
 * (typing in one field) merge into one undo step, so Ctrl+Z undoes a word, not a character.
 */
import type { EditorDoc } from "./doc";

export interface History {
  past: EditorDoc[];
  present: EditorDoc;
  future: EditorDoc[];
  lastGroup: string | null;
  lastAt: number;
  /**
   * Bumped by every change that did not come from the inspector (undo, canvas edits, imports), so the
   * inspector re-reads its form; its own live edits leave it alone and keep the caret where it is.
   */
  epoch: number;
}

export type HistoryAction =
  | { type: "apply"; doc: EditorDoc; group?: string; at?: number; origin?: "inspector" }
  | { type: "undo" }
  | { type: "redo" }
  | { type: "reset"; doc: EditorDoc };

const LIMIT = 200;
const MERGE_MS = 1000;

export function initHistory(doc: EditorDoc): History {
  return { past: [], present: doc, future: [], lastGroup: null, lastAt: 0, epoch: 0 };
}

export function historyReducer(h: History, action: HistoryAction): History {
  switch (action.type) {
    case "apply": {
      if (action.doc === h.present) return h;
      const at = action.at ?? Date.now();
      const merge = action.group !== undefined && action.group === h.lastGroup && at - h.lastAt < MERGE_MS;
      const past = merge ? h.past : [...h.past, h.present].slice(-LIMIT);
      const epoch = action.origin === "inspector" ? h.epoch : h.epoch + 1;
      return { past, present: action.doc, future: [], lastGroup: action.group ?? null, lastAt: at, epoch };
    }
    case "undo": {
      if (h.past.length === 0) return h;
      const present = h.past[h.past.length - 1];
      return { past: h.past.slice(0, -1), present, future: [h.present, ...h.future], lastGroup: null, lastAt: 0, epoch: h.epoch + 1 };
    }
    case "redo": {
      if (h.future.length === 0) return h;
      const [present, ...future] = h.future;
      return { past: [...h.past, h.present], present, future, lastGroup: null, lastAt: 0, epoch: h.epoch + 1 };
    }
    case "reset":
      return { ...initHistory(action.doc), epoch: h.epoch + 1 };
  }
}
