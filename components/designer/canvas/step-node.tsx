"use client";
/**
 * A step on the canvas. Fixed size (machines/graph STEP_NODE_SIZE) so the auto-layout and the edge
 * geometry agree with what is drawn. Connections start from the round port on the right; while one
 * is being drawn, the whole of every step becomes a drop target (an invisible handle over the box).
 */
import { memo } from "react";
import { Handle, Position, useConnection, type NodeProps } from "@xyflow/react";
import { STEP_NODE_SIZE } from "@/machines/graph";
import { STEP_KIND_LABELS } from "../model/defaults";
import { commandSummary } from "./command-summary";
import { CANVAS_COLOURS, KIND_STYLES, stepStroke } from "./kind-style";
import { StepShape } from "./step-shape";
import type { StepViewNode } from "./view-types";

const hiddenHandle = { opacity: 0, width: 1, height: 1, minWidth: 0, minHeight: 0, border: 0, pointerEvents: "none" } as const;

function ringColour(data: StepViewNode["data"], selected: boolean): string | null {
  if (data.active) return CANVAS_COLOURS.live;
  if (selected) return CANVAS_COLOURS.selected;
  if (data.diff) return CANVAS_COLOURS[data.diff];
  return null;
}

function StepNodeComponent({ data, selected }: NodeProps<StepViewNode>) {
  const connecting = useConnection((c) => c.inProgress);
  const style = KIND_STYLES[data.meta.kind];
  const stroke = stepStroke(data.meta.kind, data.meta.alarms);
  const ring = ringColour(data, selected);
  return (
    <div
      className="relative select-none"
      style={{ width: STEP_NODE_SIZE.width, height: STEP_NODE_SIZE.height, color: style.ink }}
      data-testid={`step-node-${data.name}`}
      data-kind={data.meta.kind}
      data-active={data.active ? "true" : "false"}
      data-diff={data.diff ?? undefined}
      title={data.meta.description}
    >
      <StepShape
        kind={data.meta.kind}
        fill={data.diff === "removed" ? "#f6e3e2" : style.fill}
        stroke={stroke}
        dashed={style.dashed || data.diff === "removed"}
        strokeWidth={selected || data.active ? 2.5 : 1.5}
        ring={ring}
      />
      <div className="absolute inset-0 flex flex-col justify-center gap-0.5 pl-6 pr-7 pt-1">
        <span className="truncate text-[13px] font-semibold leading-tight">{data.meta.label ?? data.name}</span>
        <span className="truncate text-[10px] opacity-70">
          <span className="uppercase tracking-wide">{STEP_KIND_LABELS[data.meta.kind]}</span>
          {data.meta.label ? <span className="font-mono"> · {data.name}</span> : null}
        </span>
        <span className="truncate font-mono text-[10px] opacity-80">{commandSummary(data.meta.command)}</span>
      </div>
      {data.initial ? <EntryMark /> : null}
      {data.problemCount > 0 ? <ProblemBadge level={data.problem} count={data.problemCount} /> : null}
      {data.active ? (
        <span className="absolute -bottom-2.5 right-3 rounded px-1 text-[9px] font-bold uppercase text-white" style={{ background: CANVAS_COLOURS.live }}>
          live
        </span>
      ) : null}
      <Handle type="target" id="in" position={Position.Left} style={hiddenHandle} isConnectable={false} />
      {connecting && data.editable ? (
        <Handle
          type="target"
          id="drop"
          position={Position.Left}
          isConnectableStart={false}
          style={{ position: "absolute", inset: 0, width: "100%", height: "100%", transform: "none", borderRadius: 0, opacity: 0 }}
        />
      ) : null}
      <Handle
        type="source"
        id="out"
        position={Position.Right}
        isConnectable={data.editable}
        aria-label={`Draw a transition from ${data.name}`}
        style={
          data.editable
            ? { width: 12, height: 12, right: -7, background: "#fff", border: `2px solid ${stroke}` }
            : hiddenHandle
        }
      />
    </div>
  );
}

/** The initial step carries a flag on its top edge: the sequence begins here. */
function EntryMark() {
  return (
    <span
      className="absolute -top-3 left-3 flex items-center gap-1 rounded-sm px-1.5 py-px text-[9px] font-bold uppercase tracking-wider text-white"
      style={{ background: CANVAS_COLOURS.ink }}
      data-testid="initial-marker"
    >
      <svg width="8" height="8" viewBox="0 0 8 8" aria-hidden="true">
        <path d="M1,0 V8 M1,1 H7 L5.5,2.75 L7,4.5 H1" stroke="white" fill="white" strokeWidth="1" />
      </svg>
      entry
    </span>
  );
}

function ProblemBadge({ level, count }: { level: "error" | "warning" | null; count: number }) {
  const colour = level === "error" ? CANVAS_COLOURS.error : CANVAS_COLOURS.warning;
  return (
    <span
      className="absolute -top-2 right-4 min-w-4 rounded-full px-1 text-center text-[10px] font-bold leading-4 text-white"
      style={{ background: colour }}
      aria-label={`${count} ${level === "error" ? "error" : "warning"}${count === 1 ? "" : "s"}`}
    >
      {level === "error" ? "!" : "?"}
      {count > 1 ? count : ""}
    </span>
  );
}

export const StepNode = memo(StepNodeComponent);
