/** Between a step's meta and the step form's values (empty strings for absent optional text). */
import type { StepMeta } from "@/machines/schema";
import type { StepFormInput, StepFormValues } from "./form-schemas";

export function stepToForm(name: string, meta: StepMeta): StepFormInput {
  return {
    name,
    label: meta.label ?? "",
    kind: meta.kind,
    description: meta.description ?? "",
    command: meta.command,
    alarms: meta.alarms,
    breathStart: meta.breathStart === undefined ? "default" : meta.breathStart ? "yes" : "no",
  };
}

export function formToMeta(v: StepFormValues): StepMeta {
  const meta: StepMeta = { kind: v.kind, command: v.command, alarms: v.alarms };
  // Optional keys are left out rather than written as "" so the saved JSON stays as an engineer would write it.
  if (v.label !== "") meta.label = v.label;
  if (v.breathStart !== "default") meta.breathStart = v.breathStart === "yes";
  if (v.description !== "") meta.description = v.description;
  return meta;
}
