"use client";
/**
 * Create or edit a patient case. The same zod schema as the handler (lib/validation/cases.ts) checks the
 * form; the API's field errors land on the matching inputs.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { createCaseBody, type CreateCaseBody, type CreateCaseInput } from "@/lib/validation/cases";
import { EFFORT_SHAPES, type Patient } from "@/lib/sim/types";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field, Input, Select, Textarea } from "@/components/ui/field";

export interface CaseFormProps {
  /** Present when editing. */
  caseId?: string;
  initial?: { name: string; description: string; source: string; patient: Patient };
}

const BLANK: CreateCaseInput = {
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

const num = { valueAsNumber: true } as const;

export function CaseForm({ caseId, initial }: CaseFormProps) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const form = useForm<CreateCaseInput, unknown, CreateCaseBody>({
    resolver: zodResolver(createCaseBody),
    defaultValues: initial ?? BLANK,
  });
  const { errors, isSubmitting } = form.formState;
  const pe = errors.patient;

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
          form.setError(name as FieldPath<CreateCaseInput>, { message: messages.join(" ") });
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
        <Field label="Compliance (mL/cmH2O)" errors={pe?.complianceMlPerCmH2O?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.complianceMlPerCmH2O", num)} />}
        </Field>
        <Field label="Resistance (cmH2O/(L/s))" errors={pe?.resistanceCmH2OPerLps?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.resistanceCmH2OPerLps", num)} />}
        </Field>
        <Field label="Non-linear elastance E2 (cmH2O/L²)" errors={pe?.e2CmH2OPerL2?.message} hint="0 for a linear lung.">
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.e2CmH2OPerL2", num)} />}
        </Field>
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
        <Field label="Peak muscle pressure (cmH2O)" errors={pe?.effort?.amplitudeCmH2O?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.effort.amplitudeCmH2O", num)} />}
        </Field>
        <Field label="Rate (/min)" errors={pe?.effort?.ratePerMin?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.effort.ratePerMin", num)} />}
        </Field>
        <Field label="Effort time (s)" errors={pe?.effort?.effortTimeS?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.effort.effortTimeS", num)} />}
        </Field>
        <Field label="First onset (s)" errors={pe?.effort?.onsetS?.message}>
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.effort.onsetS", num)} />}
        </Field>
        <Field label="Variability (fraction)" errors={pe?.effort?.variability?.message} hint="0 = regular, 0.3 = ±30 %.">
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.effort.variability", num)} />}
        </Field>
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
        <Field
          label="Coefficient"
          errors={pe?.leak?.coefficient?.message}
          hint="Orifice: L/min at 10 cmH2O. Linear: L/min per cmH2O."
        >
          {(a) => <Input {...a} type="number" step="any" {...form.register("patient.leak.coefficient", num)} />}
        </Field>
      </fieldset>

      <div className="flex justify-end">
        <Button type="submit" busy={isSubmitting} busyLabel="Saving…">
          {caseId ? "Save case" : "Create case"}
        </Button>
      </div>
    </form>
  );
}
