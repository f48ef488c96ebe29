"use client";
/**
 * The one number-entry field: the value in the reader's unit system with the unit beside it. Accepts
 * `2,5` and `2.5`, refuses ambiguous `1,234` with a message, shows a converted value to the quantity's
 * significant figures and keeps the SI value exactly until the user types. Reports the SI value
 * (undefined when empty, NaN when the text is not a number) so the shared zod schema gives the message.
 */
import { useState } from "react";
import { cx } from "./cx";
import { editText, fromDisplay, unitOf, type Quantity, type UnitSystem } from "@/lib/client/units";
import { decimalMarkOf, parseNumber } from "@/lib/units/parse-number";

export interface NumberFieldDef {
  /** Dotted path in the form's data, as the server's schema names it. */
  path: string;
  label: string;
  q: Quantity;
  hint?: string;
  /** May be left empty (absent in the data). */
  optional?: boolean;
  /** Whole numbers only (teeth, cars, seats). */
  int?: boolean;
}

export function fieldId(path: string): string {
  return `f-${path.replace(/\./g, "-")}`;
}

/** The reader's decimal mark, from the browser's language ("." where it cannot tell). */
export const readerMark = () => decimalMarkOf(typeof navigator === "undefined" ? undefined : navigator.language);

export function NumberInput({
  def,
  units,
  value,
  onChange,
  error,
  disabled,
  id: idProp,
}: {
  /** The input's id when the page names it itself (default: from the path). */
  id?: string;
  def: NumberFieldDef;
  units: UnitSystem;
  value: unknown;
  onChange: (si: number | undefined) => void;
  error?: string;
  disabled?: boolean;
}) {
  const unit = unitOf(def.q, units);
  const shown = typeof value === "number" && Number.isFinite(value) ? editText(value, def.q, units) : "";
  const [text, setText] = useState(shown);
  const [lastShown, setLastShown] = useState(shown);
  const [parseError, setParseError] = useState<string | null>(null);
  // The value changed from outside (reset, catalogue pick, unit switch): show it.
  if (shown !== lastShown) {
    setLastShown(shown);
    const typed = parseNumber(text, readerMark());
    if (!typed.ok || editText(fromDisplay(typed.value, def.q, units), def.q, units) !== shown) {
      setText(shown);
      setParseError(null);
    }
  }
  const id = idProp ?? fieldId(def.path);
  const message = parseError ?? error;
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="mb-1 block truncate text-[12.5px] font-semibold text-ink-800" title={def.label}>
        {def.label}
      </label>
      <div className={cx("flex h-9 items-stretch overflow-hidden rounded-md border bg-white", message ? "border-fail" : "border-steel-300", disabled && "bg-steel-100")}>
        <input
          id={id}
          name={def.path}
          inputMode="decimal"
          autoComplete="off"
          disabled={disabled}
          aria-invalid={message ? true : undefined}
          aria-describedby={message ? `${id}-error` : undefined}
          className="min-w-0 flex-1 bg-transparent px-2.5 font-mono text-[13.5px] text-ink-900 tabular-nums focus:outline-none disabled:text-steel-500"
          value={text}
          placeholder={def.optional ? "optional" : ""}
          onChange={(e) => {
            const t = e.target.value;
            setText(t);
            const r = parseNumber(t, readerMark());
            const si = r.ok ? fromDisplay(r.value, def.q, units) : r.empty ? undefined : Number.NaN;
            setParseError(r.ok || r.empty ? null : `${def.label}: ${r.message}${unit.label ? ` (${unit.label})` : ""}`);
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
      {message ? (
        <p id={`${id}-error`} data-testid={`error-${def.path}`} role="alert" className="mt-1 flex items-start gap-1.5 text-[12px] font-medium leading-snug text-fail">
          <span aria-hidden className="mt-[3px] inline-block size-2 shrink-0 rotate-45 bg-fail" />
          {message}
        </p>
      ) : def.hint ? (
        <p className="mt-1 text-[11.5px] leading-snug text-steel-500">{def.hint}</p>
      ) : null}
    </div>
  );
}
