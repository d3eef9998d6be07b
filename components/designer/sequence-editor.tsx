"use client";
/**
 * The sequence designer: canvas in the middle, inspector at the side, live preview under the canvas,
 * settings and problems below. The page (designer-server) renders it with the revision to start from.
 * All edits are local until "Save revision" posts a new immutable revision.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { ReactFlowProvider } from "@xyflow/react";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { Rig } from "@/lib/sim/types";
import { completeLayout, definitionToGraph } from "@/machines/graph";
import { SequenceCanvas } from "./canvas/sequence-canvas";
import type { CanvasDecorations } from "./canvas/decorations";
import { Inspector } from "./inspector/inspector";
import { ProblemsPanel } from "./problems/problems-panel";
import { SettingsTable } from "./settings/settings-table";
import { LivePreview } from "./live-preview";
import { EditorToolbar } from "./toolbar/editor-toolbar";
import { StatusBanner, type EditorStatus } from "./toolbar/status-banner";
import { BottomTabs, type BottomTab } from "./bottom-tabs";
import { useEditor } from "./model/use-editor";
import { useEditorActions } from "./model/use-editor-actions";
import { useShortcuts } from "./model/use-shortcuts";
import { liveProblems, problemDecorations, selectionOfTarget, countBySeverity, type Problem } from "./model/problems";
import { loadRevision, saveRevision } from "./model/revisions-api";
import { definitionFileName, definitionFileText, parseDefinitionFile } from "./model/import-export";
import { downloadText } from "./model/download";
import { clearDraft, readDraft, storeDraft, type Draft } from "./model/draft-store";
import type { EditorDoc } from "./model/doc";

export interface SequenceEditorProps {
  sequenceId: string;
  projectId: string;
  sequenceName: string;
  revision: { number: number; definition: SequenceDefinition; layout: SequenceLayout | null; hash: string };
  rig: Rig;
  readOnly: boolean;
}

export function SequenceEditor(props: SequenceEditorProps) {
  return (
    <ReactFlowProvider>
      <EditorBody {...props} />
    </ReactFlowProvider>
  );
}

function EditorBody({ sequenceId, sequenceName, revision, rig, readOnly }: SequenceEditorProps) {
  const initialDoc = useMemo<EditorDoc>(
    () => ({ definition: revision.definition, layout: completeLayout(revision.definition, revision.layout) }),
    // The editor owns its document after mount; a re-render of the page with a new revision does not reset it.
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [],
  );
  const editor = useEditor(initialDoc);
  const { doc, selection } = editor;
  const rootRef = useRef<HTMLDivElement>(null);
  const canvasBoxRef = useRef<HTMLDivElement>(null);
  const messageRef = useRef<HTMLInputElement>(null);

  const [baseRevision, setBaseRevision] = useState(revision.number);
  const [savedDoc, setSavedDoc] = useState<EditorDoc>(initialDoc);
  const [message, setMessage] = useState("");
  const [status, setStatus] = useState<EditorStatus>({ kind: "idle" });
  const [serverProblems, setServerProblems] = useState<Problem[]>([]);
  const [tab, setTab] = useState<BottomTab>("problems");
  const [live, setLive] = useState<{ step: string | null; from: string | null }>({ step: null, from: null });
  const activeStep = live.step;
  const onActiveStep = useCallback((step: string | null) => setLive((l) => ({ step, from: step === null ? null : l.step })), []);
  const dirty = doc !== savedDoc;
  const [draft, setDraft] = useState<Draft | null>(null);

  // Offer back edits a previous visit left unsaved (read once, after mount: localStorage is client-only).
  useEffect(() => {
    if (readOnly) return;
    // In a task, not during the effect: the offer is a second render anyway, after hydration.
    const id = setTimeout(() => {
      const found = readDraft(sequenceId);
      if (!found || JSON.stringify(found.doc.definition) === JSON.stringify(initialDoc.definition)) return;
      setDraft(found);
      setStatus({ kind: "draft", savedAt: found.savedAt, baseRevision: found.baseRevision, current: revision.number });
    }, 0);
    return () => clearTimeout(id);
  }, [initialDoc, readOnly, revision.number, sequenceId]);

  // Keep unsaved edits in the browser, a moment after the last change.
  useEffect(() => {
    if (readOnly || !dirty) return;
    const id = setTimeout(() => storeDraft(sequenceId, baseRevision, doc), 800);
    return () => clearTimeout(id);
  }, [baseRevision, dirty, doc, readOnly, sequenceId]);

  const problems = useMemo(() => liveProblems(doc.definition), [doc.definition]);
  const counts = countBySeverity(problems);
  const liveEdge = useMemo(() => takenEdge(doc.definition, live.from, live.step), [doc.definition, live]);
  const decorations = useMemo<CanvasDecorations>(
    () => ({ ...problemDecorations(problems), activeStep, liveEdge }),
    [problems, activeStep, liveEdge],
  );

  const actions = useEditorActions({ editor, canvasBoxRef, readOnly, onStatus: setStatus });

  const save = useCallback(
    async (base = baseRevision) => {
      if (readOnly || status.kind === "saving") return;
      setStatus({ kind: "saving" });
      const sent = doc;
      const outcome = await saveRevision(sequenceId, { definition: sent.definition, layout: sent.layout, message: message.trim(), baseRevision: base });
      switch (outcome.kind) {
        case "saved":
          setBaseRevision(outcome.number);
          setSavedDoc(sent);
          clearDraft(sequenceId);
          setMessage("");
          setServerProblems([]);
          // No router.refresh(): the page keys the editor by revision, and a remount would drop the
          // undo history. The history and compare pages load fresh data when opened.
          setStatus({ kind: "saved", number: outcome.number, warnings: outcome.warnings.length });
          break;
        case "stale":
          setStatus({ kind: "stale", error: outcome.error, latestRevision: outcome.latestRevision });
          break;
        case "invalid":
          setServerProblems(outcome.problems);
          setTab("problems");
          setStatus({ kind: "invalid", error: outcome.error, problems: outcome.problems });
          break;
        case "refused":
          setStatus({ kind: "refused", error: outcome.error });
          break;
      }
    },
    [baseRevision, doc, message, readOnly, sequenceId, status.kind],
  );

  const loadLatest = useCallback(
    async (n: number) => {
      try {
        const r = await loadRevision(sequenceId, n);
        const loaded: EditorDoc = { definition: r.definition, layout: completeLayout(r.definition, r.layout) };
        // An ordinary (undoable) edit: Ctrl+Z brings the engineer's own version back.
        editor.apply(loaded);
        setBaseRevision(r.number);
        setSavedDoc(loaded);
        setStatus({ kind: "loaded", number: r.number });
      } catch (err) {
        setStatus({ kind: "refused", error: err instanceof Error ? err.message : String(err) });
      }
    },
    [editor, sequenceId],
  );

  const importText = useCallback(
    (text: string, fileName: string) => {
      const result = parseDefinitionFile(text);
      if (!result.ok) {
        setStatus({ kind: "import-failed", fileName, errors: result.errors });
        return;
      }
      // Steps that keep their names keep their places; new ones are laid out by the fallback grid.
      editor.apply({ definition: result.definition, layout: completeLayout(result.definition, doc.layout) });
      editor.select({ steps: [], transitions: [] });
      const c = countBySeverity(result.problems);
      setStatus({ kind: "imported", fileName, errors: c.errors, warnings: c.warnings });
      if (result.problems.length > 0) setTab("problems");
    },
    [doc.layout, editor],
  );

  const exportJson = useCallback(() => {
    downloadText(definitionFileText(doc.definition), definitionFileName(sequenceName, dirty ? null : baseRevision));
  }, [baseRevision, dirty, doc.definition, sequenceName]);

  const pickProblem = useCallback(
    (p: Problem) => {
      const sel = selectionOfTarget(p.target);
      if (!sel) {
        setTab("settings");
        return;
      }
      editor.select(sel);
      if (sel.setting) setTab("settings");
    },
    [editor],
  );

  useShortcuts(rootRef, {
    delete: readOnly ? undefined : actions.deleteSelection,
    undo: readOnly ? undefined : editor.undo,
    redo: readOnly ? undefined : editor.redo,
    copy: actions.copy,
    cut: readOnly ? undefined : actions.cut,
    paste: readOnly ? undefined : actions.paste,
    selectAll: actions.selectAll,
    clear: actions.clearSelection,
    fit: actions.fit,
    layout: readOnly ? undefined : actions.layout,
    save: readOnly ? undefined : () => void save(),
  });

  // Leaving with unsaved edits asks first; the browser shows its own wording.
  useEffect(() => {
    if (!dirty || readOnly) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [dirty, readOnly]);

  return (
    <div
      ref={rootRef}
      className="flex flex-col gap-2"
      data-testid="sequence-editor"
      data-readonly={readOnly ? "true" : "false"}
      data-base-revision={baseRevision}
      data-dirty={dirty ? "true" : "false"}
    >
      <EditorToolbar
        readOnly={readOnly}
        canUndo={editor.canUndo}
        canRedo={editor.canRedo}
        onAddStep={actions.addStep}
        onUndo={editor.undo}
        onRedo={editor.redo}
        onFit={actions.fit}
        onLayout={actions.layout}
        onExport={exportJson}
        onImportText={importText}
        baseRevision={baseRevision}
        dirty={dirty}
        counts={counts}
        onShowProblems={() => setTab("problems")}
        save={{
          message,
          onMessage: setMessage,
          onSave: () => void save(),
          saving: status.kind === "saving",
          dirty,
          blocking: counts.errors,
          ref: messageRef,
        }}
      />
      <StatusBanner
        status={status}
        onRestoreDraft={() => {
          if (draft) editor.apply(draft.doc);
          setDraft(null);
          setStatus({ kind: "info", text: "Restored your unsaved edits. Ctrl+Z goes back to the saved revision." });
        }}
        onDiscardDraft={() => {
          clearDraft(sequenceId);
          setDraft(null);
          setStatus({ kind: "idle" });
        }}
        onLoadLatest={(n) => void loadLatest(n)}
        onSaveOver={(n) => void save(n)}
        onShowProblems={() => setTab("problems")}
        onDismiss={() => setStatus({ kind: "idle" })}
      />
      <div className="grid min-h-0 grid-cols-[minmax(0,1fr)_22rem] gap-2">
        <div className="flex min-w-0 flex-col gap-2">
          <div ref={canvasBoxRef} className="h-[58vh] min-h-[420px] overflow-hidden rounded border border-ink-300 bg-surface">
            <SequenceCanvas
              definition={doc.definition}
              layout={doc.layout}
              editable={!readOnly}
              selection={selection}
              onSelectionChange={editor.select}
              decorations={decorations}
              onMoveSteps={actions.moveSteps}
              onConnect={actions.connect}
              minimap={Object.keys(doc.definition.machine.states).length > 10}
              label={`Steps of ${sequenceName}`}
            />
          </div>
          <LivePreview definition={doc.definition} rig={rig} onActiveStep={onActiveStep} />
        </div>
        <div className="max-h-[calc(58vh+24rem)] overflow-hidden rounded border border-ink-300 bg-surface">
          <Inspector
            definition={doc.definition}
            selection={selection}
            readOnly={readOnly}
            formKey={`${editor.selectionSerial}:${editor.epoch}`}
            onApplyStepMeta={actions.applyStepMeta}
            onRenameStep={actions.renameStep}
            onSetInitial={actions.setInitial}
            onApplyTransition={actions.applyTransition}
            onMoveTransition={actions.moveTransition}
            onDeleteSelection={actions.deleteSelection}
          />
        </div>
      </div>
      <BottomTabs
        tab={tab}
        onTab={setTab}
        problemCount={problems.length}
        errorCount={counts.errors}
        settingCount={Object.keys(doc.definition.settings).length}
        problems={<ProblemsPanel problems={problems} serverProblems={serverProblems} onPick={pickProblem} />}
        settings={
          <SettingsTable
            definition={doc.definition}
            rig={rig}
            readOnly={readOnly}
            highlight={selection.setting}
            onChange={(definition, group) => editor.apply({ ...doc, definition }, { group })}
          />
        }
      />
    </div>
  );
}

/**
 * The edge the preview just took, when it is the only one from the previous step to the current one.
 * The engine reports steps, not transitions, so with parallel exits there is no honest single answer.
 */
function takenEdge(def: SequenceDefinition, from: string | null, to: string | null): string | null {
  if (!from || !to) return null;
  const candidates = definitionToGraph(def, null).edges.filter((e) => e.source === from && e.target === to);
  return candidates.length === 1 ? candidates[0].id : null;
}
