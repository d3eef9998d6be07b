"use client";
/**
 * Editing commands shared by the toolbar, the keyboard shortcuts, the canvas and the inspector —
 * each one pure document edit (model/*-ops) applied through the history.
 */
import { useCallback, useRef, type RefObject } from "react";
import { useReactFlow } from "@xyflow/react";
import { definitionToGraph, STEP_NODE_SIZE, type TransitionRef } from "@/machines/graph";
import { autoLayout } from "@/machines/layout";
import type { StepKind, StepMeta } from "@/machines/schema";
import type { EditorStatus } from "../toolbar/status-banner";
import { copySteps, pasteSteps, type StepClipboard } from "./clipboard";
import { addStep as addStepOp, deleteSteps, moveSteps as moveStepsOp, renameStep as renameStepOp, setInitialStep, updateStepMeta } from "./step-ops";
import { connectSteps, deleteTransitions, moveTransition as moveTransitionOp, updateTransition, type TransitionSpec } from "./transition-ops";
import type { useEditor } from "./use-editor";

interface Deps {
  editor: ReturnType<typeof useEditor>;
  canvasBoxRef: RefObject<HTMLDivElement | null>;
  readOnly: boolean;
  onStatus: (s: EditorStatus) => void;
}

export function useEditorActions({ editor, canvasBoxRef, readOnly, onStatus }: Deps) {
  const flow = useReactFlow();
  const clipboard = useRef<StepClipboard | null>(null);
  const { doc, selection, apply, select } = editor;

  const fit = useCallback(() => {
    void flow.fitView({ padding: 0.18, duration: 250 });
  }, [flow]);

  /** The flow position at the middle of the visible canvas, nudged so new steps do not stack exactly. */
  const visibleCentre = useCallback(() => {
    const box = canvasBoxRef.current?.getBoundingClientRect();
    const centre = box
      ? flow.screenToFlowPosition({ x: box.left + box.width / 2, y: box.top + box.height / 2 })
      : { x: 0, y: 0 };
    const taken = Object.values(doc.layout.nodes);
    const p = { x: centre.x - STEP_NODE_SIZE.width / 2, y: centre.y - STEP_NODE_SIZE.height / 2 };
    while (taken.some((t) => Math.abs(t.x - p.x) < 20 && Math.abs(t.y - p.y) < 20)) {
      p.x += 32;
      p.y += 32;
    }
    return p;
  }, [canvasBoxRef, doc.layout.nodes, flow]);

  const addStep = useCallback(
    (kind: StepKind) => {
      if (readOnly) return;
      const { doc: next, name } = addStepOp(doc, kind, visibleCentre());
      apply(next);
      select({ steps: [name], transitions: [] });
    },
    [apply, doc, readOnly, select, visibleCentre],
  );

  const connect = useCallback(
    (source: string, target: string) => {
      if (readOnly) return;
      const { def, ref } = connectSteps(doc.definition, source, target);
      apply({ ...doc, definition: def });
      select({ steps: [], transitions: [ref] });
    },
    [apply, doc, readOnly, select],
  );

  const moveSteps = useCallback(
    (positions: Record<string, { x: number; y: number }>) => {
      if (!readOnly) apply(moveStepsOp(doc, positions));
    },
    [apply, doc, readOnly],
  );

  const deleteSelection = useCallback(() => {
    if (readOnly || (selection.steps.length === 0 && selection.transitions.length === 0)) return;
    // Transitions first: deleting steps also drops transitions into them and shifts list indices.
    const withoutTransitions = { ...doc, definition: deleteTransitions(doc.definition, selection.transitions) };
    apply(deleteSteps(withoutTransitions, selection.steps));
    select({ steps: [], transitions: [] });
  }, [apply, doc, readOnly, select, selection]);

  const copy = useCallback(() => {
    const clip = copySteps(doc, selection.steps);
    if (!clip) return;
    clipboard.current = clip;
    // Also to the system clipboard, so steps can be pasted into another sequence's tab.
    void navigator.clipboard?.writeText(JSON.stringify(clip)).catch(() => undefined);
    onStatus({ kind: "info", text: `Copied ${selection.steps.length} step${selection.steps.length === 1 ? "" : "s"}.` });
  }, [doc, onStatus, selection.steps]);

  const paste = useCallback(() => {
    if (readOnly || !clipboard.current) return;
    const { doc: next, names } = pasteSteps(doc, clipboard.current);
    apply(next);
    select({ steps: names, transitions: [] });
  }, [apply, doc, readOnly, select]);

  const cut = useCallback(() => {
    copy();
    deleteSelection();
  }, [copy, deleteSelection]);

  const selectAll = useCallback(() => {
    const g = definitionToGraph(doc.definition, null);
    select({ steps: g.nodes.map((n) => n.id), transitions: [] });
  }, [doc.definition, select]);

  const clearSelection = useCallback(() => select({ steps: [], transitions: [] }), [select]);

  const layout = useCallback(async () => {
    if (readOnly) return;
    try {
      const next = await autoLayout(doc.definition);
      apply({ ...doc, layout: next });
      // After React Flow has the new positions.
      requestAnimationFrame(() => fit());
    } catch (err) {
      onStatus({ kind: "refused", error: `Auto-layout failed: ${err instanceof Error ? err.message : String(err)}` });
    }
  }, [apply, doc, fit, onStatus, readOnly]);

  const applyStepMeta = useCallback(
    (step: string, meta: StepMeta) => apply({ ...doc, definition: updateStepMeta(doc.definition, step, meta) }, { group: `meta:${step}`, origin: "inspector" }),
    [apply, doc],
  );

  const renameStep = useCallback(
    (from: string, to: string) => {
      try {
        apply(renameStepOp(doc, from, to), { origin: "inspector" });
        select({ steps: [to], transitions: [] }, true);
      } catch (err) {
        onStatus({ kind: "refused", error: err instanceof Error ? err.message : String(err) });
      }
    },
    [apply, doc, onStatus, select],
  );

  const setInitial = useCallback(
    (step: string) => apply({ ...doc, definition: setInitialStep(doc.definition, step) }, { origin: "inspector" }),
    [apply, doc],
  );

  const applyTransition = useCallback(
    (ref: TransitionRef, spec: TransitionSpec) => {
      const { def, ref: next } = updateTransition(doc.definition, ref, spec);
      apply({ ...doc, definition: def }, { group: `transition:${ref.step}:${editor.selectionSerial}`, origin: "inspector" });
      select({ steps: [], transitions: [next] }, true);
    },
    [apply, doc, editor.selectionSerial, select],
  );

  const moveTransition = useCallback(
    (ref: TransitionRef, delta: number) => {
      const { def, ref: next } = moveTransitionOp(doc.definition, ref, delta);
      apply({ ...doc, definition: def }, { origin: "inspector" });
      select({ steps: [], transitions: [next] }, true);
    },
    [apply, doc, select],
  );

  return {
    fit,
    addStep,
    connect,
    moveSteps,
    deleteSelection,
    copy,
    cut,
    paste,
    selectAll,
    clearSelection,
    layout: () => void layout(),
    applyStepMeta,
    renameStep,
    setInitial,
    applyTransition,
    moveTransition,
  };
}
