/**
 * Sequential colour scale for chain tension: viridis (van der Walt & Smith, matplotlib), sampled at nine
 * stops and interpolated. It stays ordered in lightness, so it reads in greyscale and for the common
 * colour-vision deficiencies.
 */
const VIRIDIS: [number, number, number][] = [
  [68, 1, 84],
  [71, 44, 122],
  [59, 81, 139],
  [44, 113, 142],
  [33, 144, 141],
  [39, 173, 129],
  [92, 200, 99],
  [170, 220, 50],
  [253, 231, 37],
];

/** Colour of a value 0…1 (clamped). */
export function viridis(f: number): string {
  const t = Math.max(0, Math.min(1, Number.isFinite(f) ? f : 0)) * (VIRIDIS.length - 1);
  const i = Math.min(VIRIDIS.length - 2, Math.floor(t));
  const u = t - i;
  const a = VIRIDIS[i];
  const b = VIRIDIS[i + 1];
  const c = (k: number) => Math.round(a[k] + (b[k] - a[k]) * u);
  return `rgb(${c(0)}, ${c(1)}, ${c(2)})`;
}

/** The discrete bands the canvas draws with (one stroke per band per frame). */
export const TENSION_BANDS = 12;

export function bandOf(value: number, max: number): number {
  if (!(max > 0) || !(value > 0)) return 0;
  return Math.min(TENSION_BANDS - 1, Math.floor((value / max) * TENSION_BANDS));
}

export const BAND_COLOURS: string[] = Array.from({ length: TENSION_BANDS }, (_, i) => viridis((i + 0.5) / TENSION_BANDS));

/** Slack (no tension) is drawn dashed in grey, apart from the scale. */
export const SLACK_COLOUR = "#a9b6c2";
