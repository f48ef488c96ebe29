/**
 * Survey points from a CSV file for the lift editor's profile import: two columns, horizontal distance and
 * height, in the reader's length unit, an optional header row. Read with papaparse like logger files
 * (lib/recordings/parse.ts), with the same per-file decimal-comma rule. Pure: runs in the browser.
 */
import Papa from "papaparse";
import { fromDisplay, type UnitSystem } from "@/lib/client/units";
import { usesDecimalComma } from "@/lib/recordings/parse";
import type { SurveyPoint } from "@/sim/profile-fit";

export const SURVEY_MAX_POINTS = 20000;

export interface SurveyCsv {
  points: SurveyPoint[];
  /** Problems by line (the file's line numbers), in words; no points when there is any. */
  issues: string[];
  decimalComma: boolean;
}

export function readSurveyCsv(csv: string, units: UnitSystem): SurveyCsv {
  const r = Papa.parse<string[]>(csv, { skipEmptyLines: "greedy" });
  const rows = r.data.map((row) => row.map((c) => String(c).trim()));
  const delimiter = r.meta.delimiter || ",";
  const looksNumeric = (c: string | undefined) => !!c && /^[+-]?(\d+([.,]\d*)?|[.,]\d+)(e[+-]?\d+)?$/i.test(c);
  const header = rows.length > 0 && !(looksNumeric(rows[0][0]) && looksNumeric(rows[0][1]));
  const first = header ? 1 : 0;
  // The decimal-comma rule looks at the rows after a header line (row 0 is skipped by it).
  const decimalComma = usesDecimalComma(header ? rows : [[], ...rows], [0, 1], delimiter);
  const issues: string[] = [];
  const points: SurveyPoint[] = [];
  const body = rows.slice(first);
  if (body.length === 0) issues.push("the file has no rows of horizontal distance and height");
  if (body.length > SURVEY_MAX_POINTS) issues.push(`the file has ${body.length} rows; at most ${SURVEY_MAX_POINTS}`);
  if (issues.length) return { points, issues, decimalComma };
  body.forEach((cells, k) => {
    const line = k + first + 1;
    if (cells.length < 2) {
      issues.push(`line ${line}: give horizontal distance and height`);
      return;
    }
    const [x, z] = [cells[0], cells[1]].map((raw) => Number(decimalComma ? raw.replace(",", ".") : raw));
    if (cells[0] === "" || !Number.isFinite(x)) issues.push(`line ${line}: horizontal distance "${cells[0].slice(0, 40)}" is not a number`);
    else if (cells[1] === "" || !Number.isFinite(z)) issues.push(`line ${line}: height "${cells[1].slice(0, 40)}" is not a number`);
    else points.push({ x: fromDisplay(x, "length", units), z: fromDisplay(z, "length", units) });
  });
  return { points: issues.length ? [] : points, issues: issues.slice(0, 20), decimalComma };
}
