/** Overlay of a recording on a simulated run, aligned at engagement. Pure. */
export interface OverlaySeries {
  /** Time shift added to the recording's time so its engagement falls on the run's, s. */
  shift: number;
  aligned: boolean;
  recording: { t: number[]; takeUp: (number | null)[] };
  run: { t: number[]; takeUp: number[] };
}

export function alignAtEngagement(
  rec: { t: number[]; takeUp: (number | null)[]; engagementTime: number | null },
  run: { t: number[]; takeUp: number[]; engagementTime: number | null },
): OverlaySeries {
  const aligned = rec.engagementTime !== null && run.engagementTime !== null;
  const shift = aligned ? run.engagementTime! - rec.engagementTime! : 0;
  return { shift, aligned, recording: { t: rec.t.map((x) => x + shift), takeUp: rec.takeUp }, run: { t: run.t, takeUp: run.takeUp } };
}
