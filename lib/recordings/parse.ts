/**
 * Logger CSV → SI samples, listing every problem (row and column) before anything is stored. Pure
 * (papaparse), so the browser shows the same report the server enforces. Row numbers are the file's
 * line numbers (the header is line 1).
 */
import Papa from "papaparse";
import type { FieldIssue } from "@/lib/http/errors";
import { QUANTITY_OF, factorOf, resolveUnits, type ChannelKey, type ResolvedUnit } from "./headers";
import { CHANNELS, RECORDING_MAX_ROWS, type Channel, type Units } from "./schema";

export interface ParsedSample {
  t: number;
  takeUpPosition: number | null;
  chainTension: number | null;
  driveCurrent: number | null;
  trainPosition: number | null;
  trainSpeed: number | null;
}

export interface ParseReport {
  headers: string[];
  rowCount: number;
  samples: ParsedSample[];
  issues: FieldIssue[];
  channels: Channel[];
  /** The unit each mapped column was read in, and where that unit came from. */
  units: Partial<Record<ChannelKey, ResolvedUnit>>;
  /** Field separator found in the file, and whether its numbers use a decimal comma (found once, per file). */
  delimiter: string;
  decimalComma: boolean;
}

const MAX_LISTED = 1000;

export function readHeaders(csv: string): string[] {
  const r = Papa.parse<string[]>(csv, { preview: 1, skipEmptyLines: true });
  return (r.data[0] ?? []).map((h) => String(h).trim());
}

// Largest magnitude of a reading in SI units: far beyond any chain lift (assumption), far below overflow,
// so differences of two readings stay finite too. Time allows logger clocks in Unix seconds.
const MAX_SI: Record<Channel | "time", number> = {
  time: 1e11,
  takeUpPosition: 1e6,
  chainTension: 1e9,
  driveCurrent: 1e6,
  trainPosition: 1e6,
  trainSpeed: 1e4,
};
const SI_UNIT: Record<Channel, string> = { takeUpPosition: "m", chainTension: "N", driveCurrent: "A", trainPosition: "m", trainSpeed: "m/s" };
const withinRange = (v: number, max: number) => Number.isFinite(v) && Math.abs(v) <= max;

/**
 * A decimal comma is only possible when the separator is not a comma: then it is the file's convention
 * if the mapped columns' first rows hold numbers written with one comma and none with a point.
 */
export function usesDecimalComma(rows: string[][], columns: number[], delimiter: string): boolean {
  if (delimiter === ",") return false;
  const cells = rows.slice(1, 201).flatMap((r) => columns.map((i) => String(r[i] ?? "").trim()));
  return cells.some((c) => /^[+-]?\d*,\d+(e[+-]?\d+)?$/i.test(c)) && !cells.some((c) => /^[+-]?\d*\.\d+/.test(c));
}

export function parseRecordingCsv(csv: string, mapping: Partial<Record<Channel | "time", string>>, units: Partial<Units>, columnUnits: Partial<Record<ChannelKey, string>> = {}): ParseReport {
  const issues: FieldIssue[] = [];
  let more = 0;
  const add = (i: FieldIssue) => (issues.length < MAX_LISTED ? issues.push(i) : more++);
  const r = Papa.parse<string[]>(csv, { skipEmptyLines: "greedy" });
  const rows = r.data;
  const headers = (rows[0] ?? []).map((h) => String(h).trim());
  const index: Partial<Record<Channel | "time", number>> = {};
  for (const key of ["time", ...CHANNELS] as const) {
    const name = mapping[key];
    if (!name) continue;
    const i = headers.indexOf(name);
    if (i < 0) add({ path: `mapping.${key}`, message: `the file has no column "${name}"` });
    else index[key] = i;
  }
  const channels = CHANNELS.filter((c) => index[c] !== undefined);
  const resolved = resolveUnits(mapping, units, columnUnits);
  resolved.issues.forEach(add);
  const factor = (key: ChannelKey) => factorOf(QUANTITY_OF[key], resolved.columns[key]?.unit ?? "");
  const delimiter = r.meta.delimiter || ",";
  const decimalComma = usesDecimalComma(rows, Object.values(index), delimiter);
  const body = rows.slice(1);
  if (body.length === 0) add({ path: "csv", message: "the file has a header but no data rows" });
  if (body.length > RECORDING_MAX_ROWS) add({ path: "csv", message: `the file has ${body.length} data rows; at most ${RECORDING_MAX_ROWS}` });
  const samples: ParsedSample[] = [];
  if (issues.length === 0) {
    const tf = factor("time");
    const sign = units.takeUpDirection === "up" ? -1 : 1;
    let lastT = Number.NEGATIVE_INFINITY;
    let takeUp0: number | null = null;
    body.forEach((cells, k) => {
      const line = k + 2;
      if (cells.length !== headers.length) {
        add({ path: `rows.${line}`, message: `line ${line} has ${cells.length} fields; the header has ${headers.length}` });
        return;
      }
      const num = (key: Channel | "time"): number | null | undefined => {
        const i = index[key];
        if (i === undefined) return null;
        const raw = String(cells[i]).trim();
        if (raw === "" && key !== "time") return null; // an empty reading is a gap, not an error
        const v = Number(decimalComma ? raw.replace(",", ".") : raw);
        if (raw === "" || !Number.isFinite(v)) {
          add({ path: `rows.${line}.${key}`, message: `line ${line}, column "${headers[i]}": "${raw.slice(0, 40)}" is not a number` });
          return undefined;
        }
        return v;
      };
      const t = num("time");
      const values = Object.fromEntries(channels.map((c) => [c, num(c)])) as Record<Channel, number | null | undefined>;
      if (t === undefined || t === null) return;
      const ts = t * tf;
      if (!withinRange(ts, MAX_SI.time)) {
        add({ path: `rows.${line}.time`, message: `line ${line}: time ${t} ${resolved.columns.time?.unit ?? ""} is beyond ${MAX_SI.time} s once converted` });
        return;
      }
      if (ts <= lastT) add({ path: `rows.${line}.time`, message: `line ${line}: time ${t} does not increase (previous ${lastT / tf})` });
      lastT = Math.max(lastT, ts);
      if (channels.some((c) => values[c] === undefined)) return;
      const sample: ParsedSample = { t: ts, takeUpPosition: null, chainTension: null, driveCurrent: null, trainPosition: null, trainSpeed: null };
      for (const c of channels) {
        const v = values[c];
        if (v === null || v === undefined) continue;
        const si = v * factor(c);
        // A reading that overflows (or is absurd) once in SI units is an error, not Infinity in the database.
        if (!withinRange(si, MAX_SI[c])) {
          add({ path: `rows.${line}.${c}`, message: `line ${line}, column "${headers[index[c]!]}": ${v} ${resolved.columns[c]?.unit ?? ""} is beyond ${MAX_SI[c]} ${SI_UNIT[c]} once converted to SI units` });
          continue;
        }
        if (c === "takeUpPosition") {
          // Kept as the drop from the first reading, positive down: the engine's convention.
          if (takeUp0 === null) takeUp0 = si;
          sample.takeUpPosition = sign * (si - takeUp0);
        } else sample[c] = si;
      }
      samples.push(sample);
    });
  }
  if (more) issues.push({ path: "rows", message: `and ${more} more problems` });
  return { headers, rowCount: body.length, samples: issues.length ? [] : samples, issues, channels, units: resolved.columns, delimiter, decimalComma };
}

/**
 * Engagement from a train-speed trace: the first moment the speed differs from its first reading by
 * more than 0.25 m/s (the dog taking the train to chain speed). Null without a speed channel.
 */
export function detectEngagement(samples: ParsedSample[]): number | null {
  const s = samples.filter((x) => x.trainSpeed !== null);
  if (s.length < 3) return null;
  const v0 = s[0].trainSpeed!;
  const hit = s.find((x) => Math.abs(x.trainSpeed! - v0) > 0.25);
  return hit ? hit.t : null;
}
