"use client";
/**
 * The train's ARD pawl positions: a list of lengths behind the train's front in the user's units,
 * separated by commas. Empty means the format's default, one pawl at the dog.
 */
import { useState } from "react";
import { cx } from "@/components/ui/cx";
import { editText, fromDisplay, parseTyped, unitOf, type UnitSystem } from "@/lib/client/units";

const LABEL = "ARD pawls behind the front";

export function PawlsField({
  value,
  units,
  onChange,
  error,
  disabled,
}: {
  value: number[] | null | undefined;
  units: UnitSystem;
  onChange: (si: number[] | null) => void;
  error?: string;
  disabled?: boolean;
}) {
  const unit = unitOf("length", units).label;
  const [text, setText] = useState(() => (value ?? []).map((v) => editText(v, "length", units)).join(", "));
  return (
    <div className="min-w-0 sm:col-span-2">
      <label htmlFor="f-pawls" className="mb-1 block text-[12.5px] font-semibold text-ink-800">
        {LABEL}
      </label>
      <div className={cx("flex h-9 items-stretch overflow-hidden rounded-md border bg-white", error ? "border-fail" : "border-steel-300", disabled && "bg-steel-100")}>
        <input
          id="f-pawls"
          name="pawls"
          autoComplete="off"
          disabled={disabled}
          aria-invalid={error ? true : undefined}
          className="min-w-0 flex-1 bg-transparent px-2.5 font-mono text-[13.5px] text-ink-900 focus:outline-none"
          placeholder="one pawl at the dog"
          value={text}
          onChange={(e) => {
            const t = e.target.value;
            setText(t);
            const parts = t.split(/[,;\s]+/).filter((p) => p !== "");
            // A part that is not a number stays NaN, so the shared schema names it.
            onChange(parts.length ? parts.map((p) => { const n = parseTyped(p); return n === undefined ? Number.NaN : fromDisplay(n, "length", units); }) : null);
          }}
        />
        <span className="flex min-w-10 items-center justify-center border-l border-steel-100 bg-steel-100/60 px-2 font-mono text-[11.5px] text-steel-500" data-testid="unit-pawls">
          {unit}
        </span>
      </div>
      {error ? (
        <p data-testid="error-pawls" className="mt-1 text-[12px] font-medium leading-snug text-fail">{LABEL} ({unit}): {error}</p>
      ) : (
        <p className="mt-1 text-[11.5px] leading-snug text-steel-500">
          Where the train&apos;s anti-rollback pawls sit, measured back from its front, separated by commas. Empty: one pawl at the dog (the format&apos;s default).
        </p>
      )}
    </div>
  );
}
