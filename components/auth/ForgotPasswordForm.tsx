"use client";

import { useState, type FormEvent } from "react";
import { forgotPasswordSchema } from "@/lib/auth/schemas";
import { Alert, FormError } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { submitJson } from "@/lib/client/fetch";

export function ForgotPasswordForm() {
  const [email, setEmail] = useState("");
  const [errors, setErrors] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    const checked = validate(forgotPasswordSchema, { email });
    if (checked.errors) return setErrors(checked.errors);
    setErrors({});
    setBusy(true);
    const res = await submitJson<{ message: string }>("/api/account/forgot-password", "POST", checked.data);
    setBusy(false);
    if (!res.ok) {
      setErrors(res.errors);
      return setError(res.error);
    }
    setDone(res.data?.message ?? "Check your e-mail.");
  }

  if (done) {
    return (
      <Alert tone="success" testId="forgot-sent" title="Check your e-mail">
        {done}
      </Alert>
    );
  }
  return (
    <ClientForm onSubmit={submit} testId="forgot-form">
      <Field label="E-mail" name="email" error={errors.email}>
        <Input id="email" type="email" autoComplete="username" autoFocus value={email} invalid={!!errors.email} onChange={(e) => setEmail(e.target.value)} />
      </Field>
      <FormError error={error} />
      <Button type="submit" busy={busy} className="w-full">
        Send reset link
      </Button>
    </ClientForm>
  );
}
