/**
 * A study's case table as CSV or XLSX (exceljs), in the reader's units, with the window and the caution.
 */
import ExcelJS from "exceljs";
import { toCsv } from "@/lib/csv/write";
import { display, type Quantity, type UnitSystem } from "@/lib/units/display";
import { PARAMETER_LABELS, type StudyParameterKey } from "./schema";
import type { StudyView } from "./service";

interface Column {
  header: string;
  get: (c: NonNullable<StudyView["cases"]>[number]) => string | number | null;
}

const HEADLINE_COLUMNS: { key: string; label: string; quantity: Quantity | null }[] = [
  { key: "peakTension", label: "Peak tension", quantity: "force" },
  { key: "snatchFactor", label: "Snatch factor", quantity: null },
  { key: "minSafetyFactor", label: "Lowest safety factor", quantity: null },
  { key: "rollbackDistance", label: "Rollback distance", quantity: "smallLength" },
  { key: "ardCatches", label: "ARD catches", quantity: null },
  { key: "pickupDelay", label: "Pick-up delay (s)", quantity: null },
  { key: "takeUpMaxDrop", label: "Take-up drop", quantity: "smallLength" },
  { key: "takeUpMaxRise", label: "Take-up rise", quantity: "smallLength" },
  { key: "peakDrivePower", label: "Peak drive power", quantity: "power" },
  { key: "peakRiderAccel", label: "Peak rider acceleration (g)", quantity: null },
];

function unitOf(q: Quantity, units: UnitSystem): string {
  return display(1, q, units).unit;
}

export function studyColumns(study: StudyView, units: UnitSystem): Column[] {
  const chains = new Map(study.chains.map((c) => [c.id, c.designation]));
  const params: Column[] = study.parameters.map((p) => {
    const meta = PARAMETER_LABELS[p.key as StudyParameterKey];
    const q = meta.quantity;
    return {
      header: q ? `${meta.label} (${unitOf(q, units)})` : meta.label,
      get: (c) => {
        const v = c.values[p.key];
        if (p.key === "chainSpec") return chains.get(Number(v)) ?? String(v);
        if (q && typeof v === "number") return Number(display(v, q, units).value.toPrecision(6));
        return v ?? null;
      },
    };
  });
  const figures: Column[] = HEADLINE_COLUMNS.map((h) => ({
    header: h.quantity ? `${h.label} (${unitOf(h.quantity, units)})` : h.label,
    get: (c) => {
      const v = c.headline?.[h.key];
      if (v === null || v === undefined) return null;
      return Number((h.quantity ? display(v, h.quantity, units).value : v).toPrecision(6));
    },
  }));
  return [
    { header: "Case", get: (c) => c.idx + 1 },
    ...params,
    { header: "Status", get: (c) => c.status },
    { header: "Acceptable", get: (c) => (c.acceptable === null ? null : c.acceptable ? "yes" : "no") },
    ...figures,
    { header: "Run", get: (c) => c.runId },
  ];
}

export const EXPORT_CAUTION =
  "Results support, and never replace, review by a qualified engineer; the governing standards, the ride's manufacturer data and licensed practice govern.";

export function studyCsv(study: StudyView, units: UnitSystem): string {
  const cols = studyColumns(study, units);
  return toCsv(
    cols.map((c) => c.header),
    (study.cases ?? []).map((c) => cols.map((col) => col.get(c))),
  );
}

export async function studyXlsx(study: StudyView, units: UnitSystem): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = "Tautline";
  const ws = wb.addWorksheet("Cases");
  const cols = studyColumns(study, units);
  ws.addRow(cols.map((c) => c.header)).font = { bold: true };
  for (const c of study.cases ?? []) ws.addRow(cols.map((col) => col.get(c)));
  ws.columns.forEach((col) => (col.width = 16));
  const info = wb.addWorksheet("Study");
  info.addRow(["Study", study.name]);
  info.addRow(["Cases", `${study.casesDone} done, ${study.casesFailed} failed, ${study.casesTotal} in all`]);
  info.addRow(["Recommended operating window", study.window?.text ?? ""]);
  info.addRow(["Units", units === "si" ? "SI" : "US customary"]);
  info.addRow(["Caution", EXPORT_CAUTION]);
  info.getColumn(1).width = 30;
  info.getColumn(2).width = 100;
  return Buffer.from(await wb.xlsx.writeBuffer());
}
