"use client";
/** The side panel: the form for the one selected step or transition, or a summary of the selection. */
import { getTransition, type TransitionRef } from "@/machines/graph";
import type { SequenceDefinition, StepMeta } from "@/machines/schema";
import type { Selection } from "../model/doc";
import type { TransitionSpec } from "../model/transition-ops";
import { SmallButton } from "./fields";
import { StepForm } from "./step-form";
import { TransitionForm } from "./transition-form";

export interface InspectorProps {
  definition: SequenceDefinition;
  selection: Selection;
  readOnly: boolean;
  /** Changes whenever the form must re-read the document (see History.epoch). */
  formKey: string;
  onApplyStepMeta: (step: string, meta: StepMeta) => void;
  onRenameStep: (from: string, to: string) => void;
  onSetInitial: (step: string) => void;
  onApplyTransition: (ref: TransitionRef, spec: TransitionSpec) => void;
  onMoveTransition: (ref: TransitionRef, delta: number) => void;
  onDeleteSelection: () => void;
}

export function Inspector(props: InspectorProps) {
  const { definition, selection, readOnly } = props;
  const steps = selection.steps.filter((s) => s in definition.machine.states);
  const transitions = selection.transitions.filter((r) => getTransition(definition, r));
  const total = steps.length + transitions.length;

  let body: React.ReactNode;
  if (total === 0) {
    body = <EmptyHint readOnly={readOnly} />;
  } else if (total > 1) {
    body = (
      <div className="flex flex-col gap-2 text-sm">
        <p>
          {steps.length} step{steps.length === 1 ? "" : "s"} and {transitions.length} transition{transitions.length === 1 ? "" : "s"} selected.
        </p>
        {readOnly ? null : (
          <SmallButton tone="danger" className="self-start" onClick={props.onDeleteSelection}>
            Delete selection
          </SmallButton>
        )}
      </div>
    );
  } else if (steps.length === 1) {
    const name = steps[0];
    body = (
      <StepForm
        key={props.formKey}
        name={name}
        definition={definition}
        readOnly={readOnly}
        onApplyMeta={(meta) => props.onApplyStepMeta(name, meta)}
        onRename={(to) => props.onRenameStep(name, to)}
        onSetInitial={() => props.onSetInitial(name)}
        onDelete={props.onDeleteSelection}
      />
    );
  } else {
    const ref = transitions[0];
    const t = getTransition(definition, ref);
    body = t ? (
      <TransitionForm
        key={props.formKey}
        transitionRef={ref}
        transition={t}
        definition={definition}
        readOnly={readOnly}
        onApply={(spec) => props.onApplyTransition(ref, spec)}
        onMove={(delta) => props.onMoveTransition(ref, delta)}
        onDelete={props.onDeleteSelection}
      />
    ) : null;
  }
  return (
    <aside className="flex h-full flex-col gap-3 overflow-y-auto p-3" aria-label="Inspector" data-testid="inspector">
      <h2 className="text-sm font-semibold text-ink-800">{readOnly ? "Details (read-only)" : "Inspector"}</h2>
      {body}
    </aside>
  );
}

function EmptyHint({ readOnly }: { readOnly: boolean }) {
  return (
    <div className="flex flex-col gap-2 text-xs text-ink-600">
      <p>Select a step or a transition to see {readOnly ? "its details" : "and edit it"}.</p>
      {readOnly ? null : (
        <ul className="list-disc pl-4">
          <li>Add steps from the palette above the canvas.</li>
          <li>Drag from a step&apos;s round port to another step to connect them.</li>
          <li>Delete removes the selection; Ctrl+Z / Ctrl+Shift+Z undo and redo.</li>
          <li>Ctrl+C / Ctrl+V copy and paste steps; F fits the view; L lays the graph out.</li>
        </ul>
      )}
    </div>
  );
}
