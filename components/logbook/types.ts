/** Shapes of the logbook API answers, as the browser sees them (dates as ISO strings, SI values). */
import type { AlertView } from "@/lib/alerts/notify";
import type { EntryView, ForecastView, Trend } from "@/lib/logbook/service";

// The API answers are the lib's view types as they are (dates already ISO strings).
export type ForecastJson = ForecastView;
export type AlertJson = AlertView;
export type TrendJson = Trend;
export type EntryJson = EntryView;

export const KIND_LABELS: Record<EntryJson["kind"], string> = {
  elongation: "Chain elongation",
  "take-up": "Take-up at rest",
  "links-removed": "Links removed",
  lubrication: "Lubrication",
  inspection: "Inspection",
};
