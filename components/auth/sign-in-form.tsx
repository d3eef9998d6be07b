"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { signInSchema, type SignInInput } from "@/lib/validation/auth";
import { apiFetch, ApiClientError } from "@/components/ui/api-client";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { Alert } from "@/components/ui/alert";

export function SignInForm({ next }: { next: string }) {
  const [error, setError] = useState<string | null>(null);
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setError(null);
    try {
      await apiFetch("/api/auth/sign-in", { body: values });
      // Full navigation: the server layout reads the new cookie.
      window.location.assign(next);
    } catch (err) {
      if (err instanceof ApiClientError) {
        for (const [name, messages] of Object.entries(err.fields)) {
          if (name === "email" || name === "password") form.setError(name, { message: messages.join(" ") });
        }
        setError(err.message);
      } else {
        setError("Sign-in failed. Try again.");
      }
    }
  });

  return (
    <form onSubmit={(e) => void onSubmit(e)} noValidate className="space-y-4" aria-label="Sign in">
      {error && <Alert tone="error">{error}</Alert>}
      <Field label="Email" errors={errors.email?.message}>
        {(a) => <Input {...a} type="email" autoComplete="username" autoFocus {...form.register("email")} />}
      </Field>
      <Field label="Password" errors={errors.password?.message}>
        {(a) => <Input {...a} type="password" autoComplete="current-password" {...form.register("password")} />}
      </Field>
      <Button type="submit" className="w-full" busy={isSubmitting} busyLabel="Signing in…">
        Sign in
      </Button>
    </form>
  );
}
