import { z } from "zod";

/**
 * The one reader of dates sent to the API: ISO 8601 text only (`2026-05-01`, `2026-05-01T08:00`,
 * `2026-05-01T08:00:00.000Z`, `…+02:00`), a real calendar day, years 1900–9999 (the database's DATETIME
 * ends at 9999). Numbers, booleans and loosely parsed text (`new Date("1; DROP TABLE x")` is a date in
 * 2001) are refused with words, never turned into 1970 or 2001.
 */
export const MIN_YEAR = 1900;
export const MAX_YEAR = 9999;

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})?)?$/;

/** The instant `text` names, or why it is not one. */
export function readIsoDate(text: string): { ok: true; date: Date } | { ok: false; message: string } {
  const m = ISO.exec(text);
  if (!m) return { ok: false, message: "must be a date in ISO 8601 form, e.g. 2026-05-01 or 2026-05-01T08:00" };
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const calendar = new Date(Date.UTC(2000, month - 1, day));
  if (month < 1 || month > 12 || calendar.getUTCMonth() !== month - 1 || calendar.getUTCDate() !== day) {
    return { ok: false, message: `has no such day (${m[1]}-${m[2]}-${m[3]})` };
  }
  if (m[4] !== undefined && (Number(m[4]) > 23 || Number(m[5]) > 59 || Number(m[6] ?? 0) > 59)) return { ok: false, message: "has no such time of day" };
  const date = new Date(m[4] === undefined ? `${m[1]}-${m[2]}-${m[3]}T00:00:00Z` : text.replace(" ", "T"));
  const y = date.getUTCFullYear();
  if (Number.isNaN(date.getTime()) || year < MIN_YEAR || year > MAX_YEAR || y < MIN_YEAR || y > MAX_YEAR) {
    return { ok: false, message: `must be between the years ${MIN_YEAR} and ${MAX_YEAR}` };
  }
  return { ok: true, date };
}

/** A zod field for an ISO 8601 date or date-time (body or query string), as a Date. */
export const isoDateField = (name: string) =>
  z
    .string({ error: `${name} must be a date as text in ISO 8601 form, e.g. 2026-05-01T08:00` })
    .trim()
    .transform((v, ctx) => {
      const r = readIsoDate(v);
      if (!r.ok) ctx.addIssue({ code: "custom", message: `${name} ${r.message}` });
      return r.ok ? r.date : new Date(0);
    });
