/**
 * Numbers as people type them and loggers write them: `2.5` and `2,5` both mean two and a half where
 * that is unambiguous; `1,234` (one separator followed by exactly three digits) could be a grouped
 * thousand or a decimal, so it is refused with a message unless the reader's own decimal mark says which.
 * Grouped thousands (`1,234,567`, `1.234,5`) are refused: a number field takes one decimal mark only.
 * Pure: used by the number-entry component and by file uploads (one decimal mark detected per column).
 */
export type DecimalMark = "." | ",";

export type ParsedNumber = { ok: true; value: number } | { ok: false; empty: boolean; message: string };

const PLAIN = /^[-+]?(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][-+]?\d+)?$/;

/** The decimal mark of a BCP 47 locale (e.g. "de-DE" → ","); "." when the locale is unknown. */
export function decimalMarkOf(locale: string | undefined): DecimalMark {
  try {
    const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === "decimal");
    return part?.value === "," ? "," : ".";
  } catch {
    return ".";
  }
}

/**
 * Reads one typed number. `decimal` is the reader's own decimal mark: a lone separator followed by three
 * digits is read with it when it matches, and refused as ambiguous otherwise.
 */
export function parseNumber(text: string, decimal: DecimalMark = "."): ParsedNumber {
  const t = text.trim().replace(/\u2212/g, "-"); // a typographic minus pasted from a document
  if (t === "") return { ok: false, empty: true, message: "is empty" };
  const grouped = /^[-+]?\d{1,3}([.,\s\u00a0\u202f'])\d{3}(\1\d{3})+([.,]\d*)?$/.test(t) || (t.includes(".") && t.includes(","));
  if (grouped) return { ok: false, empty: false, message: `"${t}" has thousands separators; type it with one decimal mark and no grouping` };
  if (!PLAIN.test(t)) return { ok: false, empty: false, message: `"${t}" is not a number` };
  const mark = t.includes(",") ? "," : t.includes(".") ? "." : null;
  if (mark && mark !== decimal && /^[-+]?[1-9]\d{0,2}[.,]\d{3}(?:$|[eE])/.test(t))
    return {
      ok: false,
      empty: false,
      message: `"${t}" could be read two ways; type ${t.replace(mark, ".")} or ${t.replace(mark, "")} without a thousands separator`,
    };
  const value = Number(t.replace(",", "."));
  return Number.isFinite(value) ? { ok: true, value } : { ok: false, empty: false, message: `"${t}" is out of range` };
}

/**
 * The decimal mark a column of a file uses, decided once: "," when some cell has a comma that can only be
 * a decimal comma (not followed by exactly three digits) and no cell uses a dot; "." otherwise.
 */
export function detectDecimalMark(cells: Iterable<string>): DecimalMark {
  let comma = false;
  for (const raw of cells) {
    const c = raw.trim();
    if (c.includes(".")) return ".";
    if (/^[-+]?\d*,\d+(?:[eE][-+]?\d+)?$/.test(c) && !/^[-+]?[1-9]\d{0,2},\d{3}(?:$|[eE])/.test(c)) comma = true;
  }
  return comma ? "," : ".";
}
