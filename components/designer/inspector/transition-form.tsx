"use client";
/**
 * Inspector for one transition: what fires it (a timer — a setting name or a formula in seconds;
 * a condition checked every scan; or an operator/fault event, optionally guarded), where it goes,
 * its priority among the step's conditions, a label and the breath cause it reports.
 */
import { useMemo } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { SEQUENCE_EVENTS, type SequenceDefinition, type Transition } from "@/machines/schema";
import type { TransitionRef } from "@/machines/graph";
import type { TransitionSpec } from "../model/transition-ops";
import { transitionFormSchema, type TransitionFormValues } from "./form-schemas";
import { formToSpec, transitionToForm } from "./transition-form-values";
import { useLiveApply } from "./use-live-apply";
import { Section, SelectField, SmallButton, TextField } from "./fields";
import { FormulaField } from "./formula-field";

export interface TransitionFormProps {
  transitionRef: TransitionRef;
  transition: Transition;
  definition: SequenceDefinition;
  readOnly: boolean;
  onApply: (spec: TransitionSpec) => void;
  onMove: (delta: number) => void;
  onDelete: () => void;
}

const TYPE_OPTIONS = [
  { value: "timer", label: "Timer — after a time in the step" },
  { value: "condition", label: "Condition — checked every scan" },
  { value: "event", label: "Event — operator or fault" },
];
const EVENT_OPTIONS = SEQUENCE_EVENTS.map((e) => ({ value: e, label: e }));
const CAUSE_OPTIONS = [
  { value: "", label: "Inferred from the trigger" },
  { value: "patient", label: "Patient" },
  { value: "timer", label: "Timer" },
  { value: "operator", label: "Operator" },
];

export function TransitionForm({ transitionRef: ref, transition, definition, readOnly, onApply, onMove, onDelete }: TransitionFormProps) {
  const schema = useMemo(() => transitionFormSchema(definition), [definition]);
  const form = useForm<TransitionFormValues>({
    resolver: zodResolver(schema),
    mode: "onChange",
    defaultValues: transitionToForm(ref, transition),
  });
  const { register, control, formState, watch } = form;
  const type = useWatch({ control, name: "type" });
  useLiveApply(watch, schema, (v: TransitionFormValues) => onApply(formToSpec(v)));

  const stepOptions = Object.keys(definition.machine.states).map((s) => ({ value: s, label: s }));
  const scanList = definition.machine.states[ref.step]?.on?.SCAN;
  const scanCount = Array.isArray(scanList) ? scanList.length : scanList ? 1 : 0;
  const isScan = ref.group === "on" && ref.key === "SCAN";

  return (
    <form className="flex flex-col gap-3" onSubmit={(e) => e.preventDefault()} aria-label={`Transition from ${ref.step}`} data-testid="transition-form">
      <p className="text-sm">
        From <strong className="font-mono">{ref.step}</strong>
      </p>
      <fieldset disabled={readOnly} className="flex flex-col gap-3">
        <SelectField label="Fires on" options={TYPE_OPTIONS} data-testid="trigger-type" {...register("type")} />
        {type === "timer" ? (
          <Controller
            control={control}
            name="timerKey"
            render={({ field }) => (
              <FormulaField
                label="Time in the step"
                placeholder="a setting name (Ti) or a formula (Ti * 0.1)"
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
                error={formState.errors.timerKey?.message}
                place="time"
                settings={definition.settings}
                disabled={readOnly}
                testId="timer-key"
              />
            )}
          />
        ) : null}
        {type === "condition" ? (
          <Controller
            control={control}
            name="condition"
            render={({ field }) => (
              <FormulaField
                label="Condition"
                placeholder="paw < PEEP - trigger"
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
                error={formState.errors.condition?.message}
                place="condition"
                settings={definition.settings}
                disabled={readOnly}
                testId="condition"
              />
            )}
          />
        ) : null}
        {type === "event" ? (
          <>
            <SelectField label="Event" options={EVENT_OPTIONS} data-testid="event" {...register("event")} />
            <Controller
              control={control}
              name="eventGuard"
              render={({ field }) => (
                <FormulaField
                  label="Only if (optional)"
                  value={field.value}
                  onChange={field.onChange}
                  onBlur={field.onBlur}
                  error={formState.errors.eventGuard?.message}
                  place="condition"
                  settings={definition.settings}
                  disabled={readOnly}
                  testId="event-guard"
                />
              )}
            />
          </>
        ) : null}
        <SelectField label="Goes to" options={stepOptions} error={formState.errors.target?.message} data-testid="transition-target" {...register("target")} />
        <TextField label="Label" hint="optional" error={formState.errors.label?.message} {...register("label")} />
        <SelectField label="Breath cause" hint="for the breath table" options={CAUSE_OPTIONS} {...register("cause")} />
      </fieldset>
      {isScan && type === "condition" ? (
        <Section title="Priority">
          <p className="text-xs text-ink-700" data-testid="priority">
            Checked {ordinal(ref.index + 1)} of {scanCount} conditions leaving {ref.step}.
          </p>
          <div className="flex gap-2">
            <SmallButton disabled={readOnly || ref.index === 0} onClick={() => onMove(-1)} aria-label="Check this condition earlier">
              ↑ Earlier
            </SmallButton>
            <SmallButton disabled={readOnly || ref.index >= scanCount - 1} onClick={() => onMove(1)} aria-label="Check this condition later">
              ↓ Later
            </SmallButton>
          </div>
        </Section>
      ) : null}
      {readOnly ? null : (
        <SmallButton tone="danger" className="self-start" onClick={onDelete} data-testid="delete-transition">
          Delete transition
        </SmallButton>
      )}
    </form>
  );
}

function ordinal(n: number): string {
  const s = ["th", "st", "nd", "rd"];
  const v = n % 100;
  return n + (s[(v - 20) % 10] ?? s[v] ?? s[0]);
}
