/** Shapes of the logbook API answers, as the browser sees them (dates as ISO strings, SI values). */
export interface ForecastJson {
  crossing: string | null;
  earliest: string | null;
  latest: string | null;
  slopePerDay: number;
  residualSd: number | null;
  points: number;
  reached: boolean;
  line: { at: string; value: number; lower: number; upper: number }[];
}

export interface AlertJson {
  id: number;
  liftId: number;
  liftName: string;
  kind: string;
  level: string;
  message: string;
  createdAt: string;
  emailedAt: string | null;
  recipients: string[];
}

export interface TrendJson {
  liftId: number;
  liftName: string;
  settings: { elongationLimit: number; elongationWarning: number; takeUpWarning: number; horizonDays: number; version: number };
  pitch: number;
  travel: number;
  takeUp: { limit: number; warning: number; thermalReserve: number; elasticExcursion: number | null; source: string };
  elongation: { points: { at: string; value: number }[]; latest: number | null; forecast: ForecastJson | null };
  takeUpSeries: { points: { at: string; value: number }[]; latest: number | null; since: string | null; forecast: ForecastJson | null };
  alerts: AlertJson[];
}

export interface EntryJson {
  id: number;
  kind: "elongation" | "take-up" | "links-removed" | "lubrication" | "inspection";
  measuredAt: string;
  userName: string | null;
  data: Record<string, unknown>;
  elongationPercent: number | null;
  takeUpPosition: number | null;
  notes: string | null;
  photos: { id: number; url: string; name: string }[];
}

export const KIND_LABELS: Record<EntryJson["kind"], string> = {
  elongation: "Chain elongation",
  "take-up": "Take-up at rest",
  "links-removed": "Links removed",
  lubrication: "Lubrication",
  inspection: "Inspection",
};
