/** Shapes of the logbook API answers, as the browser sees them (dates as ISO strings, SI values). */
import type { Jsonify } from "@/lib/client/jsonify";
import type { AlertView } from "@/lib/alerts/notify";
import type { EntryView, ForecastView, Trend } from "@/lib/logbook/service";

export type ForecastJson = Jsonify<ForecastView>;
export type AlertJson = Jsonify<AlertView>;
export type TrendJson = Jsonify<Trend>;
export type EntryJson = Jsonify<EntryView>;

/** How lengths are shown in the logbook: mm (SI) or inches (US customary), scale × SI metres. */
export type Len = { unit: string; scale: number; digits: number };

/** A date as the logbook shows it ("3 Dec 2026"), "—" for none. */
export const day = (iso: string | null) => (iso ? new Date(iso).toLocaleDateString("en-GB", { dateStyle: "medium" }) : "—");

export const KIND_LABELS: Record<EntryJson["kind"], string> = {
  elongation: "Chain elongation",
  "take-up": "Take-up at rest",
  "links-removed": "Links removed",
  lubrication: "Lubrication",
  inspection: "Inspection",
};
