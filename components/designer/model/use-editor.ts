"use client";
/**
 * The editor's state: the document history (undo/redo) and the selection. The selection carries a
 * serial that changes when the user picks something (canvas, problems panel), not when the inspector
 * itself moves it (a rename, a transition changing trigger), so the inspector's form survives its
 * own edits.
 */
import { useCallback, useReducer, useState } from "react";
import type { EditorDoc, Selection } from "./doc";
import { EMPTY_SELECTION } from "./doc";
import { historyReducer, initHistory } from "./history";

export interface ApplyOptions {
  group?: string;
  origin?: "inspector";
}

export function useEditor(initial: EditorDoc) {
  const [history, dispatch] = useReducer(historyReducer, initial, initHistory);
  const [sel, setSel] = useState<{ selection: Selection; serial: number }>({ selection: EMPTY_SELECTION, serial: 0 });

  const apply = useCallback((doc: EditorDoc, opts: ApplyOptions = {}) => dispatch({ type: "apply", doc, ...opts }), []);
  const undo = useCallback(() => dispatch({ type: "undo" }), []);
  const redo = useCallback(() => dispatch({ type: "redo" }), []);
  const reset = useCallback((doc: EditorDoc) => dispatch({ type: "reset", doc }), []);
  const select = useCallback((selection: Selection, fromInspector = false) => {
    setSel((s) => ({ selection, serial: fromInspector ? s.serial : s.serial + 1 }));
  }, []);

  return {
    doc: history.present,
    canUndo: history.past.length > 0,
    canRedo: history.future.length > 0,
    epoch: history.epoch,
    selection: sel.selection,
    selectionSerial: sel.serial,
    apply,
    undo,
    redo,
    reset,
    select,
  };
}
