"use client";
/**
 * Create or edit a patient case. The same zod schema as the handler (lib/validation/cases.ts) checks the
 * form; the API's field errors land on the matching inputs. Numbers may be typed with units ("50 mL/hPa")
 * and are sent in the canonical unit shown beside each field (case-units.ts).
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { get, useForm, useWatch, type FieldErrors, type FieldPath } from "react-hook-form";
import type { CreateCaseBody } from "@/lib/validation/cases";
import { EFFORT_SHAPES, type Patient } from "@/lib/sim/types";
import { convertedText, readValue } from "@/components/forms/unit-field";
import { EFFORT_FIELDS, LUNG_FIELDS, caseResolver, leakField, type CaseField, type CaseFormValues } from "./case-units";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field, Input, Select, Textarea } from "@/components/ui/field";

export interface CaseFormProps {
  /** Present when editing. */
  caseId?: string;
  initial?: { name: string; description: string; source: string; patient: Patient };
}

const BLANK: CaseFormValues = {
  name: "",
  description: "",
  source: "",
  patient: {
    complianceMlPerCmH2O: 50,
    resistanceCmH2OPerLps: 5,
    e2CmH2OPerL2: 0,
    effort: { shape: "none", amplitudeCmH2O: 0, ratePerMin: 15, effortTimeS: 0.8, onsetS: 1, variability: 0 },
    leak: { kind: "none", coefficient: 0 },
  },
};

function messageAt(errors: FieldErrors<CaseFormValues>, path: string): string | undefined {
  const node: unknown = get(errors, path);
  if (typeof node === "object" && node !== null && "message" in node) {
    const message = (node as { message?: unknown }).message;
    return typeof message === "string" ? message : undefined;
  }
  return undefined;
}

export function CaseForm({ caseId, initial }: CaseFormProps) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const form = useForm<CaseFormValues, unknown, CreateCaseBody>({
    resolver: caseResolver,
    defaultValues: initial ?? BLANK,
  });
  const { errors, isSubmitting } = form.formState;
  const pe = errors.patient;
  // Watched so each field can show what its typed units come to as the user types.
  const watched = useWatch({ control: form.control }) as CaseFormValues;

  function numberField(field: CaseField) {
    const message = messageAt(errors, field.path);
    // Only a value that reads cleanly shows its conversion; an error says what went wrong instead.
    const converted = message ? null : convertedText(readValue(get(watched, field.path), field.quantity, field.unit), field.unit);
    return (
      <Field key={field.path} label={field.label} errors={message} hint={field.hint}>
        {(a) => (
          <>
            <div className="flex items-center gap-2">
              {/* Text, not type="number": "50 mL/hPa" must reach the unit parser. */}
              <Input {...a} type="text" inputMode="decimal" spellCheck={false} className="font-mono tabular-nums" {...form.register(field.path)} />
              <span className="shrink-0 text-xs text-ink-500">{field.unit}</span>
            </div>
            {converted ? (
              <p className="text-xs text-ink-500" data-testid={`${field.path}-converted`}>
                {converted}
              </p>
            ) : null}
          </>
        )}
      </Field>
    );
  }

  const onSubmit = form.handleSubmit(async (values) => {
    setError(null);
    setSaved(false);
    try {
      if (caseId) {
        await apiFetch(`/api/cases/${caseId}`, { method: "PATCH", body: values });
        setSaved(true);
        router.refresh();
      } else {
        const created = await apiFetch<{ id: string }>("/api/cases", { body: values });
        router.push(`/cases/${created.id}`);
        router.refresh();
      }
    } catch (err) {
      if (err instanceof ApiClientError) {
        for (const [name, messages] of Object.entries(err.fields)) {
          form.setError(name as FieldPath<CaseFormValues>, { message: messages.join(" ") });
        }
      }
      setError(err instanceof Error ? err.message : "Could not save the case.");
    }
  });

  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="space-y-5" aria-label={caseId ? "Edit patient case" : "New patient case"} data-testid="case-form">
      {error && <Alert tone="error">{error}</Alert>}
      {saved && <Alert tone="success">Saved.</Alert>}
      <Field label="Name" errors={errors.name?.message}>
        {(a) => <Input {...a} {...form.register("name")} />}
      </Field>
      <Field label="Description" errors={errors.description?.message} hint="Who this patient is and what the case exercises.">
        {(a) => <Textarea {...a} rows={3} {...form.register("description")} />}
      </Field>
      <Field
        label="Source of the values"
        errors={errors.source?.message}
        hint="A citation, or say “memory” or “common practice” when there is no source to cite."
      >
        {(a) => <Input {...a} {...form.register("source")} />}
      </Field>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Lung mechanics</legend>
        {LUNG_FIELDS.map(numberField)}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Spontaneous effort</legend>
        <Field label="Shape" errors={pe?.effort?.shape?.message}>
          {(a) => (
            <Select {...a} {...form.register("patient.effort.shape")}>
              {EFFORT_SHAPES.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </Select>
          )}
        </Field>
        {EFFORT_FIELDS.map(numberField)}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold text-ink-900">Leak</legend>
        <Field label="Kind" errors={pe?.leak?.kind?.message}>
          {(a) => (
            <Select {...a} {...form.register("patient.leak.kind")}>
              <option value="none">none</option>
              <option value="orifice">orifice (flow ∝ √pressure)</option>
              <option value="linear">linear</option>
            </Select>
          )}
        </Field>
        {numberField(leakField(watched.patient?.leak?.kind))}
      </fieldset>

      <div className="flex justify-end">
        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          {caseId ? "Save case" : "Create case"}
        </Button>
      </div>
    </form>
  );
}
