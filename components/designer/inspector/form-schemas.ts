/**
 * Inspector form schemas: the sequence format's own zod schemas (machines/schema) plus what only the
 * editor knows — names already taken and formulas that must parse against the current settings.
 */
import { z } from "zod";
import {
  alarmSpec,
  breathCause,
  command,
  identifier,
  sequenceEvent,
  stepKind,
  type SequenceDefinition,
} from "@/machines/schema";
import { checkFormula, type FormulaPlace } from "./formula-check";

type Ctx = z.RefinementCtx;

function checkInto(ctx: Ctx, path: (string | number)[], expr: string | undefined, def: SequenceDefinition, place: FormulaPlace) {
  if (expr === undefined) return;
  const first = checkFormula(expr, def.settings, place).blocking[0];
  if (first) ctx.addIssue({ code: "custom", path, message: first.message });
}

/** The places of a command's formula fields, for validation and for the field's unit hint. */
export const COMMAND_PLACES = {
  flow: { flow: "flow" },
  pressure: { target: "pressure", rise: "time" },
  arm: { angle: "angle", pulseRate: "pulse-rate" },
  release: {},
  hold: {},
} as const satisfies Record<string, Record<string, FormulaPlace>>;

export function stepFormSchema(def: SequenceDefinition, currentName: string) {
  return z
    .object({
      name: identifier.refine((n) => n === currentName || !(n in def.machine.states), "another step already has this name"),
      label: z.string().max(80),
      kind: stepKind,
      description: z.string().max(500),
      command,
      alarms: z.array(alarmSpec),
      breathStart: z.enum(["default", "yes", "no"]),
    })
    .superRefine((v, ctx) => {
      const places = COMMAND_PLACES[v.command.kind] as Record<string, FormulaPlace>;
      const values = v.command as unknown as Record<string, string | undefined>;
      for (const [field, place] of Object.entries(places)) checkInto(ctx, ["command", field], values[field], def, place);
    });
}
export type StepFormInput = z.input<ReturnType<typeof stepFormSchema>>;
export type StepFormValues = z.output<ReturnType<typeof stepFormSchema>>;

export function transitionFormSchema(def: SequenceDefinition) {
  return z
    .object({
      type: z.enum(["timer", "condition", "event"]),
      timerKey: z.string(),
      condition: z.string(),
      event: sequenceEvent,
      eventGuard: z.string(),
      target: z.string().refine((t) => t in def.machine.states, "choose a step that exists"),
      label: z.string().max(80),
      cause: z.union([breathCause, z.literal("")]),
    })
    .superRefine((v, ctx) => {
      if (v.type === "timer") checkInto(ctx, ["timerKey"], v.timerKey, def, "time");
      if (v.type === "condition") checkInto(ctx, ["condition"], v.condition, def, "condition");
      if (v.type === "event" && v.eventGuard.trim() !== "") checkInto(ctx, ["eventGuard"], v.eventGuard, def, "condition");
    });
}
export type TransitionFormValues = z.output<ReturnType<typeof transitionFormSchema>>;
