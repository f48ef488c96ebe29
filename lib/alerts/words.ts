/**
 * An alert's stored sentence in the reader's units. Alerts are stored (and e-mailed) as SI sentences whose
 * lengths are whole millimetres ("1971 mm", written by evaluate.ts); a US-customary reader gets those
 * lengths in inches from the one display table.
 */
import { formatQuantity, type UnitSystem } from "@/lib/client/units";

export function alertMessageIn(message: string, units: UnitSystem): string {
  if (units === "si") return message;
  return message.replace(/(-?\d+(?:\.\d+)?) mm\b/g, (_, mm: string) => formatQuantity(Number(mm) / 1000, "smallLength", units));
}
