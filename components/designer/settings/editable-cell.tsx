"use client";
/**
 * A table cell edited in place: it keeps its own draft while focused, checks it on every key, and
 * commits on Enter or when focus leaves (Escape puts the saved value back). A draft that does not
 * validate is kept in the cell with its error, never written to the sequence.
 */
import { useId, useState } from "react";

export interface EditableCellProps {
  value: string;
  label: string;
  validate: (draft: string) => { error: string | null; hint?: string | null };
  onCommit: (draft: string) => void;
  disabled?: boolean;
  mono?: boolean;
  placeholder?: string;
  testId?: string;
  width?: string;
}

export function EditableCell({ value, label, validate, onCommit, disabled, mono, placeholder, testId, width }: EditableCellProps) {
  const id = useId();
  const [draft, setDraft] = useState<string | null>(null);
  const shown = draft ?? value;
  const check = draft === null ? { error: null, hint: null } : validate(draft);

  const commit = () => {
    if (draft === null) return;
    if (draft !== value && !check.error) onCommit(draft);
    if (!check.error) setDraft(null);
  };

  return (
    <div className="flex flex-col">
      <input
        aria-label={label}
        value={shown}
        disabled={disabled}
        placeholder={placeholder}
        spellCheck={false}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === "Enter") commit();
          if (e.key === "Escape") setDraft(null);
        }}
        aria-invalid={check.error ? true : undefined}
        aria-describedby={check.error || check.hint ? `${id}-msg` : undefined}
        data-testid={testId}
        className={`${width ?? "w-full"} rounded border px-1.5 py-0.5 text-sm disabled:border-transparent disabled:bg-transparent ${
          mono ? "font-mono" : ""
        } ${check.error ? "border-red-600" : "border-ink-300"}`}
      />
      {check.error || check.hint ? (
        <span id={`${id}-msg`} role={check.error ? "alert" : undefined} className={`text-[11px] ${check.error ? "text-red-700" : "text-ink-500"}`}>
          {check.error ?? check.hint}
        </span>
      ) : null}
    </div>
  );
}
