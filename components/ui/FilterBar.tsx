/**
 * The filter bar above a list (audit trail, report queue): compact labelled selects and inputs in a row, with
 * the count of what matched at the right.
 */
import type { InputHTMLAttributes, ReactNode } from "react";
import { Options } from "./Field";

const control = "h-8 rounded border border-steel-300 px-2";

export function FilterBar({ children, total, totalTestId }: { children: ReactNode; total: ReactNode; totalTestId?: string }) {
  return (
    <div className="flex flex-wrap items-end gap-3 border-b border-steel-100 px-4 py-3 text-[13px]">
      {children}
      <span className="ml-auto text-steel-500" data-testid={totalTestId}>
        {total}
      </span>
    </div>
  );
}

function FilterLabel({ label, children }: { label: string; children: ReactNode }) {
  return (
    <label className="flex flex-col gap-1">
      <span className="font-semibold text-steel-600">{label}</span>
      {children}
    </label>
  );
}

/** A labelled select of the filter bar; `options` in the order shown (the "every …" choice first, value ""). */
export function FilterSelect({
  label,
  value,
  onChange,
  options,
  testId,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  options: readonly { value: string | number; label: string }[];
  testId?: string;
}) {
  return (
    <FilterLabel label={label}>
      <select className={control} value={value} onChange={(e) => onChange(e.target.value)} data-testid={testId}>
        <Options items={options} value={(o) => o.value} label={(o) => o.label} />
      </select>
    </FilterLabel>
  );
}

/** A labelled text or date input of the filter bar. */
export function FilterInput({
  label,
  value,
  onChange,
  testId,
  type,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  testId?: string;
  type?: InputHTMLAttributes<HTMLInputElement>["type"];
}) {
  return (
    <FilterLabel label={label}>
      <input type={type} className={control} value={value} onChange={(e) => onChange(e.target.value)} data-testid={testId} />
    </FilterLabel>
  );
}

/** "12 reports" / "1 report" once the list has loaded, "Loading…" before. */
export function countText(total: number | undefined, one: string, many: string): string {
  return total === undefined ? "Loading…" : `${total} ${total === 1 ? one : many}`;
}
