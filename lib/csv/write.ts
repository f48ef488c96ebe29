/**
 * The one CSV writer (papaparse's unparse): RFC 4180 quoting and CRLF line ends. Text cells that a
 * spreadsheet would run as a formula (starting with = + - @, tab or CR) get a leading apostrophe, so a
 * study or scenario name like `=HYPERLINK(…)` opens as text. Numbers are written as numbers, so negative
 * values stay numeric. Pure: used by the server (study export) and the browser (plot export).
 */
import Papa from "papaparse";

export type CsvCell = string | number | boolean | null | undefined;

// Source: OWASP, "CSV Injection" (the characters that start a formula in common spreadsheets).
const FORMULA_START = /^[=+\-@\t\r]/;

export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  const body = Papa.unparse({ fields: [...header], data: rows.map((r) => [...r]) }, { escapeFormulae: FORMULA_START, newline: "\r\n", header: true });
  return `${body}\r\n`;
}
