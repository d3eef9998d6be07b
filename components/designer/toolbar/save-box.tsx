"use client";
/** The save control: a message for the revision and the button; Ctrl+S submits it too. */
import { forwardRef } from "react";

export interface SaveBoxProps {
  message: string;
  onMessage: (m: string) => void;
  onSave: () => void;
  saving: boolean;
  dirty: boolean;
  blocking: number;
}

export const SaveBox = forwardRef<HTMLInputElement, SaveBoxProps>(function SaveBox({ message, onMessage, onSave, saving, dirty, blocking }, ref) {
  return (
    <form
      className="flex items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        onSave();
      }}
    >
      <label className="sr-only" htmlFor="revision-message">
        Revision message
      </label>
      <input
        id="revision-message"
        ref={ref}
        value={message}
        onChange={(e) => onMessage(e.target.value)}
        placeholder="What changed?"
        maxLength={500}
        className="w-56 rounded border border-ink-300 px-2 py-0.5 text-xs"
        data-testid="save-message"
      />
      <button
        type="submit"
        disabled={saving}
        title={blocking > 0 ? `${blocking} error(s) will block the save` : "Save as a new revision (Ctrl+S)"}
        aria-keyshortcuts="Control+S"
        className="rounded bg-ink-900 px-3 py-0.5 text-xs font-semibold text-white hover:bg-ink-700 disabled:opacity-50"
        data-testid="save-revision"
      >
        {saving ? "Saving…" : dirty ? "Save revision" : "Save (no changes)"}
      </button>
    </form>
  );
});
