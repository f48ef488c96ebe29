"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { acceptInviteSchema, resetPasswordSchema } from "@/lib/auth/schemas";
import { FormError } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { submitJson } from "@/lib/client/fetch";
import { NewPasswordFields } from "./NewPasswordFields";

/**
 * Chooses a password from a one-time link: the invitation form (with a name) or the reset form.
 * On success it goes to the sign-in page with the e-mail filled in.
 */
export function NewPasswordForm({ mode, token, email, name = "" }: { mode: "invite" | "reset"; token: string; email: string; name?: string }) {
  const router = useRouter();
  const [values, setValues] = useState({ name, password: "", confirm: "" });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    const body = mode === "invite" ? { token, name: values.name, password: values.password } : { token, password: values.password };
    const checked = mode === "invite" ? validate(acceptInviteSchema, body) : validate(resetPasswordSchema, body);
    const errs: FieldErrors = { ...(checked.errors ?? {}) };
    if (!errs.password && values.confirm !== values.password) errs.confirm = "The two passwords differ.";
    if (Object.keys(errs).length || !checked.data) {
      setErrors(errs);
      if (errs.token) setError(errs.token);
      return;
    }
    setErrors({});
    setBusy(true);
    const url = mode === "invite" ? "/api/account/accept-invite" : "/api/account/reset-password";
    const res = await submitJson(url, "POST", checked.data);
    if (!res.ok) {
      setBusy(false);
      setErrors(res.errors);
      return setError(res.errors.token ?? res.error);
    }
    const flag = mode === "invite" ? "accepted" : "reset";
    router.push(`/sign-in?${flag}=1&email=${encodeURIComponent(email)}`);
  }

  const set = (k: keyof typeof values) => (e: React.ChangeEvent<HTMLInputElement>) => setValues({ ...values, [k]: e.target.value });

  return (
    <ClientForm onSubmit={submit} testId={mode === "invite" ? "accept-form" : "reset-form"}>
      <Field label="E-mail" name="email-shown">
        <Input id="email-shown" value={email} readOnly disabled />
      </Field>
      {mode === "invite" && (
        <Field label="Your name" name="name" error={errors.name}>
          <Input id="name" autoComplete="name" value={values.name} invalid={!!errors.name} onChange={set("name")} />
        </Field>
      )}
      <NewPasswordFields
        name="password"
        label={mode === "invite" ? "Choose a password" : "New password"}
        confirmLabel="Password again"
        password={values.password}
        confirm={values.confirm}
        errors={errors}
        onPassword={set("password")}
        onConfirm={set("confirm")}
        autoFocus
      />
      <FormError error={error} />
      <Button type="submit" busy={busy} className="w-full">
        {mode === "invite" ? "Create my account" : "Set new password"}
      </Button>
    </ClientForm>
  );
}
