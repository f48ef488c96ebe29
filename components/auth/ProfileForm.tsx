"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { profileSchema } from "@/lib/auth/schemas";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { ClientForm } from "@/components/ui/ClientForm";
import { Field, Input } from "@/components/ui/Field";
import { validate, type FieldErrors } from "@/components/ui/form-errors";
import { submitJson } from "@/lib/client/fetch";
import { cx } from "@/components/ui/cx";

export function ProfileForm({ name, units }: { name: string; units: "si" | "us" }) {
  const router = useRouter();
  const [values, setValues] = useState({ name, units });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setMessage(null);
    const checked = validate(profileSchema, values);
    if (checked.errors) return setErrors(checked.errors);
    setErrors({});
    setBusy(true);
    const res = await submitJson("/api/me", "PATCH", checked.data);
    setBusy(false);
    if (!res.ok) {
      setErrors(res.errors);
      return setMessage({ tone: "error", text: res.error ?? "Not saved." });
    }
    setMessage({ tone: "success", text: "Saved." });
    router.refresh();
  }

  return (
    <ClientForm onSubmit={submit} testId="profile-form">
      <Field label="Name" name="name" error={errors.name}>
        <Input id="name" name="name" value={values.name} invalid={!!errors.name} onChange={(e) => setValues({ ...values, name: e.target.value })} />
      </Field>
      <fieldset>
        <legend className="mb-1.5 text-[13px] font-semibold text-ink-800">Display units</legend>
        <div className="grid max-w-sm grid-cols-2 gap-2">
          {(
            [
              ["si", "SI", "kN, m, kg, kW"],
              ["us", "US customary", "lbf, ft, lb, hp"],
            ] as const
          ).map(([value, label, example]) => (
            <label
              key={value}
              className={cx(
                "cursor-pointer rounded-md border px-3 py-2",
                values.units === value ? "border-lamp-500 bg-lamp-300/15" : "border-steel-300 bg-white",
              )}
            >
              <input
                type="radio"
                name="units"
                value={value}
                checked={values.units === value}
                onChange={() => setValues({ ...values, units: value })}
                className="sr-only"
              />
              <span className="block text-[13.5px] font-semibold">{label}</span>
              <span className="block font-mono text-[11.5px] text-steel-500">{example}</span>
            </label>
          ))}
        </div>
        <p className="mt-1.5 text-[12.5px] text-steel-500">Tautline computes in SI; this only changes what you see and type.</p>
      </fieldset>
      {message && (
        <Alert tone={message.tone} testId={message.tone === "success" ? "form-success" : "form-error"}>
          {message.text}
        </Alert>
      )}
      <Button type="submit" busy={busy}>
        Save profile
      </Button>
    </ClientForm>
  );
}
