/**
 * Dates and times as the screens show them: one place that holds the display locale and the styles, so
 * every page formats alike. UTC styles are for audit-like lists where the server's clock matters.
 */
const LOCALE = "en-GB";

const STYLES = {
  /** 3 Dec 2026 */
  day: { dateStyle: "medium" },
  /** 3 Dec */
  dayMonth: { day: "numeric", month: "short" },
  /** 3 Dec 2026, 14:52 */
  dayTime: { dateStyle: "medium", timeStyle: "short" },
  /** 03/12/2026, 14:52 */
  shortDayTime: { dateStyle: "short", timeStyle: "short" },
  /** 2026-12-03 14:52 UTC */
  utcDayTime: { year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone: "UTC" },
  /** 14:52 UTC */
  utcTime: { hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone: "UTC" },
} as const satisfies Record<string, Intl.DateTimeFormatOptions>;

export type DateStyle = keyof typeof STYLES;

const formatters = new Map<DateStyle, Intl.DateTimeFormat>();

/** A date (ISO text, Date or epoch ms) in one of the app's styles; "—" (or `empty`) when there is none. */
export function formatDate(value: string | number | Date | null | undefined, style: DateStyle, empty = "—"): string {
  if (value === null || value === undefined || value === "") return empty;
  const d = value instanceof Date ? value : new Date(value);
  if (Number.isNaN(d.getTime())) return empty;
  let f = formatters.get(style);
  if (!f) formatters.set(style, (f = new Intl.DateTimeFormat(LOCALE, STYLES[style])));
  if (style === "utcDayTime") {
    const p = Object.fromEntries(f.formatToParts(d).map((x) => [x.type, x.value]));
    return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute} UTC`;
  }
  return style === "utcTime" ? `${f.format(d)} UTC` : f.format(d);
}
