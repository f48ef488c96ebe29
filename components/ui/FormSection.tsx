"use client";
/** A titled group of form fields, and the check box that sits in its grid. */
import { fieldId } from "./NumberInput";

export function CheckField({
  path,
  label,
  value,
  onChange,
  disabled,
  hint,
}: {
  path: string;
  label: string;
  value: unknown;
  onChange: (v: boolean) => void;
  disabled?: boolean;
  hint?: string;
}) {
  const id = fieldId(path);
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="flex h-9 items-center gap-2 pt-5 text-[13px] font-semibold text-ink-800">
        <input id={id} name={path} type="checkbox" className="size-4 accent-lamp-600" checked={value === true} disabled={disabled} onChange={(e) => onChange(e.target.checked)} />
        {label}
      </label>
      {hint && <p className="mt-1 text-[11.5px] leading-snug text-steel-500">{hint}</p>}
    </div>
  );
}

export function Section({ title, children, description }: { title: string; description?: string; children: React.ReactNode }) {
  return (
    <fieldset className="rounded-lg border border-steel-300/70 bg-white">
      <legend className="sr-only">{title}</legend>
      <div className="border-b border-steel-100 px-4 py-2.5">
        <h3 className="text-[13.5px] font-bold text-ink-900">{title}</h3>
        {description && <p className="text-[12px] text-steel-500">{description}</p>}
      </div>
      <div className="grid grid-cols-2 gap-x-4 gap-y-3 px-4 py-3.5 sm:grid-cols-3">{children}</div>
    </fieldset>
  );
}
