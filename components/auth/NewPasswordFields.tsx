/** A new password and its repetition, as the change, reset and invitation forms ask for them. */
import type { ChangeEvent } from "react";
import { PASSWORD_MIN } from "@/lib/auth/schemas";
import { Field, Input } from "@/components/ui/Field";
import type { FieldErrors } from "@/components/ui/form-errors";

export function NewPasswordFields({
  name,
  label,
  confirmLabel,
  password,
  confirm,
  errors,
  onPassword,
  onConfirm,
  autoFocus,
}: {
  /** The field of the new password (its error comes under this name; the repetition's under "confirm"). */
  name: string;
  label: string;
  confirmLabel: string;
  password: string;
  confirm: string;
  errors: FieldErrors;
  onPassword: (e: ChangeEvent<HTMLInputElement>) => void;
  onConfirm: (e: ChangeEvent<HTMLInputElement>) => void;
  autoFocus?: boolean;
}) {
  return (
    <>
      <Field label={label} name={name} error={errors[name]} hint={`At least ${PASSWORD_MIN} characters.`}>
        <Input id={name} type="password" autoComplete="new-password" autoFocus={autoFocus} value={password} invalid={!!errors[name]} onChange={onPassword} />
      </Field>
      <Field label={confirmLabel} name="confirm" error={errors.confirm}>
        <Input id="confirm" type="password" autoComplete="new-password" value={confirm} invalid={!!errors.confirm} onChange={onConfirm} />
      </Field>
    </>
  );
}
