import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from "react";
import { cx } from "./cx";

const control =
  "block rounded-md border bg-white px-3 text-sm text-ink-900 shadow-inner shadow-ink-950/[0.02] " +
  "placeholder:text-steel-500 focus:outline-none focus:ring-2 focus:ring-lamp-500/50 focus:border-lamp-600 " +
  "disabled:bg-steel-100 disabled:text-steel-500";

export function Input({ invalid, className, ...rest }: InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }) {
  return (
    <input
      className={cx(control, "h-10 w-full", invalid ? "border-fail" : "border-steel-300", className)}
      aria-invalid={invalid || undefined}
      {...rest}
    />
  );
}

export function Select({
  invalid,
  className,
  children,
  ...rest
}: SelectHTMLAttributes<HTMLSelectElement> & { invalid?: boolean }) {
  return (
    <select
      className={cx(control, "h-10 pr-8", className?.includes("w-") ? "" : "w-full", invalid ? "border-fail" : "border-steel-300", className)}
      aria-invalid={invalid || undefined}
      {...rest}
    >
      {children}
    </select>
  );
}

type OptionsProps<T> = { items: readonly T[]; label: (item: T) => ReactNode } & (T extends { id: number }
  ? { value?: (item: T) => string | number }
  : { value: (item: T) => string | number });

/** The options of a select: one per row, valued by its id (or by `value(row)`), showing `label(row)`. */
export function Options<T>({ items, label, value = (it) => (it as { id: number }).id }: OptionsProps<T>) {
  return (
    <>
      {items.map((it) => (
        <option key={value(it)} value={value(it)}>
          {label(it)}
        </option>
      ))}
    </>
  );
}

/**
 * A labelled form control with its hint and error text. The error carries a test id derived from the
 * field name (`error-email`) so tests and screen readers find it without guessing.
 */
export function Field({
  label,
  name,
  hint,
  error,
  children,
  className,
}: {
  label: string;
  name: string;
  hint?: ReactNode;
  error?: string;
  children: ReactNode;
  className?: string;
}) {
  return (
    <div className={cx("space-y-1.5", className)}>
      <label htmlFor={name} className="block text-[13px] font-semibold text-ink-800">
        {label}
      </label>
      {children}
      {error ? (
        <p id={`${name}-error`} data-testid={`error-${name}`} className="flex items-start gap-1.5 text-[13px] font-medium text-fail">
          <span aria-hidden className="mt-[3px] inline-block size-2 shrink-0 rotate-45 bg-fail" />
          {error}
        </p>
      ) : hint ? (
        <p className="text-[12.5px] text-steel-500">{hint}</p>
      ) : null}
    </div>
  );
}
