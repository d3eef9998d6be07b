"use client";

import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ROLES, ROLE_LABELS, ROLE_SUMMARIES, type Role } from "@/lib/auth/roles";
import { createUserSchema, type CreateUserInput, type UserSummary } from "@/lib/validation/users";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card, CardBody, CardHeader } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";

const usersKey = ["users"] as const;

export function UsersAdmin({ initialUsers, currentUserId }: { initialUsers: UserSummary[]; currentUserId: string }) {
  const queryClient = useQueryClient();
  const users = useQuery({
    queryKey: usersKey,
    queryFn: async () => (await apiFetch<{ users: UserSummary[] }>("/api/users")).users,
    initialData: initialUsers,
  });
  const [rowError, setRowError] = useState<string | null>(null);
  const update = useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: { role?: Role; active?: boolean } }) =>
      apiFetch<UserSummary>(`/api/users/${id}`, { method: "PATCH", body: patch }),
    onMutate: () => setRowError(null),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKey }),
    onError: (err) => setRowError(err.message),
  });

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <Card>
        <CardHeader title="Accounts" description={`${users.data.length} accounts`} />
        <CardBody className="overflow-x-auto">
          {rowError && <Alert tone="error" className="mb-3">{rowError}</Alert>}
          <table className="w-full text-sm" aria-label="Users">
            <thead className="text-left text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="py-1.5 font-medium">Name</th>
                <th className="py-1.5 font-medium">Email</th>
                <th className="py-1.5 font-medium">Role</th>
                <th className="py-1.5 font-medium">Status</th>
                <th className="py-1.5" />
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {users.data.map((u) => {
                const self = u.id === currentUserId;
                return (
                  <tr key={u.id} data-testid={`user-row-${u.email}`}>
                    <td className="py-2 pr-3">{u.name}</td>
                    <td className="py-2 pr-3 font-mono text-xs text-ink-600">{u.email}</td>
                    <td className="py-2 pr-3">
                      <Select
                        aria-label={`Role of ${u.email}`}
                        value={u.role}
                        disabled={self || update.isPending}
                        onChange={(e) => update.mutate({ id: u.id, patch: { role: e.target.value as Role } })}
                        className="h-8 w-36"
                      >
                        {ROLES.map((r) => (
                          <option key={r} value={r}>
                            {ROLE_LABELS[r]}
                          </option>
                        ))}
                      </Select>
                    </td>
                    <td className="py-2 pr-3">
                      {u.active ? <Badge tone="glass">Active</Badge> : <Badge tone="neutral">Deactivated</Badge>}
                    </td>
                    <td className="py-2 text-right">
                      {!self && (
                        <Button
                          size="sm"
                          variant={u.active ? "danger" : "secondary"}
                          disabled={update.isPending}
                          onClick={() => update.mutate({ id: u.id, patch: { active: !u.active } })}
                        >
                          {u.active ? "Deactivate" : "Reactivate"}
                        </Button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </CardBody>
      </Card>
      <Card className="self-start">
        <CardHeader title="Add a user" description="They sign in with this email and password." />
        <CardBody>
          <CreateUserForm onCreated={() => void queryClient.invalidateQueries({ queryKey: usersKey })} />
        </CardBody>
      </Card>
    </div>
  );
}

function CreateUserForm({ onCreated }: { onCreated: () => void }) {
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const form = useForm<CreateUserInput>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: "", name: "", role: "engineer", password: "" },
  });
  const { errors, isSubmitting } = form.formState;
  const role = useWatch({ control: form.control, name: "role" });
  const onSubmit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      const user = await apiFetch<UserSummary>("/api/users", { body: values });
      form.reset({ email: "", name: "", role: values.role, password: "" });
      setMessage({ tone: "success", text: `Added ${user.email} as ${ROLE_LABELS[user.role]}.` });
      onCreated();
    } catch (err) {
      if (err instanceof ApiClientError) {
        for (const [name, messages] of Object.entries(err.fields)) {
          if (name === "email" || name === "name" || name === "role" || name === "password") {
            form.setError(name, { message: messages.join(" ") });
          }
        }
      }
      setMessage({ tone: "error", text: err instanceof Error ? err.message : "Could not add the user." });
    }
  });
  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="space-y-3" aria-label="Add a user">
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      <Field label="Name" errors={errors.name?.message}>
        {(a) => <Input {...a} {...form.register("name")} />}
      </Field>
      <Field label="Email" errors={errors.email?.message}>
        {(a) => <Input {...a} type="email" autoComplete="off" {...form.register("email")} />}
      </Field>
      <Field label="Role" errors={errors.role?.message} hint={ROLE_SUMMARIES[role] ?? ""}>
        {(a) => (
          <Select {...a} {...form.register("role")}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <Field label="Initial password" errors={errors.password?.message} hint="At least 12 characters. Share it privately.">
        {(a) => <Input {...a} type="password" autoComplete="new-password" {...form.register("password")} />}
      </Field>
      <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Adding…">
        Add user
      </Button>
    </form>
  );
}
