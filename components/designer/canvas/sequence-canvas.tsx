"use client";
/**
 * The step graph on a React Flow canvas. The definition stays the source of truth: nodes and edges
 * are rebuilt from it; the canvas only keeps what React Flow measures (node sizes — without them it
 * drops edge handles on every rebuild) and positions while a drag is in progress (committed on drop
 * as one undoable move). Needs a ReactFlowProvider above it.
 */
import "@xyflow/react/dist/style.css";
import { useCallback, useLayoutEffect, useMemo, useRef, useState } from "react";
import {
  Background,
  BackgroundVariant,
  Controls,
  MiniMap,
  ReactFlow,
  type Connection,
  type EdgeChange,
  type NodeChange,
  type OnNodeDrag,
} from "@xyflow/react";
import { sameRef, type TransitionEdgeData } from "@/machines/graph";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import { EMPTY_SELECTION, type Selection } from "../model/doc";
import { buildView } from "./build-view";
import type { CanvasDecorations } from "./decorations";
import { KIND_STYLES } from "./kind-style";
import { StepNode } from "./step-node";
import { TransitionEdgeView } from "./transition-edge";
import type { StepViewNode, TransitionViewEdge } from "./view-types";

// Module scope: new objects per render would make React Flow remount every node.
const nodeTypes = { step: StepNode };
const edgeTypes = { transition: TransitionEdgeView };
const NO_DECORATIONS: CanvasDecorations = {};

export interface SequenceCanvasProps {
  definition: SequenceDefinition;
  layout: SequenceLayout;
  editable: boolean;
  selection?: Selection;
  onSelectionChange?: (selection: Selection) => void;
  decorations?: CanvasDecorations;
  onMoveSteps?: (positions: Record<string, { x: number; y: number }>) => void;
  onConnect?: (source: string, target: string) => void;
  /** Show the overview map (worth it for larger sequences; it covers part of a small canvas). */
  minimap?: boolean;
  /** Accessible name of the canvas region. */
  label: string;
  testId?: string;
}

type Size = { width: number; height: number };

export function SequenceCanvas(props: SequenceCanvasProps) {
  const { definition, layout, editable, decorations = NO_DECORATIONS, onSelectionChange, onMoveSteps, onConnect } = props;
  const selection = props.selection ?? EMPTY_SELECTION;
  const [sizes, setSizes] = useState<Record<string, Size>>({});
  const [dragging, setDragging] = useState<Record<string, { x: number; y: number }>>({});
  // Node and edge selection changes arrive in separate callbacks within one click; chain them.
  const selectionRef = useRef(selection);
  useLayoutEffect(() => {
    selectionRef.current = selection;
  }, [selection]);

  const view = useMemo(
    () => buildView({ definition, layout, selection, decorations, editable }),
    [definition, layout, selection, decorations, editable],
  );
  const nodes = useMemo(
    () =>
      view.nodes.map((n) => ({
        ...n,
        position: dragging[n.id] ?? n.position,
        measured: sizes[n.id],
      })),
    [view.nodes, dragging, sizes],
  );

  const emitSelection = useCallback(
    (next: Selection) => {
      selectionRef.current = next;
      onSelectionChange?.(next);
    },
    [onSelectionChange],
  );

  const onNodesChange = useCallback(
    (changes: NodeChange<StepViewNode>[]) => {
      let sel = selectionRef.current;
      let selChanged = false;
      const newSizes: Record<string, Size> = {};
      const moved: Record<string, { x: number; y: number }> = {};
      for (const c of changes) {
        if (c.type === "dimensions" && c.dimensions) newSizes[c.id] = c.dimensions;
        else if (c.type === "position" && c.position && c.dragging) moved[c.id] = c.position;
        else if (c.type === "select") {
          const has = sel.steps.includes(c.id);
          if (c.selected && !has) sel = { ...sel, steps: [...sel.steps, c.id] };
          else if (!c.selected && has) sel = { ...sel, steps: sel.steps.filter((s) => s !== c.id) };
          else continue;
          selChanged = true;
        }
      }
      if (Object.keys(newSizes).length) setSizes((s) => ({ ...s, ...newSizes }));
      if (Object.keys(moved).length) setDragging((d) => ({ ...d, ...moved }));
      if (selChanged) emitSelection({ ...sel, setting: undefined });
    },
    [emitSelection],
  );

  const edgeRefs = useMemo(() => new Map(view.edges.map((e) => [e.id, (e.data as TransitionEdgeData).ref])), [view.edges]);

  const onEdgesChange = useCallback(
    (changes: EdgeChange<TransitionViewEdge>[]) => {
      let sel = selectionRef.current;
      let selChanged = false;
      for (const c of changes) {
        if (c.type !== "select") continue;
        const ref = edgeRefs.get(c.id);
        if (!ref) continue;
        const has = sel.transitions.some((r) => sameRef(r, ref));
        if (c.selected && !has) sel = { ...sel, transitions: [...sel.transitions, ref] };
        else if (!c.selected && has) sel = { ...sel, transitions: sel.transitions.filter((r) => !sameRef(r, ref)) };
        else continue;
        selChanged = true;
      }
      if (selChanged) emitSelection({ ...sel, setting: undefined });
    },
    [edgeRefs, emitSelection],
  );

  const onNodeDragStop: OnNodeDrag<StepViewNode> = useCallback(
    (_event, _node, dropped) => {
      const positions = Object.fromEntries(dropped.map((n) => [n.id, n.position]));
      // Cleared in the same batch as the parent's layout update, so nothing jumps back for a frame.
      setDragging({});
      onMoveSteps?.(positions);
    },
    [onMoveSteps],
  );

  const handleConnect = useCallback(
    (c: Connection) => {
      if (c.source && c.target) onConnect?.(c.source, c.target);
    },
    [onConnect],
  );

  return (
    <div className="relative h-full w-full" data-testid={props.testId ?? "sequence-canvas"} role="region" aria-label={props.label}>
      <ReactFlow<StepViewNode, TransitionViewEdge>
        nodes={nodes}
        edges={view.edges}
        nodeTypes={nodeTypes}
        edgeTypes={edgeTypes}
        onNodesChange={onNodesChange}
        onEdgesChange={onEdgesChange}
        onNodeDragStop={onNodeDragStop}
        onConnect={handleConnect}
        nodesDraggable={editable}
        nodesConnectable={editable}
        elementsSelectable
        edgesReconnectable={false}
        // Deleting goes through the editor's history (and its own shortcut), not React Flow's.
        deleteKeyCode={null}
        multiSelectionKeyCode={["Meta", "Control"]}
        selectionKeyCode="Shift"
        fitView
        fitViewOptions={{ padding: 0.18 }}
        minZoom={0.2}
        maxZoom={2.5}
        snapToGrid
        snapGrid={[8, 8]}
      >
        <Background variant={BackgroundVariant.Dots} gap={16} size={1} color="#c9d3d8" />
        <Controls showInteractive={false} position="bottom-left" />
        {props.minimap ? (
          <MiniMap
            pannable
            zoomable
            position="bottom-right"
            nodeColor={(n) => KIND_STYLES[(n as StepViewNode).data.meta.kind].fill}
            nodeStrokeColor={(n) => KIND_STYLES[(n as StepViewNode).data.meta.kind].stroke}
            ariaLabel="Overview of the sequence"
          />
        ) : null}
      </ReactFlow>
    </div>
  );
}
