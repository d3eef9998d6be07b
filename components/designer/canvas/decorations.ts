/** Per-step and per-edge marks laid over the graph: problems, diff status, the live step. */
import type { DiffStatus, ProblemLevel } from "./view-types";

export interface CanvasDecorations {
  stepProblems?: Record<string, { level: ProblemLevel; count: number }>;
  /** Keyed by edge id (machines/graph edgeId). */
  edgeProblems?: Record<string, ProblemLevel>;
  stepDiff?: Record<string, DiffStatus>;
  edgeDiff?: Record<string, DiffStatus>;
  activeStep?: string | null;
  liveEdge?: string | null;
}
