"use client";
/** The new-sequence form in a modal over the list (the /sequences/new page shows the same form). */
import { useRef } from "react";
import type { TemplateSummary } from "@/lib/sequences/types";
import { Button } from "@/components/ui/button";
import { CreateSequenceForm } from "./create-sequence-form";

export function CreateSequenceDialog({ projectId, templates }: { projectId: string; templates: TemplateSummary[] }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const close = () => dialog.current?.close();
  return (
    <>
      <Button onClick={() => dialog.current?.showModal()} data-testid="new-sequence">
        New sequence
      </Button>
      <dialog
        ref={dialog}
        aria-labelledby="new-sequence-title"
        className="m-auto w-full max-w-2xl rounded-[var(--radius-card)] border border-line bg-surface p-0 shadow-[var(--shadow-card)] backdrop:bg-ink-950/30"
      >
        <div className="border-b border-line px-5 py-4">
          <h2 id="new-sequence-title" className="text-base font-semibold text-ink-900">
            New sequence
          </h2>
        </div>
        <div className="px-5 py-4">
          <CreateSequenceForm projectId={projectId} templates={templates} onCancel={close} />
        </div>
      </dialog>
    </>
  );
}
