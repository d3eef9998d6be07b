"use client";
/**
 * A transition on the canvas: a curve from step to step with a chip saying what fires it —
 * a clock and the timer key, a condition formula, or an event name — and, for SCAN exits, its
 * priority among the step's conditions (#1 is checked first).
 */
import { memo } from "react";
import { BaseEdge, EdgeLabelRenderer, useInternalNode, type EdgeProps } from "@xyflow/react";
import { STEP_NODE_SIZE, describeTrigger } from "@/machines/graph";
import { edgeGeometry, type Box } from "./edge-path";
import { CANVAS_COLOURS } from "./kind-style";
import type { TransitionView, TransitionViewEdge } from "./view-types";

function boxOf(node: ReturnType<typeof useInternalNode>): Box | null {
  if (!node) return null;
  return {
    x: node.internals.positionAbsolute.x,
    y: node.internals.positionAbsolute.y,
    width: node.measured.width ?? STEP_NODE_SIZE.width,
    height: node.measured.height ?? STEP_NODE_SIZE.height,
  };
}

export function edgeColour(d: TransitionView | undefined, selected: boolean): string {
  if (!d) return CANVAS_COLOURS.muted;
  if (d.diff) return CANVAS_COLOURS[d.diff];
  if (selected) return CANVAS_COLOURS.selected;
  if (d.live) return CANVAS_COLOURS.live;
  if (d.problem === "error") return CANVAS_COLOURS.error;
  return CANVAS_COLOURS[d.trigger.type];
}

function TransitionEdgeComponent({ id, source, target, data, selected, markerEnd }: EdgeProps<TransitionViewEdge>) {
  const s = boxOf(useInternalNode(source));
  const t = boxOf(useInternalNode(target));
  if (!s || !t || !data) return null;
  const geo = source === target ? edgeGeometry(s, s, data.parallelIndex, data.parallelCount) : edgeGeometry(s, t, data.parallelIndex, data.parallelCount);
  const colour = edgeColour(data, Boolean(selected));
  const text = describeTrigger(data.trigger);
  return (
    <>
      <BaseEdge
        id={id}
        path={geo.path}
        markerEnd={markerEnd}
        interactionWidth={16}
        // Inline style: React Flow's unlayered stylesheet would beat Tailwind stroke utilities.
        style={{
          stroke: colour,
          strokeWidth: selected || data.live ? 2.6 : 1.6,
          strokeDasharray: data.trigger.type === "event" || data.diff === "removed" ? "5 4" : undefined,
        }}
      />
      <EdgeLabelRenderer>
        <div
          className="nodrag nopan absolute flex max-w-[220px] items-center gap-1 rounded border bg-surface px-1.5 py-0.5 text-[11px] leading-tight shadow-sm"
          style={{
            transform: `translate(-50%, -50%) translate(${geo.labelX}px, ${geo.labelY}px)`,
            borderColor: colour,
            color: CANVAS_COLOURS.ink,
            pointerEvents: "all",
            outline: selected ? `2px solid ${CANVAS_COLOURS.selected}` : undefined,
          }}
          data-testid={`edge-label-${data.ref.step}-${data.transition.target}`}
          data-trigger={data.trigger.type}
          data-diff={data.diff ?? undefined}
          title={`${data.ref.step} → ${data.transition.target}: ${text}${data.transition.meta?.label ? ` (${data.transition.meta.label})` : ""}`}
        >
          <TriggerGlyph type={data.trigger.type} colour={colour} />
          <span className={`truncate ${data.trigger.type === "event" ? "font-semibold" : "font-mono"}`}>{text}</span>
          {data.priority !== null ? (
            <span className="rounded-sm px-1 text-[9px] font-bold text-white" style={{ background: colour }} title="priority among this step's conditions">
              #{data.priority}
            </span>
          ) : null}
        </div>
      </EdgeLabelRenderer>
    </>
  );
}

function TriggerGlyph({ type, colour }: { type: TransitionView["trigger"]["type"]; colour: string }) {
  if (type === "timer")
    return (
      <svg width="10" height="10" viewBox="0 0 10 10" aria-label="timer">
        <circle cx="5" cy="5" r="4" fill="none" stroke={colour} strokeWidth="1.3" />
        <path d="M5,2.5 V5 H7" fill="none" stroke={colour} strokeWidth="1.3" />
      </svg>
    );
  if (type === "condition")
    return (
      <svg width="10" height="10" viewBox="0 0 10 10" aria-label="condition">
        <path d="M5,0.8 L9.2,5 L5,9.2 L0.8,5 Z" fill="none" stroke={colour} strokeWidth="1.3" />
      </svg>
    );
  return (
    <svg width="10" height="10" viewBox="0 0 10 10" aria-label="event">
      <path d="M6,0.5 L2,5.5 H5 L4,9.5 L8,4.5 H5 Z" fill={colour} />
    </svg>
  );
}

export const TransitionEdgeView = memo(TransitionEdgeComponent);
