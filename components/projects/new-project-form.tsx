"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { createProjectSchema, type CreateProject, type CreateProjectInput, type ProjectSummary } from "@/lib/validation/projects";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Button } from "@/components/ui/button";
import { Field, Input, Textarea } from "@/components/ui/field";
import { Alert } from "@/components/ui/alert";
import { projectsQueryKey } from "./project-list";

export function NewProjectForm() {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const form = useForm<CreateProjectInput, unknown, CreateProject>({
    resolver: zodResolver(createProjectSchema),
    defaultValues: { name: "", description: "" },
  });
  const mutation = useMutation({
    mutationFn: (values: CreateProject) => apiFetch<ProjectSummary>("/api/projects", { body: values }),
    onSuccess: async (project) => {
      await queryClient.invalidateQueries({ queryKey: projectsQueryKey });
      router.push(`/projects/${project.id}`);
      router.refresh();
    },
    onError: (err) => {
      if (err instanceof ApiClientError) {
        for (const [name, messages] of Object.entries(err.fields)) {
          if (name === "name" || name === "description") form.setError(name, { message: messages.join(" ") });
        }
      }
      setError(err.message);
    },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((values) => {
    setError(null);
    mutation.mutate(values);
  });

  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="space-y-4" aria-label="New project">
      {error && <Alert tone="error">{error}</Alert>}
      <Field label="Name" errors={errors.name?.message} hint="For example the device and build, “Marram MK-2 bench build”.">
        {(a) => <Input {...a} autoFocus {...form.register("name")} />}
      </Field>
      <Field label="Description" errors={errors.description?.message} hint="Optional: hardware, controller, goals.">
        {(a) => <Textarea {...a} rows={4} {...form.register("description")} />}
      </Field>
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={() => router.push("/projects")}>
          Cancel
        </Button>
        <Button type="submit" busy={mutation.isPending} busyLabel="Creating…">
          Create project
        </Button>
      </div>
    </form>
  );
}
