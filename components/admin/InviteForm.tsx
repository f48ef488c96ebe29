"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import { inviteUserSchema } from "@/lib/auth/schemas";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input, Select } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { submitJson } from "@/lib/client/fetch";
import { useSubmitOnce } from "@/components/ui/useSubmitOnce";

const EMPTY = { email: "", name: "", role: "viewer" as Role };

export function InviteForm({ showMailbox }: { showMailbox: boolean }) {
  const router = useRouter();
  const [values, setValues] = useState(EMPTY);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [result, setResult] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [busy, once] = useSubmitOnce();

  function submit(e: FormEvent) {
    e.preventDefault();
    void once(async () => {
      setResult(null);
      const checked = validate(inviteUserSchema, values);
      if (checked.errors) return setErrors(checked.errors);
      setErrors({});
      const res = await submitJson<{ user: { email: string } }>("/api/admin/users", "POST", checked.data);
      if (!res.ok) {
        setErrors(res.errors);
        return setResult({ tone: "error", text: res.error ?? "The invitation was not sent." });
      }
      setResult({ tone: "success", text: `Invitation sent to ${res.data?.user.email}. The link works once, within 72 hours.` });
      setValues(EMPTY);
      router.refresh();
    });
  }

  return (
    <ClientForm onSubmit={submit} testId="invite-form">
      <div className="grid items-start gap-4 md:grid-cols-[minmax(0,1.2fr)_minmax(0,1fr)_220px_auto]">
        <Field label="E-mail" name="email" error={errors.email}>
          <Input id="email" type="email" autoComplete="off" value={values.email} invalid={!!errors.email} onChange={(e) => setValues({ ...values, email: e.target.value })} />
        </Field>
        <Field label="Name" name="name" error={errors.name}>
          <Input id="name" value={values.name} invalid={!!errors.name} onChange={(e) => setValues({ ...values, name: e.target.value })} />
        </Field>
        <Field label="Role" name="role" error={errors.role}>
          <Select id="role" value={values.role} invalid={!!errors.role} onChange={(e) => setValues({ ...values, role: e.target.value as Role })}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        </Field>
        <Button type="submit" busy={busy} className="md:mt-[26px]">
          Send invitation
        </Button>
      </div>
      {result && (
        <Alert tone={result.tone} testId={result.tone === "success" ? "invite-sent" : "form-error"}>
          {result.text}{" "}
          {result.tone === "success" && showMailbox && (
            <Link href="/admin/mail" className="font-semibold underline">
              Open the development mailbox
            </Link>
          )}
        </Alert>
      )}
    </ClientForm>
  );
}
