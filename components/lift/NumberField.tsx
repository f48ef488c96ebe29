"use client";
/**
 * A number field in the user's unit system with the unit beside it. Shows what was typed; reports the
 * SI value (undefined when empty, NaN when it is not a number) so the shared zod schema gives the message.
 */
import { useState } from "react";
import { cx } from "@/components/ui/cx";
import { editText, fromDisplay, parseTyped, unitOf, type UnitSystem } from "@/lib/client/units";
import type { FieldDef } from "./form-model";

export function fieldId(path: string): string {
  return `f-${path.replace(/\./g, "-")}`;
}

export function NumberField({
  def,
  units,
  value,
  onChange,
  error,
  disabled,
}: {
  def: FieldDef;
  units: UnitSystem;
  value: unknown;
  onChange: (si: number | undefined) => void;
  error?: string;
  disabled?: boolean;
}) {
  const unit = unitOf(def.q, units);
  const shown = typeof value === "number" ? editText(value, def.q, units) : "";
  const [text, setText] = useState(shown);
  const [lastShown, setLastShown] = useState(shown);
  // The value changed from outside (reset, catalogue pick, unit switch): show it.
  if (shown !== lastShown) {
    setLastShown(shown);
    const typed = parseTyped(text);
    if (typed === undefined || editText(fromDisplay(typed, def.q, units), def.q, units) !== shown) setText(shown);
  }
  const id = fieldId(def.path);
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="mb-1 block truncate text-[12.5px] font-semibold text-ink-800" title={def.label}>
        {def.label}
      </label>
      <div className={cx("flex h-9 items-stretch overflow-hidden rounded-md border bg-white", error ? "border-fail" : "border-steel-300", disabled && "bg-steel-100")}>
        <input
          id={id}
          name={def.path}
          inputMode="decimal"
          autoComplete="off"
          disabled={disabled}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className="min-w-0 flex-1 bg-transparent px-2.5 font-mono text-[13.5px] text-ink-900 tabular-nums focus:outline-none disabled:text-steel-500"
          value={text}
          placeholder={def.optional ? "optional" : ""}
          onChange={(e) => {
            const t = e.target.value;
            setText(t);
            const n = parseTyped(t);
            const si = t.trim() === "" ? undefined : n === undefined ? Number.NaN : fromDisplay(n, def.q, units);
            setLastShown(si === undefined || Number.isNaN(si) ? "" : editText(si, def.q, units));
            onChange(si);
          }}
        />
        {unit.label && (
          <span className="flex min-w-10 items-center justify-center border-l border-steel-100 bg-steel-100/60 px-2 font-mono text-[11.5px] text-steel-500" data-testid={`unit-${def.path}`}>
            {unit.label}
          </span>
        )}
      </div>
      {error ? (
        <p id={`${id}-error`} data-testid={`error-${def.path}`} className="mt-1 flex items-start gap-1.5 text-[12px] font-medium leading-snug text-fail">
          <span aria-hidden className="mt-[3px] inline-block size-2 shrink-0 rotate-45 bg-fail" />
          {error}
        </p>
      ) : def.hint ? (
        <p className="mt-1 text-[11.5px] leading-snug text-steel-500">{def.hint}</p>
      ) : null}
    </div>
  );
}

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
