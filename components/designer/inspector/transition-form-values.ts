/** Between a transition (with its place in the step) and the transition form's values. */
import type { Transition } from "@/machines/schema";
import type { TransitionRef } from "@/machines/graph";
import { NEW_CONDITION, specOf, type TransitionSpec } from "../model/transition-ops";
import type { TransitionFormValues } from "./form-schemas";

export function transitionToForm(ref: TransitionRef, t: Transition): TransitionFormValues {
  const spec = specOf(ref, t);
  const trigger = spec.trigger;
  return {
    type: trigger.type,
    timerKey: trigger.type === "timer" ? trigger.key : "",
    condition: trigger.type === "condition" ? (trigger.expr ?? "") : NEW_CONDITION,
    event: trigger.type === "event" ? trigger.event : "STOP",
    eventGuard: trigger.type === "event" ? (trigger.expr ?? "") : "",
    target: spec.target,
    label: spec.label ?? "",
    cause: spec.cause ?? "",
  };
}

export function formToSpec(v: TransitionFormValues): TransitionSpec {
  const trigger: TransitionSpec["trigger"] =
    v.type === "timer"
      ? { type: "timer", key: v.timerKey }
      : v.type === "condition"
        ? { type: "condition", expr: v.condition }
        : { type: "event", event: v.event, expr: v.eventGuard.trim() === "" ? null : v.eventGuard };
  const spec: TransitionSpec = { trigger, target: v.target };
  if (v.label !== "") spec.label = v.label;
  if (v.cause !== "") spec.cause = v.cause;
  return spec;
}
