"use client";
/**
 * Inspector for one step: name (renaming retargets every transition into it; applied on Enter or
 * when leaving the field), kind, label, command, entry alarms, whether entering starts a breath, and
 * the entry-step marker. Everything else applies live while valid.
 */
import { useMemo } from "react";
import { FormProvider, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { STEP_KINDS, type SequenceDefinition, type StepMeta } from "@/machines/schema";
import { STEP_KIND_LABELS } from "../model/defaults";
import { stepFormSchema, type StepFormInput, type StepFormValues } from "./form-schemas";
import { formToMeta, stepToForm } from "./step-form-values";
import { useLiveApply } from "./use-live-apply";
import { CommandFields } from "./command-fields";
import { AlarmFields } from "./alarm-fields";
import { Section, SelectField, SmallButton, TextField } from "./fields";

export interface StepFormProps {
  name: string;
  definition: SequenceDefinition;
  readOnly: boolean;
  onApplyMeta: (meta: StepMeta) => void;
  onRename: (to: string) => void;
  onSetInitial: () => void;
  onDelete: () => void;
}

const KIND_OPTIONS = STEP_KINDS.map((k) => ({ value: k, label: STEP_KIND_LABELS[k] }));
const BREATH_OPTIONS = [
  { value: "default", label: "Default (inhale steps start a breath)" },
  { value: "yes", label: "Yes — entering starts a breath" },
  { value: "no", label: "No" },
];

export function StepForm({ name, definition, readOnly, onApplyMeta, onRename, onSetInitial, onDelete }: StepFormProps) {
  const meta = definition.machine.states[name].meta;
  const schema = useMemo(() => stepFormSchema(definition, name), [definition, name]);
  const form = useForm<StepFormInput, unknown, StepFormValues>({
    resolver: zodResolver(schema),
    mode: "onChange",
    defaultValues: stepToForm(name, meta),
  });
  const { register, formState, watch, getValues, trigger } = form;

  useLiveApply(watch, schema, (v: StepFormValues) => onApplyMeta(formToMeta(v)), (v) => ({ ...v, name }));

  const commitName = async () => {
    const to = getValues("name");
    if (to === name) return;
    if (await trigger("name")) onRename(to);
  };

  const isInitial = definition.machine.initial === name;
  return (
    <FormProvider {...form}>
      <form className="flex flex-col gap-3" onSubmit={(e) => e.preventDefault()} aria-label={`Step ${name}`} data-testid="step-form">
        <fieldset disabled={readOnly} className="flex flex-col gap-3">
          <TextField
            label="Name"
            hint="used by transitions"
            error={formState.errors.name?.message}
            data-testid="step-name"
            {...register("name", { onBlur: () => void commitName() })}
            onKeyDown={(e) => {
              if (e.key === "Enter") void commitName();
            }}
          />
          <TextField label="Label" hint="optional, shown on the canvas" {...register("label")} />
          <SelectField label="Kind" options={KIND_OPTIONS} data-testid="step-kind" {...register("kind")} />
          <CommandFields settings={definition.settings} disabled={readOnly} />
          <SelectField label="Starts a breath" options={BREATH_OPTIONS} {...register("breathStart")} />
          <TextField label="Description" hint="optional" {...register("description")} />
          <AlarmFields disabled={readOnly} />
        </fieldset>
        <Section title="Sequence entry">
          {isInitial ? (
            <p className="text-xs text-ink-700" data-testid="is-initial">
              The sequence starts in this step.
            </p>
          ) : (
            <SmallButton disabled={readOnly} onClick={onSetInitial} data-testid="make-initial">
              Start the sequence here
            </SmallButton>
          )}
        </Section>
        {readOnly ? null : (
          <SmallButton tone="danger" className="self-start" onClick={onDelete} data-testid="delete-step">
            Delete step
          </SmallButton>
        )}
      </form>
    </FormProvider>
  );
}
