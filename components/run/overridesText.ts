/** How a what-if run's overrides read in the run view and the runs list, in the user's units. */
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { OVERRIDE_FIELDS, RUN_OVERRIDE_KEYS, type RunOverrides } from "@/lib/runs/overrides";

/** One line per override: "entry speed 2.40 m/s (scenario: 1.80 m/s)". Empty for a plain run. */
export function overrideLines(overrides: RunOverrides | null | undefined, from: RunOverrides | null | undefined, units: UnitSystem): string[] {
  if (!overrides) return [];
  return RUN_OVERRIDE_KEYS.filter((k) => overrides[k] !== undefined).map((k) => {
    const f = OVERRIDE_FIELDS[k];
    const was = from?.[k];
    return `${f.label} ${formatQuantity(overrides[k], f.quantity, units)}${was !== undefined ? ` (scenario: ${formatQuantity(was, f.quantity, units)})` : ""}`;
  });
}
