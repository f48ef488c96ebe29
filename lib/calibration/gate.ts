/**
 * Whether a fit is good enough to become a lift revision, with the reasons in plain words. Pure, so the
 * panel shows the same verdict the server enforces when the fit is saved.
 *
 * Limits (assumptions, chosen for a take-up trace fitted by two or three parameters):
 * - R² of at least 0.90: the fitted trace follows nine tenths of the recorded movement's variation.
 *   R² ≤ 0 means the fit explains less than a flat line at the recording's mean.
 * - The search settled (the simplex shrank below its tolerance) before its budget of engine runs ran out:
 *   otherwise the values are where the search stopped, not a best fit.
 * The RMS residual is reported beside them; with R² it is the same information (RMS / spread = √(1 − R²)).
 */
export const MIN_R_SQUARED = 0.9;

export interface FitForGate {
  quality: { fitted: { rms: number | null; rSquared: number | null; samples: number } };
  evaluations: number;
  converged: boolean;
}

export interface FitVerdict {
  /** True when the fit may be saved as a revision. */
  acceptable: boolean;
  /** One sentence per check, in plain words; failing ones first. */
  findings: { ok: boolean; text: string }[];
}

const finite = (v: number | null | undefined): v is number => typeof v === "number" && Number.isFinite(v);

/** `rmsText` formats the RMS residual (SI metres) in the reader's unit. */
export function fitVerdict(fit: FitForGate, rmsText: (metres: number) => string = (m) => `${(m * 1000).toFixed(2)} mm`): FitVerdict {
  const { rms, rSquared, samples } = fit.quality.fitted;
  const findings: { ok: boolean; text: string }[] = [];
  if (!finite(rSquared) || !finite(rms) || samples < 10)
    findings.push({ ok: false, text: `The fit could not be measured against the recording (${samples} samples compared).` });
  else {
    const share = Math.max(0, rSquared) * 100;
    findings.push(
      rSquared >= MIN_R_SQUARED
        ? { ok: true, text: `The fitted trace follows the recording: R² = ${rSquared.toFixed(3)}, it accounts for ${share.toFixed(0)} % of the recorded movement (at least ${MIN_R_SQUARED.toFixed(2)} needed).` }
        : rSquared <= 0
          ? { ok: false, text: `The fitted trace does not follow the recording: R² = ${rSquared.toFixed(3)}, worse than a flat line at the recording's average (at least ${MIN_R_SQUARED.toFixed(2)} needed).` }
          : { ok: false, text: `The fitted trace follows the recording only loosely: R² = ${rSquared.toFixed(3)}, it accounts for ${share.toFixed(0)} % of the recorded movement (at least ${MIN_R_SQUARED.toFixed(2)} needed).` },
    );
    findings.push({ ok: true, text: `Typical gap between the fitted and the recorded take-up (RMS residual): ${rmsText(rms)} over ${samples} samples.` });
  }
  findings.push(
    fit.converged
      ? { ok: true, text: `The search settled after ${fit.evaluations} engine runs.` }
      : { ok: false, text: `The search stopped at its budget of ${fit.evaluations} engine runs before settling: the values are where it stopped, not a best fit.` },
  );
  findings.sort((a, b) => Number(a.ok) - Number(b.ok));
  return { acceptable: findings.every((f) => f.ok), findings };
}
