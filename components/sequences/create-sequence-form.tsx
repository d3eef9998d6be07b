"use client";
/**
 * New sequence: a name and a starting point (blank or one of the built-in templates). Validated with
 * the same schema as POST /api/projects/:id/sequences; on success opens the editor on revision 1.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { sequenceName, templateId } from "@/lib/validation/sequences";
import type { TemplateSummary } from "@/lib/sequences/types";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { cn } from "@/components/ui/cn";

/** The form's view of the payload: "" stands for the blank sequence in the radio group. */
const formSchema = z.object({ name: sequenceName, template: z.union([z.literal(""), templateId]) });
type FormValues = z.infer<typeof formSchema>;

interface Props {
  projectId: string;
  templates: TemplateSummary[];
  defaultTemplate?: string;
  onCancel?: () => void;
}

export function CreateSequenceForm({ projectId, templates, defaultTemplate, onCancel }: Props) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { name: "", template: defaultTemplate ?? "" },
  });
  const { register, handleSubmit, formState, setError: setFieldError, control } = form;
  const chosen = useWatch({ control, name: "template" });

  async function create(values: FormValues) {
    setError(null);
    try {
      const { id } = await apiFetch<{ id: string }>(`/api/projects/${projectId}/sequences`, {
        body: { name: values.name, ...(values.template ? { template: values.template } : {}) },
      });
      router.push(`/projects/${projectId}/sequences/${id}`);
    } catch (err) {
      if (err instanceof ApiClientError) {
        if (err.fields.name) setFieldError("name", { message: err.fields.name[0] });
        if (err.fields.template) setFieldError("template", { message: err.fields.template[0] });
      }
      setError(err instanceof Error ? err.message : "The sequence was not created.");
    }
  }

  const options: Array<{ id: string; title: string; description: string }> = [
    { id: "", title: "Blank", description: "One standby step; build the breath cycle from the palette." },
    ...templates,
  ];

  return (
    <form onSubmit={handleSubmit(create)} noValidate className="space-y-5" aria-label="New sequence">
      {error && <Alert tone="error">{error}</Alert>}
      <Field label="Name" errors={formState.errors.name?.message}>
        {(control) => <Input {...control} autoFocus placeholder="e.g. MK-1 assisted volume" {...register("name")} />}
      </Field>
      <fieldset className="space-y-2">
        <legend className="mb-1 text-sm font-medium text-ink-800">Start from</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {options.map((option) => (
            <label
              key={option.id || "blank"}
              className={cn(
                "flex cursor-pointer gap-3 rounded-md border px-3 py-2 text-sm transition-colors",
                chosen === option.id ? "border-glass-600 bg-glass-50" : "border-line bg-surface hover:border-glass-400",
              )}
            >
              <input type="radio" value={option.id} className="mt-1 accent-glass-700" {...register("template")} />
              <span>
                <span className="block font-medium text-ink-900">{option.title}</span>
                <span className="block text-xs text-ink-500">{option.description}</span>
              </span>
            </label>
          ))}
        </div>
        {formState.errors.template?.message && (
          <p role="alert" className="text-xs font-medium text-danger-700">
            {formState.errors.template.message}
          </p>
        )}
      </fieldset>
      <div className="flex justify-end gap-2">
        {onCancel && (
          <Button variant="ghost" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <Button type="submit" busy={formState.isSubmitting} busyLabel="Creating…">
          Create sequence
        </Button>
      </div>
    </form>
  );
}
