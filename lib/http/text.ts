import { z } from "zod";

// One-line names are shown in tables, logs, files and PDFs: every control character (NUL, ESC, line
// breaks, C1) is refused. Free text keeps tab and line breaks but refuses the rest.
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f]/;
const CONTROL_EXCEPT_LAYOUT = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
// A high surrogate not followed by a low one, or a low one not preceded by a high one.
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

export const hasControlCharacters = (v: string) => CONTROL_CHARACTERS.test(v);

/** A one-line text field (names, titles, captions, site): no control characters. */
export const oneLineText = (field: string, max: number) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .max(max, { error: `${field} must be at most ${max} characters` })
    .refine((v) => !CONTROL_CHARACTERS.test(v), { error: `${field} must not contain control characters (line breaks, tabs, NUL, ESC)` });

/** A required one-line name. */
export const nameField = (field = "name", max = 120) =>
  oneLineText(field, max).refine((v) => v.length > 0, { error: `${field} must not be empty` });

/** Optional one-line text (e.g. a site); empty text is stored as null. */
export const optionalLine = (field: string, max: number) =>
  oneLineText(field, max)
    .nullish()
    .transform((v) => (v ? v : null));

/** Optional free text (notes): line breaks and tabs allowed, other control characters not; empty is null. */
export const optionalText = (field: string, max: number) =>
  z
    .string({ error: `${field} must be text` })
    .trim()
    .max(max, { error: `${field} must be at most ${max} characters` })
    .refine((v) => !CONTROL_EXCEPT_LAYOUT.test(v), { error: `${field} must not contain control characters (NUL, ESC and the like)` })
    .nullish()
    .transform((v) => (v ? v : null));

/**
 * Field paths of every string in a parsed JSON value (keys included) that is not valid Unicode (a lone
 * UTF-16 surrogate, which the database cannot store) or carries a control character other than tab and
 * line breaks. Checked once where bodies and query strings are read, so no field can reach the database
 * with them.
 */
export function brokenTextIssues(value: unknown, path = ""): { path: string; message: string }[] {
  // Walked with an explicit stack (a body may nest thousands of levels deep) and paths built only for the
  // strings that fail, so neither the call stack nor the path strings grow with the nesting.
  type Node = { value: unknown; key: string; parent: Node | null };
  const pathOf = (n: Node | null): string => {
    const keys: string[] = [];
    for (let m = n; m; m = m.parent) if (m.key !== "") keys.push(m.key);
    return keys.reverse().join(".") || "(body)";
  };
  const message = (s: string) =>
    LONE_SURROGATE.test(s)
      ? "is not valid Unicode text (a lone UTF-16 surrogate)"
      : CONTROL_EXCEPT_LAYOUT.test(s)
        ? "must not contain control characters (NUL, ESC and the like)"
        : null;
  const out: { path: string; message: string }[] = [];
  const stack: Node[] = [{ value, key: path, parent: null }];
  while (stack.length && out.length < 100) {
    const n = stack.pop()!;
    const v = n.value;
    if (typeof v === "string") {
      const m = message(v);
      if (m) out.push({ path: pathOf(n), message: m });
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], key: String(i), parent: n });
    } else if (v && typeof v === "object") {
      const entries = Object.entries(v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [k, child] = entries[i]!;
        const node: Node = { value: child, key: k, parent: n };
        const m = message(k);
        if (m) out.push({ path: pathOf(node), message: m });
        stack.push(node);
      }
    }
  }
  return out;
}

/**
 * `text` cut to at most `max` UTF-16 units (the length zod and the database count) without splitting a
 * character or an emoji sequence, with "…" when something was cut.
 */
export function clipText(text: string, max: number): string {
  if (text.length <= max) return text;
  let out = "";
  for (const { segment } of new Intl.Segmenter(undefined, { granularity: "grapheme" }).segment(text)) {
    if (out.length + segment.length > max - 1) break;
    out += segment;
  }
  return `${out}…`;
}
