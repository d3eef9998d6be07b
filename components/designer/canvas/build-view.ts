/** Turn a definition, its layout and the decorations into the nodes and edges React Flow draws. */
import { MarkerType } from "@xyflow/react";
import { definitionToGraph, sameRef } from "@/machines/graph";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { Selection } from "../model/doc";
import type { CanvasDecorations } from "./decorations";
import { edgeColour } from "./transition-edge";
import type { StepViewNode, TransitionViewEdge } from "./view-types";

export interface ViewInput {
  definition: SequenceDefinition;
  layout: SequenceLayout;
  selection: Selection;
  decorations: CanvasDecorations;
  editable: boolean;
}

export function buildView({ definition, layout, selection, decorations: d, editable }: ViewInput): {
  nodes: StepViewNode[];
  edges: TransitionViewEdge[];
} {
  const graph = definitionToGraph(definition, layout);
  const stepIds = new Set(graph.nodes.map((n) => n.id));
  const nodes: StepViewNode[] = graph.nodes.map((n) => {
    const problem = d.stepProblems?.[n.id];
    return {
      ...n,
      type: "step",
      selected: selection.steps.includes(n.id),
      ariaLabel: `${n.data.meta.kind} step ${n.id}${n.data.initial ? ", entry step" : ""}`,
      data: {
        ...n.data,
        active: d.activeStep === n.id,
        problem: problem?.level ?? null,
        problemCount: problem?.count ?? 0,
        diff: d.stepDiff?.[n.id] ?? null,
        editable,
      },
    };
  });
  const edges: TransitionViewEdge[] = [];
  for (const e of graph.edges) {
    // A transition to a step that does not exist has nowhere to be drawn; the problems panel lists it.
    if (!e.data || !stepIds.has(e.target)) continue;
    const data = {
      ...e.data,
      problem: d.edgeProblems?.[e.id] ?? null,
      diff: d.edgeDiff?.[e.id] ?? null,
      live: d.liveEdge === e.id,
    };
    const selected = selection.transitions.some((r) => sameRef(r, data.ref));
    edges.push({
      ...e,
      type: "transition",
      data,
      selected,
      ariaLabel: `transition from ${e.source} to ${e.target}`,
      markerEnd: { type: MarkerType.ArrowClosed, color: edgeColour(data, selected), width: 18, height: 18 },
    });
  }
  return { nodes, edges };
}
