"use client";
/** Buttons that add a step of each kind, each showing that kind's colour swatch. */
import { STEP_KINDS, type StepKind } from "@/machines/schema";
import { STEP_KIND_LABELS } from "../model/defaults";
import { KIND_STYLES } from "../canvas/kind-style";

export function StepPalette({ onAdd, disabled }: { onAdd: (kind: StepKind) => void; disabled?: boolean }) {
  return (
    <div role="group" aria-label="Add a step" className="flex flex-wrap items-center gap-1">
      <span className="mr-1 text-xs text-ink-600">Add</span>
      {STEP_KINDS.map((k) => (
        <button
          key={k}
          type="button"
          disabled={disabled}
          onClick={() => onAdd(k)}
          data-testid={`palette-${k}`}
          className="flex items-center gap-1 rounded border border-ink-300 bg-surface px-2 py-0.5 text-xs hover:bg-ink-50 disabled:opacity-50"
        >
          <span
            aria-hidden="true"
            className="inline-block h-2.5 w-2.5 rounded-sm border"
            style={{ background: KIND_STYLES[k].fill, borderColor: KIND_STYLES[k].stroke }}
          />
          {STEP_KIND_LABELS[k]}
        </button>
      ))}
    </div>
  );
}
