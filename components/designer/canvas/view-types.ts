/** Node and edge data as the canvas draws them: the graph projection plus what decorates it. */
import type { Edge, Node } from "@xyflow/react";
import type { StepNodeData, TransitionEdgeData } from "@/machines/graph";

export type DiffStatus = "added" | "removed" | "changed";
export type ProblemLevel = "error" | "warning";

export type StepView = StepNodeData & {
  active: boolean;
  problem: ProblemLevel | null;
  problemCount: number;
  diff: DiffStatus | null;
  editable: boolean;
};

export type TransitionView = TransitionEdgeData & {
  problem: ProblemLevel | null;
  diff: DiffStatus | null;
  /** The transition the live preview took last (briefly emphasised). */
  live: boolean;
};

export type StepViewNode = Node<StepView, "step">;
export type TransitionViewEdge = Edge<TransitionView, "transition">;
