/**
 * Outline of a step by kind, drawn in SVG so each kind has its own silhouette (colour alone is not
 * enough to tell steps apart on a grey print-out or for colour-blind reviewers):
 * inhale — a box whose right side points forward; exhale — its left side is notched in;
 * hold — square corners with a flat cap; wait-for-trigger — dashed, with a tab on top;
 * safe — chamfered corners; custom — slanted sides.
 */
import type { StepKind } from "@/machines/schema";
import { STEP_NODE_SIZE } from "@/machines/graph";

const W = STEP_NODE_SIZE.width;
const H = STEP_NODE_SIZE.height;

function outline(kind: StepKind): string {
  const r = 10;
  switch (kind) {
    case "inhale":
      return `M${r},1 H${W - 22} L${W - 1},${H / 2} L${W - 22},${H - 1} H${r} Q1,${H - 1} 1,${H - 1 - r} V${1 + r} Q1,1 ${r},1 Z`;
    case "exhale":
      return `M1,1 H${W - r} Q${W - 1},1 ${W - 1},${1 + r} V${H - 1 - r} Q${W - 1},${H - 1} ${W - r},${H - 1} H1 L20,${H / 2} Z`;
    case "hold":
      return `M1,1 H${W - 1} V${H - 1} H1 Z`;
    case "wait-for-trigger":
      return `M${r},8 H${W / 2 - 28} L${W / 2 - 20},1 H${W / 2 + 20} L${W / 2 + 28},8 H${W - r} Q${W - 1},8 ${W - 1},${8 + r} V${H - 1 - r} Q${W - 1},${H - 1} ${W - r},${H - 1} H${r} Q1,${H - 1} 1,${H - 1 - r} V${8 + r} Q1,8 ${r},8 Z`;
    case "safe": {
      const c = 14;
      return `M${c},1 H${W - c} L${W - 1},${c} V${H - c} L${W - c},${H - 1} H${c} L1,${H - c} V${c} Z`;
    }
    case "custom":
      return `M12,1 H${W - 1} L${W - 12},${H - 1} H1 Z`;
  }
}

export interface StepShapeProps {
  kind: StepKind;
  fill: string;
  stroke: string;
  dashed?: boolean;
  strokeWidth: number;
  /** Extra ring drawn outside the outline (selection, live step, diff status). */
  ring?: string | null;
}

export function StepShape({ kind, fill, stroke, dashed, strokeWidth, ring }: StepShapeProps) {
  const d = outline(kind);
  return (
    <svg
      width={W}
      height={H}
      viewBox={`0 0 ${W} ${H}`}
      className="absolute inset-0 overflow-visible"
      aria-hidden="true"
      focusable="false"
    >
      {ring ? <path d={d} fill="none" stroke={ring} strokeWidth={strokeWidth + 6} strokeOpacity={0.45} /> : null}
      <path d={d} fill={fill} stroke={stroke} strokeWidth={strokeWidth} strokeDasharray={dashed ? "6 4" : undefined} />
      {kind === "hold" ? <path d={`M1,6 H${W - 1}`} stroke={stroke} strokeWidth={3} /> : null}
    </svg>
  );
}
