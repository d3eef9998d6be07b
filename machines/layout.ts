/**
 * Auto-layout of a sequence's step graph with ELK's layered algorithm, top to bottom.
 *
 * Top to bottom because steps are wider than tall: a breath cycle of five steps stacked fits the
 * editor's canvas at twice the zoom of the same cycle in a row. The initial step is placed first and
 * cycles are broken depth-first from it, so the cycle reads downwards from the entry step and the
 * return edge (exhale → inhale) is the one drawn back up (the canvas loops it round the side). ELK is loaded on first use: it is large, and most page views never lay out.
 */
import type { ElkNode } from "elkjs/lib/elk-api";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import { definitionToGraph, STEP_NODE_SIZE } from "@/machines/graph";

const LAYOUT_OPTIONS: Record<string, string> = {
  "elk.algorithm": "layered",
  "elk.direction": "DOWN",
  "elk.layered.cycleBreaking.strategy": "DEPTH_FIRST",
  "elk.layered.considerModelOrder.strategy": "NODES_AND_EDGES",
  "elk.layered.nodePlacement.strategy": "NETWORK_SIMPLEX",
  // Room between rows for edge labels (trigger text sits at the middle of each edge).
  "elk.layered.spacing.nodeNodeBetweenLayers": "70",
  // Room beside steps for the edges that loop round the side.
  "elk.spacing.nodeNode": "110",
  "elk.spacing.edgeNode": "30",
  "elk.layered.mergeEdges": "true",
};

type ElkInstance = { layout(graph: ElkNode): Promise<ElkNode> };
let elkPromise: Promise<ElkInstance> | null = null;

function loadElk(): Promise<ElkInstance> {
  elkPromise ??= import("elkjs/lib/elk.bundled.js").then((m) => {
    // The bundled build is CommonJS; bundlers expose the constructor as default (sometimes nested).
    const mod = m as unknown as { default: (new () => ElkInstance) | { default: new () => ElkInstance } };
    const Ctor = typeof mod.default === "function" ? mod.default : mod.default.default;
    return new Ctor();
  });
  return elkPromise;
}

/** The ELK input graph for a definition: the initial step first, dangling transitions left out. */
export function toElkGraph(def: SequenceDefinition): ElkNode {
  const { nodes, edges } = definitionToGraph(def, null);
  const initial = def.machine.initial;
  const ordered = [...nodes].sort((a, b) => Number(b.id === initial) - Number(a.id === initial));
  const ids = new Set(nodes.map((n) => n.id));
  return {
    id: "root",
    layoutOptions: LAYOUT_OPTIONS,
    children: ordered.map((n) => ({ id: n.id, width: STEP_NODE_SIZE.width, height: STEP_NODE_SIZE.height })),
    edges: edges
      .filter((e) => ids.has(e.target) && e.source !== e.target)
      .map((e) => ({ id: e.id, sources: [e.source], targets: [e.target] })),
  };
}

export async function autoLayout(def: SequenceDefinition): Promise<SequenceLayout> {
  const elk = await loadElk();
  const result = await elk.layout(toElkGraph(def));
  const layout: SequenceLayout = { nodes: {} };
  for (const child of result.children ?? []) {
    layout.nodes[child.id] = { x: Math.round(child.x ?? 0), y: Math.round(child.y ?? 0) };
  }
  return layout;
}
