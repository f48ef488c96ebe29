/** Field-by-field differences of two JSON-like values (used by revisions and the audit trail). */

/** One changed field between two versions of something, by dotted path. */
export interface FieldChange {
  path: string;
  before: unknown;
  after: unknown;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === "object" && v !== null && !Array.isArray(v) && !(v instanceof Date);

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * Field-by-field differences of two JSON-like values. Objects are walked; anything else (numbers, text,
 * arrays) is compared whole. A field missing on one side shows as undefined → value (or the reverse).
 */
export function diffValues(before: unknown, after: unknown, prefix = ""): FieldChange[] {
  if (isPlainObject(before) && isPlainObject(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
    return keys.flatMap((k) => diffValues(before[k], after[k], prefix ? `${prefix}.${k}` : k));
  }
  if (before === undefined && after === undefined) return [];
  if (same(before, after)) return [];
  return [{ path: prefix || "(value)", before: before ?? null, after: after ?? null }];
}
