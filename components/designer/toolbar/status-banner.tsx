"use client";
/**
 * What happened to the last save or import, with the way out: a stale save offers to load the newer
 * revision (your edits stay one Undo away) or to save yours on top of it.
 */
import type { Problem } from "@/machines/checks";

export type EditorStatus =
  | { kind: "idle" }
  | { kind: "saving" }
  | { kind: "saved"; number: number; warnings: number }
  | { kind: "stale"; error: string; latestRevision: number }
  | { kind: "invalid"; error: string; problems: Problem[] }
  | { kind: "refused"; error: string }
  | { kind: "loaded"; number: number }
  | { kind: "imported"; fileName: string; errors: number; warnings: number }
  | { kind: "import-failed"; fileName: string; errors: string[] }
  | { kind: "info"; text: string }
  | { kind: "draft"; savedAt: string; baseRevision: number; current: number };

export interface StatusBannerProps {
  status: EditorStatus;
  onRestoreDraft: () => void;
  onDiscardDraft: () => void;
  onLoadLatest: (n: number) => void;
  onSaveOver: (n: number) => void;
  onShowProblems: () => void;
  onDismiss: () => void;
}

export function StatusBanner({ status, onRestoreDraft, onDiscardDraft, onLoadLatest, onSaveOver, onShowProblems, onDismiss }: StatusBannerProps) {
  if (status.kind === "idle" || status.kind === "saving") return null;
  const tone =
    status.kind === "saved" || status.kind === "loaded" || status.kind === "info" || (status.kind === "imported" && status.errors === 0)
      ? "border-glass-300 bg-glass-50 text-glass-950"
      : status.kind === "stale" || status.kind === "imported" || status.kind === "draft"
        ? "border-amber-300 bg-amber-50 text-amber-950"
        : "border-red-300 bg-red-50 text-red-950";
  return (
    <div role="status" aria-live="polite" className={`flex items-start gap-3 rounded border px-3 py-2 text-sm ${tone}`} data-testid="editor-status" data-status={status.kind}>
      <div className="flex-1">
        <Body status={status} onRestoreDraft={onRestoreDraft} onDiscardDraft={onDiscardDraft} onLoadLatest={onLoadLatest} onSaveOver={onSaveOver} onShowProblems={onShowProblems} />
      </div>
      <button type="button" onClick={onDismiss} className="text-xs underline" aria-label="Dismiss message">
        dismiss
      </button>
    </div>
  );
}

function Body({ status, onRestoreDraft, onDiscardDraft, onLoadLatest, onSaveOver, onShowProblems }: Omit<StatusBannerProps, "onDismiss">) {
  const link = "ml-2 rounded border border-current px-2 py-0.5 text-xs font-medium";
  switch (status.kind) {
    case "saved":
      return (
        <span data-testid="saved-revision" data-revision={status.number}>
          Saved as revision {status.number}
          {status.warnings > 0 ? ` with ${status.warnings} warning${status.warnings === 1 ? "" : "s"}` : ""}.
        </span>
      );
    case "stale":
      return (
        <span>
          {status.error} Your edits are still here and nothing has been lost.
          <button type="button" className={link} onClick={() => onLoadLatest(status.latestRevision)} data-testid="load-latest">
            Load revision {status.latestRevision} (Undo brings your edits back)
          </button>
          <button type="button" className={link} onClick={() => onSaveOver(status.latestRevision)} data-testid="save-over">
            Save mine as revision {status.latestRevision + 1}
          </button>
        </span>
      );
    case "invalid":
      return (
        <span>
          {status.error}
          <button type="button" className={link} onClick={onShowProblems}>
            Show problems
          </button>
        </span>
      );
    case "refused":
      return <span data-testid="save-refused">{status.error}</span>;
    case "loaded":
      return <span>Loaded revision {status.number}. Press Ctrl+Z to get your previous edits back.</span>;
    case "imported":
      return (
        <span>
          Imported {status.fileName}
          {status.errors + status.warnings > 0 ? ` — ${status.errors} error(s), ${status.warnings} warning(s) from the static checks.` : " — no problems found."}{" "}
          Ctrl+Z undoes the import.
          {status.errors + status.warnings > 0 ? (
            <button type="button" className={link} onClick={onShowProblems}>
              Show problems
            </button>
          ) : null}
        </span>
      );
    case "import-failed":
      return (
        <div data-testid="import-errors">
          <p>{status.fileName} was not imported; the editor is unchanged.</p>
          <ul className="mt-1 list-disc pl-5 font-mono text-xs">
            {status.errors.map((e) => (
              <li key={e}>{e}</li>
            ))}
          </ul>
        </div>
      );
    case "info":
      return <span>{status.text}</span>;
    case "draft":
      return (
        <span data-testid="draft-offer">
          Unsaved edits from {new Date(status.savedAt).toLocaleString()} are kept in this browser
          {status.baseRevision !== status.current ? ` (made on revision ${status.baseRevision}; this is revision ${status.current})` : ""}.
          <button type="button" className={link} onClick={onRestoreDraft} data-testid="restore-draft">
            Restore them
          </button>
          <button type="button" className={link} onClick={onDiscardDraft}>
            Discard
          </button>
        </span>
      );
    default:
      return null;
  }
}
