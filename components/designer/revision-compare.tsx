"use client";
/**
 * Two revisions side by side, read-only: the older on the left with removed and changed parts
 * marked, the newer on the right with added and changed parts marked, and the list of differences
 * (steps, transitions, settings, monitors) underneath. Picking a difference selects it on both sides.
 */
import { useMemo, useState } from "react";
import { ReactFlowProvider } from "@xyflow/react";
import { diffDefinitions, type TransitionAddress } from "@/machines/diff";
import { completeLayout } from "@/machines/graph";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import { SequenceCanvas } from "./canvas/sequence-canvas";
import { CANVAS_COLOURS } from "./canvas/kind-style";
import { diffDecorations } from "./compare/diff-decorations";
import { DiffList, type DiffPick } from "./compare/diff-list";
import { EMPTY_SELECTION, type Selection } from "./model/doc";
import { refOfTarget } from "./model/problems";

export interface CompareSide {
  number: number;
  definition: SequenceDefinition;
  layout: SequenceLayout | null;
}

export interface RevisionCompareProps {
  a: CompareSide;
  b: CompareSide;
}

function transitionSelection(at: TransitionAddress | null): Selection {
  return at ? { steps: [], transitions: [refOfTarget({ type: "transition", ...at })] } : EMPTY_SELECTION;
}

export function RevisionCompare({ a, b }: RevisionCompareProps) {
  const diff = useMemo(() => diffDefinitions(a.definition, b.definition), [a.definition, b.definition]);
  const marks = useMemo(() => diffDecorations(diff), [diff]);
  const layoutA = useMemo(() => completeLayout(a.definition, a.layout), [a.definition, a.layout]);
  const layoutB = useMemo(() => completeLayout(b.definition, b.layout), [b.definition, b.layout]);
  const [selA, setSelA] = useState<Selection>(EMPTY_SELECTION);
  const [selB, setSelB] = useState<Selection>(EMPTY_SELECTION);

  const pick = (p: DiffPick) => {
    if (p.kind === "step") {
      const sel = { steps: [p.step], transitions: [] };
      setSelA(p.step in a.definition.machine.states ? sel : EMPTY_SELECTION);
      setSelB(p.step in b.definition.machine.states ? sel : EMPTY_SELECTION);
    } else if (p.kind === "transition") {
      setSelA(transitionSelection(p.a));
      setSelB(transitionSelection(p.b));
    }
  };

  return (
    <div className="flex flex-col gap-3" data-testid="revision-compare">
      <Legend />
      <div className="grid grid-cols-2 gap-2">
        <Side title={`Revision ${a.number}`} testId="compare-a">
          <ReactFlowProvider>
            <SequenceCanvas definition={a.definition} layout={layoutA} editable={false} selection={selA} onSelectionChange={setSelA} decorations={marks.a} label={`Revision ${a.number}`} testId="compare-canvas-a" />
          </ReactFlowProvider>
        </Side>
        <Side title={`Revision ${b.number}`} testId="compare-b">
          <ReactFlowProvider>
            <SequenceCanvas definition={b.definition} layout={layoutB} editable={false} selection={selB} onSelectionChange={setSelB} decorations={marks.b} label={`Revision ${b.number}`} testId="compare-canvas-b" />
          </ReactFlowProvider>
        </Side>
      </div>
      <section className="rounded border border-ink-200 bg-surface p-3" aria-label="Differences">
        <h2 className="mb-2 text-sm font-semibold text-ink-800">
          Differences from revision {a.number} to {b.number}
        </h2>
        <DiffList diff={diff} onPick={pick} />
      </section>
    </div>
  );
}

function Side({ title, testId, children }: { title: string; testId: string; children: React.ReactNode }) {
  return (
    <section className="flex flex-col overflow-hidden rounded border border-ink-200 bg-surface" data-testid={testId}>
      <h2 className="border-b border-ink-100 px-2 py-1 text-sm font-semibold text-ink-800">{title}</h2>
      <div className="h-[52vh] min-h-[360px]">{children}</div>
    </section>
  );
}

function Legend() {
  return (
    <p className="flex gap-4 text-xs text-ink-700" aria-label="Legend">
      {(["added", "removed", "changed"] as const).map((k) => (
        <span key={k} className="flex items-center gap-1">
          <span aria-hidden="true" className="inline-block h-2.5 w-4 rounded-sm" style={{ background: CANVAS_COLOURS[k] }} />
          {k}
        </span>
      ))}
    </p>
  );
}
