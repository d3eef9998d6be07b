"use client";
/** The editor's toolbar: palette, history, view, files, problems count, revision and save. */
import type { Ref } from "react";
import type { StepKind } from "@/machines/schema";
import { StepPalette } from "./step-palette";
import { ToolButton } from "./tool-button";
import { FileButtons } from "./file-buttons";
import { SaveBox, type SaveBoxProps } from "./save-box";

export interface EditorToolbarProps {
  readOnly: boolean;
  canUndo: boolean;
  canRedo: boolean;
  onAddStep: (kind: StepKind) => void;
  onUndo: () => void;
  onRedo: () => void;
  onFit: () => void;
  onLayout: () => void;
  onExport: () => void;
  onImportText: (text: string, fileName: string) => void;
  baseRevision: number;
  dirty: boolean;
  counts: { errors: number; warnings: number };
  onShowProblems: () => void;
  save: SaveBoxProps & { ref: Ref<HTMLInputElement> };
}

export function EditorToolbar(p: EditorToolbarProps) {
  const { ref: saveRef, ...saveProps } = p.save;
  return (
    <div role="toolbar" aria-label="Sequence editor" className="flex flex-wrap items-center gap-x-4 gap-y-2 rounded border border-ink-300 bg-ink-50 px-2 py-1.5">
      {p.readOnly ? (
        <span className="rounded bg-ink-200 px-2 py-0.5 text-xs font-semibold text-ink-700" data-testid="read-only-badge">
          Read-only
        </span>
      ) : (
        <StepPalette onAdd={p.onAddStep} />
      )}
      {p.readOnly ? null : (
        <div className="flex items-center gap-1">
          <ToolButton title="Undo" shortcut="Ctrl+Z" onClick={p.onUndo} disabled={!p.canUndo} data-testid="undo">
            Undo
          </ToolButton>
          <ToolButton title="Redo" shortcut="Ctrl+Shift+Z" onClick={p.onRedo} disabled={!p.canRedo} data-testid="redo">
            Redo
          </ToolButton>
        </div>
      )}
      <div className="flex items-center gap-1">
        <ToolButton title="Zoom to fit" shortcut="F" onClick={p.onFit} data-testid="zoom-fit">
          Fit
        </ToolButton>
        {p.readOnly ? null : (
          <ToolButton title="Auto-layout" shortcut="L" onClick={p.onLayout} data-testid="auto-layout">
            Layout
          </ToolButton>
        )}
      </div>
      <FileButtons onExport={p.onExport} onImportText={p.onImportText} canImport={!p.readOnly} />
      <button
        type="button"
        onClick={p.onShowProblems}
        className={`rounded px-2 py-0.5 text-xs font-medium ${p.counts.errors > 0 ? "bg-red-100 text-red-900" : p.counts.warnings > 0 ? "bg-amber-100 text-amber-900" : "bg-glass-100 text-glass-900"}`}
        data-testid="problem-count"
      >
        {p.counts.errors} error{p.counts.errors === 1 ? "" : "s"}, {p.counts.warnings} warning{p.counts.warnings === 1 ? "" : "s"}
      </button>
      <div className="ml-auto flex items-center gap-2">
        <span className="text-xs text-ink-600" data-testid="base-revision">
          {p.dirty && !p.readOnly ? `revision ${p.baseRevision} + unsaved edits` : `revision ${p.baseRevision}`}
        </span>
        {p.readOnly ? null : <SaveBox ref={saveRef} {...saveProps} />}
      </div>
    </div>
  );
}
