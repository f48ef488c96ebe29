"use client";

import { signOut } from "next-auth/react";
import { useState, type FormEvent } from "react";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { FormError } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { submitJson } from "@/lib/client/fetch";
import { NewPasswordFields } from "./NewPasswordFields";

export function ChangePasswordForm() {
  const [values, setValues] = useState({ currentPassword: "", newPassword: "", confirm: "" });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    const checked = validate(changePasswordSchema, values);
    const errs: FieldErrors = { ...(checked.errors ?? {}) };
    if (!errs.newPassword && values.confirm !== values.newPassword) errs.confirm = "The two new passwords differ.";
    if (Object.keys(errs).length || !checked.data) return setErrors(errs);
    setErrors({});
    setBusy(true);
    const res = await submitJson("/api/me/password", "POST", checked.data);
    if (!res.ok) {
      setBusy(false);
      setErrors(res.errors);
      return setError(res.error);
    }
    // Every session of this account ended with the change; sign in again with the new password.
    await signOut({ callbackUrl: "/sign-in?passwordChanged=1" });
  }

  const set = (k: keyof typeof values) => (e: React.ChangeEvent<HTMLInputElement>) => setValues({ ...values, [k]: e.target.value });

  return (
    <ClientForm onSubmit={submit} testId="password-form">
      <Field label="Current password" name="currentPassword" error={errors.currentPassword}>
        <Input id="currentPassword" type="password" autoComplete="current-password" value={values.currentPassword} invalid={!!errors.currentPassword} onChange={set("currentPassword")} />
      </Field>
      <NewPasswordFields name="newPassword" label="New password" confirmLabel="New password again" password={values.newPassword} confirm={values.confirm} errors={errors} onPassword={set("newPassword")} onConfirm={set("confirm")} />
      <FormError error={error} />
      <p className="text-[12.5px] text-steel-500">Changing the password signs you out everywhere, this browser included.</p>
      <Button type="submit" busy={busy}>
        Change password
      </Button>
    </ClientForm>
  );
}
