"use client";
/**
 * The rig profile form: every field of `rigSchema` (lib/sim/types.ts), validated in the browser with
 * the same schema the PUT handler uses. Numbers may be typed with units ("0.1 psi", "15 ms") and are
 * stored in the canonical unit shown beside each field (rig-units.ts). Read-only users get the same
 * layout with inputs disabled.
 */
import { useState } from "react";
import { get, useForm, useWatch, type FieldPath } from "react-hook-form";
import type { Rig } from "@/lib/sim/types";
import { PEEP_VALVE_FIELD, RIG_FIELD_GROUPS, type RigField, type RigFormValues } from "./rig-fields";
import { quantityOf, readQuantity, rigResolver } from "./rig-units";
import { CalibrationTable } from "./calibration-table";
import { formatTime } from "./format";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";

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
  const form = useForm<RigFormValues, unknown, Rig>({
    resolver: rigResolver,
    defaultValues: rig,
    mode: "onBlur",
  });
  const { register, handleSubmit, control, formState, setError, reset } = form;
  const values = useWatch({ control }) as RigFormValues;
  const peepValve = values.peepValveCmH2O;
  const peepFollowsSequence = peepValve === null || peepValve === undefined;

  /** "= 7.0307 cmH2O" under a field whose value was typed with units, so the stored number is visible. */
  function conversion(field: RigField): string | null {
    const r = readQuantity(get(values, field.path), quantityOf(field, values));
    return r.ok && r.converted ? `= ${Number(r.value.toPrecision(6))} ${field.unit}` : null;
  }

  async function save(values: Rig) {
    setStatus({ kind: "saving" });
    try {
      const saved = await apiFetch<{ rig: Rig; updatedAt: string }>(`/api/projects/${projectId}/rig`, {
        method: "PUT",
        body: { rig: values },
      });
      reset(saved.rig);
      setSavedAt(saved.updatedAt);
      setStatus({ kind: "saved", at: saved.updatedAt });
    } catch (err) {
      if (err instanceof ApiClientError) {
        for (const [field, messages] of Object.entries(err.fields)) {
          setError(field.replace(/^rig\./, "") as FieldPath<RigFormValues>, { message: messages[0] });
        }
      }
      setStatus({ kind: "error", message: err instanceof Error ? err.message : "The profile was not saved." });
    }
  }

  function numberInput(field: RigField, labelText = field.label, ariaLabel?: string) {
    const message = errorAt(formState.errors, field.path);
    const id = `rig-${field.path.replace(/\./g, "-")}`;
    const converted = message ? null : conversion(field);
    return (
      <div key={field.path} className="flex flex-col gap-1">
        {labelText ? (
          <label htmlFor={id} className="text-sm font-medium text-ink-800">
            {labelText}
          </label>
        ) : null}
        <div className="flex items-center gap-2">
          {/* Text, not type="number": "0.1 psi" must reach the unit parser. */}
          <input
            id={id}
            type="text"
            inputMode="decimal"
            spellCheck={false}
            aria-label={ariaLabel}
            aria-invalid={message ? true : undefined}
            aria-describedby={message ? `${id}-error` : undefined}
            className="w-32 h-9 rounded-md border border-line bg-surface px-2 font-mono text-sm tabular-nums text-ink-900 focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50 aria-[invalid=true]:border-danger-600"
            {...register(field.path)}
          />
          <span className="text-xs text-ink-500">{field.unit}</span>
        </div>
        {converted ? (
          <span className="text-xs text-ink-500" data-testid={`${id}-converted`}>
            {converted}
          </span>
        ) : null}
        {field.hint ? <span className="text-xs text-ink-400">{field.hint}</span> : null}
        {message ? (
          <span id={`${id}-error`} role="alert" className="text-xs text-danger-700">
            {message}
          </span>
        ) : null}
      </div>
    );
  }

  return (
    <form onSubmit={handleSubmit(save)} className="flex flex-col gap-8" noValidate aria-label="Rig profile">
      {status.kind === "error" ? (
        <Alert tone="error" title="The rig profile was not saved">
          {status.message}
        </Alert>
      ) : null}
      <fieldset disabled={!canEdit || status.kind === "saving"} className="flex flex-col gap-8">
        <div className="flex flex-col gap-1">
          <label htmlFor="rig-name" className="text-sm font-medium text-ink-800">
            Profile name
          </label>
          <input
            id="rig-name"
            className="w-72 h-9 rounded-md border border-line bg-surface px-2 text-sm text-ink-900 focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50"
            {...register("name")}
          />
          {errorAt(formState.errors, "name") ? (
            <span role="alert" className="text-xs text-danger-700">
              {errorAt(formState.errors, "name")}
            </span>
          ) : null}
        </div>

        {RIG_FIELD_GROUPS.map((group) => (
          <section key={group.title} aria-labelledby={`rig-group-${group.title}`} className="flex flex-col gap-3">
            <div>
              <h2 id={`rig-group-${group.title}`} className="text-base font-semibold text-ink-900">
                {group.title}
              </h2>
              <p className="text-sm text-ink-500">{group.description}</p>
            </div>
            <div className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-3">
              {group.fields.map((field) => numberInput(field))}
              {group.title === "Circuit" ? (
                <div className="flex flex-col gap-1">
                  <label htmlFor="rig-circuit-leak-kind" className="text-sm font-medium text-ink-800">
                    Leak model
                  </label>
                  <select
                    id="rig-circuit-leak-kind"
                    className="w-40 h-9 rounded-md border border-line bg-surface px-2 text-sm text-ink-900 focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50"
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
                  <span className="text-sm font-medium text-ink-800">PEEP valve</span>
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
                  {peepFollowsSequence ? null : numberInput(PEEP_VALVE_FIELD, "", "PEEP valve setting")}
                </div>
              ) : null}
            </div>
          </section>
        ))}

        <CalibrationTable control={control} register={register} errors={formState.errors} />
      </fieldset>

      <div className="flex items-center gap-4">
        {canEdit ? (
          <Button type="submit" busy={status.kind === "saving"} busyLabel="Saving…" disabled={!formState.isDirty}>
            Save rig profile
          </Button>
        ) : (
          <p className="text-sm text-ink-500">You can read this profile; engineers and admins change it.</p>
        )}
        <p aria-live="polite" className="text-sm">
          {status.kind === "saved" ? <span className="text-ink-500">Saved.</span> : null}
          {status.kind !== "saved" && savedAt ? (
            <span className="text-ink-400">Last changed {formatTime(savedAt)}</span>
          ) : null}
          {!savedAt && status.kind === "idle" ? (
            <span className="text-ink-400">Default profile: not saved for this project yet.</span>
          ) : null}
        </p>
      </div>
    </form>
  );
}
