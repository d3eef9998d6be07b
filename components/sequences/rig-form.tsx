"use client";
/**
 * The rig profile form: every field of `rigSchema` (lib/sim/types.ts), validated in the browser with
 * the same schema the PUT handler uses. Read-only users get the same layout with inputs disabled.
 */
import { useState } from "react";
import { useForm, useWatch, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { rigSchema, type Rig, type RigInput } from "@/lib/sim/types";
import { RIG_FIELD_GROUPS, type RigField } from "./rig-fields";
import { CalibrationTable } from "./calibration-table";
import { sendJson } from "./fetch-json";

interface Props {
  projectId: string;
  rig: Rig;
  updatedAt: string | null;
  canEdit: boolean;
}

type Status = { kind: "idle" } | { kind: "saving" } | { kind: "saved"; at: string } | { kind: "error"; message: string };

function errorAt(errors: unknown, path: string): string | undefined {
  let node: unknown = errors;
  for (const key of path.split(".")) {
    if (typeof node !== "object" || node === null) return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  if (typeof node === "object" && node !== null && "message" in node) {
    const message = (node as { message?: unknown }).message;
    return typeof message === "string" ? message : undefined;
  }
  return undefined;
}

export function RigForm({ projectId, rig, updatedAt, canEdit }: Props) {
  const [status, setStatus] = useState<Status>({ kind: "idle" });
  const [savedAt, setSavedAt] = useState(updatedAt);
  const form = useForm<RigInput, unknown, Rig>({
    resolver: zodResolver(rigSchema),
    defaultValues: rig,
    mode: "onBlur",
  });
  const { register, handleSubmit, control, formState, setError, reset } = form;
  const peepValve = useWatch({ control, name: "peepValveCmH2O" });
  const peepFollowsSequence = peepValve === null || peepValve === undefined;

  async function save(values: Rig) {
    setStatus({ kind: "saving" });
    const result = await sendJson<{ rig: Rig; updatedAt: string }>(`/api/projects/${projectId}/rig`, "PUT", {
      rig: values,
    });
    if (!result.ok) {
      for (const [field, messages] of Object.entries(result.fields ?? {})) {
        const path = field.replace(/^rig\./, "") as FieldPath<RigInput>;
        setError(path, { message: messages[0] });
      }
      setStatus({ kind: "error", message: result.error });
      return;
    }
    reset(result.data.rig);
    setSavedAt(result.data.updatedAt);
    setStatus({ kind: "saved", at: result.data.updatedAt });
  }

  function numberInput(field: RigField) {
    const message = errorAt(formState.errors, field.path);
    const id = `rig-${field.path.replace(/\./g, "-")}`;
    return (
      <div key={field.path} className="flex flex-col gap-1">
        <label htmlFor={id} className="text-sm font-medium">
          {field.label}
        </label>
        <div className="flex items-center gap-2">
          <input
            id={id}
            type="number"
            step={field.step}
            inputMode="decimal"
            aria-invalid={message ? true : undefined}
            aria-describedby={message ? `${id}-error` : undefined}
            className="w-32 rounded border border-black/15 bg-white px-2 py-1 font-mono text-sm tabular-nums disabled:bg-black/5"
            {...register(field.path, { valueAsNumber: true })}
          />
          <span className="text-xs text-black/60">{field.unit}</span>
        </div>
        {field.hint ? <span className="text-xs text-black/50">{field.hint}</span> : null}
        {message ? (
          <span id={`${id}-error`} role="alert" className="text-xs text-red-700">
            {message}
          </span>
        ) : null}
      </div>
    );
  }

  return (
    <form onSubmit={handleSubmit(save)} className="flex flex-col gap-8" noValidate>
      <fieldset disabled={!canEdit || status.kind === "saving"} className="flex flex-col gap-8">
        <div className="flex flex-col gap-1">
          <label htmlFor="rig-name" className="text-sm font-medium">
            Profile name
          </label>
          <input
            id="rig-name"
            className="w-72 rounded border border-black/15 bg-white px-2 py-1 text-sm disabled:bg-black/5"
            {...register("name")}
          />
          {errorAt(formState.errors, "name") ? (
            <span role="alert" className="text-xs text-red-700">
              {errorAt(formState.errors, "name")}
            </span>
          ) : null}
        </div>

        {RIG_FIELD_GROUPS.map((group) => (
          <section key={group.title} aria-labelledby={`rig-group-${group.title}`} className="flex flex-col gap-3">
            <div>
              <h2 id={`rig-group-${group.title}`} className="text-base font-semibold">
                {group.title}
              </h2>
              <p className="text-sm text-black/60">{group.description}</p>
            </div>
            <div className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-3">
              {group.fields.map(numberInput)}
              {group.title === "Circuit" ? (
                <div className="flex flex-col gap-1">
                  <label htmlFor="rig-circuit-leak-kind" className="text-sm font-medium">
                    Leak model
                  </label>
                  <select
                    id="rig-circuit-leak-kind"
                    className="w-40 rounded border border-black/15 bg-white px-2 py-1 text-sm disabled:bg-black/5"
                    {...register("circuit.leak.kind")}
                  >
                    <option value="none">none</option>
                    <option value="orifice">orifice (∝ √P)</option>
                    <option value="linear">linear</option>
                  </select>
                </div>
              ) : null}
              {group.title === "Valves" ? (
                <div className="flex flex-col gap-1">
                  <span className="text-sm font-medium">PEEP valve</span>
                  <label className="flex items-center gap-2 text-sm">
                    <input
                      type="checkbox"
                      checked={peepFollowsSequence}
                      onChange={(e) =>
                        form.setValue("peepValveCmH2O", e.target.checked ? null : 5, {
                          shouldDirty: true,
                          shouldValidate: true,
                        })
                      }
                    />
                    follows the sequence&apos;s PEEP setting
                  </label>
                  {peepFollowsSequence ? null : (
                    <div className="flex items-center gap-2">
                      <input
                        aria-label="PEEP valve setting"
                        type="number"
                        step="any"
                        className="w-32 rounded border border-black/15 bg-white px-2 py-1 font-mono text-sm disabled:bg-black/5"
                        {...register("peepValveCmH2O", { valueAsNumber: true })}
                      />
                      <span className="text-xs text-black/60">cmH2O</span>
                    </div>
                  )}
                  {errorAt(formState.errors, "peepValveCmH2O") ? (
                    <span role="alert" className="text-xs text-red-700">
                      {errorAt(formState.errors, "peepValveCmH2O")}
                    </span>
                  ) : null}
                </div>
              ) : null}
            </div>
          </section>
        ))}

        <CalibrationTable control={control} register={register} errors={formState.errors} />
      </fieldset>

      <div className="flex items-center gap-4">
        {canEdit ? (
          <button
            type="submit"
            disabled={status.kind === "saving" || !formState.isDirty}
            className="rounded bg-[var(--color-ink,#1c2b33)] px-4 py-2 text-sm font-medium text-white disabled:opacity-40"
          >
            {status.kind === "saving" ? "Saving…" : "Save rig profile"}
          </button>
        ) : (
          <p className="text-sm text-black/60">You can read this profile; engineers and admins change it.</p>
        )}
        <p aria-live="polite" className="text-sm">
          {status.kind === "error" ? <span className="text-red-700">{status.message}</span> : null}
          {status.kind === "saved" ? <span className="text-black/60">Saved.</span> : null}
          {status.kind !== "saved" && savedAt ? (
            <span className="text-black/50">Last changed {new Date(savedAt).toLocaleString()}</span>
          ) : null}
          {!savedAt && status.kind === "idle" ? (
            <span className="text-black/50">Default profile: not saved for this project yet.</span>
          ) : null}
        </p>
      </div>
    </form>
  );
}
