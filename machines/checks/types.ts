/**
 * The shape of a static-check finding, shared by the checks, the save handler (422 body) and the
 * designer's problems panel (which selects `target` on the canvas when a problem is clicked).
 */
import type { SequenceEvent } from "@/machines/schema";

export type Severity = "error" | "warning";

/** How a transition is triggered: a timer, the controller's scan, or an operator/fault event. */
export type TransitionVia = "after" | "SCAN" | SequenceEvent;

export type ProblemTarget =
  /** `field` names the part of the step at fault, e.g. "command.flow", when there is one. */
  | { type: "step"; step: string; field?: string }
  /** `index` is the position in the trigger's list (its priority); `key` is the timer key for `after`. */
  | { type: "transition"; step: string; index: number; via: TransitionVia; key?: string }
  | { type: "setting"; setting: string }
  /** `monitor` is the index of the monitor at fault, when the problem is about one. */
  | { type: "definition"; monitor?: number };

export interface Problem {
  /** Stable check id, e.g. "unreachable-step": the UI and the tests key on it. */
  id: string;
  /** Errors block a save; warnings are shown and kept with the revision. */
  severity: Severity;
  message: string;
  target: ProblemTarget;
}
