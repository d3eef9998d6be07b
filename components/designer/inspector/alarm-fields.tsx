"use client";
/** Alarms raised on entry into the step, each with its IEC 60601-1-8 priority. */
import { useFieldArray, useFormContext } from "react-hook-form";
import type { StepFormInput } from "./form-schemas";
import { Section, SelectField, SmallButton, TextField } from "./fields";
import { ALARM_COLOURS } from "../canvas/kind-style";

const PRIORITIES = [
  { value: "high", label: "High" },
  { value: "medium", label: "Medium" },
  { value: "low", label: "Low" },
] as const;

export function AlarmFields({ disabled }: { disabled: boolean }) {
  const { control, register, formState, watch } = useFormContext<StepFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: "alarms" });
  const errors = formState.errors.alarms;
  return (
    <Section
      title="Alarms on entry"
      actions={
        disabled ? null : (
          <SmallButton onClick={() => append({ kind: "alarm", message: "Describe the condition", priority: "medium" })}>Add alarm</SmallButton>
        )
      }
    >
      {fields.length === 0 ? <p className="text-xs text-ink-500">Entering this step raises no alarm.</p> : null}
      {fields.map((f, i) => {
        const priority = watch(`alarms.${i}.priority`) ?? "medium";
        return (
          <div key={f.id} className="flex flex-col gap-1 rounded border-l-4 bg-ink-50 p-2" style={{ borderLeftColor: ALARM_COLOURS[priority] }}>
            <div className="grid grid-cols-2 gap-2">
              <TextField label="Kind" disabled={disabled} error={errors?.[i]?.kind?.message} {...register(`alarms.${i}.kind`)} />
              <SelectField label="Priority" disabled={disabled} options={PRIORITIES} {...register(`alarms.${i}.priority`)} />
            </div>
            <TextField label="Message" disabled={disabled} error={errors?.[i]?.message?.message} {...register(`alarms.${i}.message`)} />
            {disabled ? null : (
              <SmallButton tone="danger" className="self-end" onClick={() => remove(i)}>
                Remove alarm
              </SmallButton>
            )}
          </div>
        );
      })}
    </Section>
  );
}
