/**
 * The logbook forms' typed numbers, read by the shared parser (lib/units/parse-number) as every number field
 * is: `2,5` is 2.5, an ambiguous `1,234` or grouped thousands are refused with a message that names the field
 * and its unit, so nothing is sent.
 */
import { parseNumber } from "@/lib/units/parse-number";
import { readerMark } from "@/components/ui/NumberInput";

export interface TypedField {
  key: string;
  label: string;
  /** The unit the field is typed in, named in its message ("mm", "%", "days"). */
  unit: string;
  /** Empty is a problem here (otherwise an empty field is left out and the server decides). */
  required?: boolean;
}

/** The fields' values (undefined when empty) and a message per field that cannot be read. */
export function readTyped(text: Record<string, string | undefined>, fields: readonly TypedField[]): { values: Record<string, number | undefined>; issues: Record<string, string> } {
  const values: Record<string, number | undefined> = {};
  const issues: Record<string, string> = {};
  const mark = readerMark();
  for (const f of fields) {
    const r = parseNumber(text[f.key] ?? "", mark);
    if (r.ok) values[f.key] = r.value;
    else if (!r.empty) issues[f.key] = `${f.label}: ${r.message} (${f.unit})`;
    else if (f.required) issues[f.key] = `${f.label} must be a number in ${f.unit}`;
  }
  return { values, issues };
}
