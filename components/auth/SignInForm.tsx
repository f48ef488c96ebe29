"use client";

import Link from "next/link";
import { signIn } from "next-auth/react";
import { useState, type FormEvent } from "react";
import { signInSchema } from "@/lib/auth/schemas";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { signInErrorText } from "./messages";
import { safeCallbackPath } from "@/lib/security/redirect";

export function SignInForm({ callbackUrl, initialError, initialEmail }: { callbackUrl?: string; initialError?: string | null; initialEmail?: string }) {
  const [values, setValues] = useState({ email: initialEmail ?? "", password: "" });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(signInErrorText(initialError));
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    const checked = validate(signInSchema, values);
    if (checked.errors) return setErrors(checked.errors);
    setErrors({});
    setBusy(true);
    // Only paths on this site: a callbackUrl pointing elsewhere is ignored.
    const target = safeCallbackPath(callbackUrl);
    const res = await signIn("credentials", { redirect: false, email: checked.data.email, password: checked.data.password, callbackUrl: target });
    if (res?.ok && !res.error) {
      // A full navigation so the server renders the workspace with the new session cookie.
      window.location.assign(target);
      return;
    }
    setBusy(false);
    setError(signInErrorText(res?.status === 429 ? "RateLimited" : (res?.error ?? "Default")));
  }

  return (
    <ClientForm onSubmit={submit} testId="sign-in-form">
      <Field label="E-mail" name="email" error={errors.email}>
        <Input
          id="email"
          name="email"
          type="email"
          autoComplete="username"
          autoFocus
          value={values.email}
          invalid={!!errors.email}
          aria-describedby={errors.email ? "email-error" : undefined}
          onChange={(e) => setValues({ ...values, email: e.target.value })}
        />
      </Field>
      <Field label="Password" name="password" error={errors.password}>
        <Input
          id="password"
          name="password"
          type="password"
          autoComplete="current-password"
          value={values.password}
          invalid={!!errors.password}
          aria-describedby={errors.password ? "password-error" : undefined}
          onChange={(e) => setValues({ ...values, password: e.target.value })}
        />
      </Field>
      {error && (
        <Alert tone="error" testId="sign-in-error">
          {error}
        </Alert>
      )}
      <Button type="submit" busy={busy} className="w-full">
        Sign in
      </Button>
      <p className="text-center text-[13px]">
        <Link href="/forgot-password" className="text-ink-800 underline decoration-steel-300 underline-offset-2 hover:decoration-lamp-500">
          Forgot your password?
        </Link>
      </p>
    </ClientForm>
  );
}
