"use client";
/**
 * Editor keyboard shortcuts. Listened for on the window (React Flow's pane does not keep focus), but
 * only while focus is in the editor or nowhere, and never while typing in a field.
 */
import { useEffect, useRef, type RefObject } from "react";

export interface Shortcuts {
  delete?: () => void;
  undo?: () => void;
  redo?: () => void;
  copy?: () => void;
  cut?: () => void;
  paste?: () => void;
  selectAll?: () => void;
  clear?: () => void;
  fit?: () => void;
  layout?: () => void;
  save?: () => void;
}

function typing(el: Element | null): boolean {
  if (!el) return false;
  const tag = el.tagName;
  return tag === "INPUT" || tag === "TEXTAREA" || tag === "SELECT" || (el as HTMLElement).isContentEditable;
}

export function useShortcuts(root: RefObject<HTMLElement | null>, shortcuts: Shortcuts) {
  const latest = useRef(shortcuts);
  useEffect(() => {
    latest.current = shortcuts;
  });
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const active = document.activeElement;
      const inEditor = !active || active === document.body || (root.current?.contains(active) ?? false);
      if (!inEditor) return;
      const s = latest.current;
      const mod = e.ctrlKey || e.metaKey;
      const key = e.key.toLowerCase();
      // Ctrl+S saves even from a field: it is what people press after typing the message.
      if (mod && key === "s" && s.save) {
        e.preventDefault();
        s.save();
        return;
      }
      if (typing(active)) return;
      let run: (() => void) | undefined;
      if (mod && key === "z") run = e.shiftKey ? s.redo : s.undo;
      else if (mod && key === "y") run = s.redo;
      else if (mod && key === "c") run = s.copy;
      else if (mod && key === "x") run = s.cut;
      else if (mod && key === "v") run = s.paste;
      else if (mod && key === "a") run = s.selectAll;
      else if (mod || e.altKey) return;
      else if (key === "delete" || key === "backspace") run = s.delete;
      else if (key === "escape") run = s.clear;
      else if (key === "f") run = s.fit;
      else if (key === "l") run = s.layout;
      if (run) {
        e.preventDefault();
        run();
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [root]);
}
