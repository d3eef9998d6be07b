"use client";
/** The command to the rig while the step is active: its kind, then that kind's formulas with units. */
import { Controller, useFormContext, useWatch } from "react-hook-form";
import type { Command, Setting } from "@/machines/schema";
import type { StepFormInput } from "./form-schemas";
import { SelectField } from "./fields";
import { FormulaField } from "./formula-field";
import type { FormulaPlace } from "./formula-check";

const COMMAND_OPTIONS = [
  { value: "flow", label: "Deliver a flow" },
  { value: "pressure", label: "Drive to a pressure" },
  { value: "arm", label: "Drive the arm to an angle" },
  { value: "release", label: "Release (expiratory valve open)" },
  { value: "hold", label: "Hold still (valve closed)" },
] as const;

/** A command of the new kind, carrying over nothing: the numbers of one kind mean nothing in another. */
function commandOfKind(kind: Command["kind"]): Command {
  switch (kind) {
    case "flow":
      return { kind, flow: "30" };
    case "pressure":
      return { kind, target: "20", rise: "0.1" };
    case "arm":
      return { kind, angle: "60", pulseRate: "2000" };
    default:
      return { kind };
  }
}

const FIELDS: Record<Command["kind"], Array<{ field: string; label: string; place: FormulaPlace }>> = {
  flow: [{ field: "flow", label: "Flow", place: "flow" }],
  pressure: [
    { field: "target", label: "Target pressure (absolute)", place: "pressure" },
    { field: "rise", label: "Rise time", place: "time" },
  ],
  arm: [
    { field: "angle", label: "Arm angle", place: "angle" },
    { field: "pulseRate", label: "Pulse rate", place: "pulse-rate" },
  ],
  release: [],
  hold: [],
};

export function CommandFields({ settings, disabled }: { settings: Readonly<Record<string, Setting>>; disabled: boolean }) {
  const { control, setValue, formState } = useFormContext<StepFormInput>();
  const kind = useWatch({ control, name: "command.kind" });
  const errors = formState.errors.command as Record<string, { message?: string } | undefined> | undefined;
  return (
    <div className="flex flex-col gap-2">
      <SelectField
        label="Command to the rig"
        options={COMMAND_OPTIONS}
        value={kind}
        disabled={disabled}
        data-testid="command-kind"
        onChange={(e) => setValue("command", commandOfKind(e.target.value as Command["kind"]), { shouldDirty: true, shouldValidate: true })}
      />
      {FIELDS[kind].map(({ field, label, place }) => (
        <Controller
          key={`${kind}.${field}`}
          control={control}
          name={`command.${field}` as "command.kind"}
          render={({ field: f }) => (
            <FormulaField
              label={label}
              value={String(f.value ?? "")}
              onChange={f.onChange}
              onBlur={f.onBlur}
              error={errors?.[field]?.message}
              place={place}
              settings={settings}
              disabled={disabled}
              testId={`command-${field}`}
            />
          )}
        />
      ))}
    </div>
  );
}
