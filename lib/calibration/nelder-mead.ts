/**
 * Nelder–Mead simplex minimiser (Nelder & Mead 1965, with the standard coefficients: reflection 1,
 * expansion 2, contraction ½, shrink ½, as in Lagarias et al. 1998). Small and dependency-free so a
 * calibration can run in a browser worker as well as on the server; tested in
 * tests/unit/calibration-nelder-mead.test.ts on functions with known minima.
 */
export interface NelderMeadOptions {
  /** Initial simplex step per coordinate (default 0.1 for every coordinate). */
  step?: number | number[];
  /** Stop after this many function evaluations (default 200). */
  maxEvaluations?: number;
  /** Stop when the simplex's function values differ by less than this (default 1e-10, absolute). */
  fTolerance?: number;
  /** Stop when every vertex is within this of the best in every coordinate (default 1e-6). */
  xTolerance?: number;
}

export interface NelderMeadResult {
  x: number[];
  fx: number;
  evaluations: number;
  iterations: number;
  converged: boolean;
}

export function nelderMead(f: (x: number[]) => number, x0: number[], opts: NelderMeadOptions = {}): NelderMeadResult {
  const n = x0.length;
  const maxEval = opts.maxEvaluations ?? 200;
  const fTol = opts.fTolerance ?? 1e-10;
  const xTol = opts.xTolerance ?? 1e-6;
  const steps = Array.isArray(opts.step) ? opts.step : new Array<number>(n).fill(opts.step ?? 0.1);
  let evaluations = 0;
  const value = (x: number[]) => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Number.POSITIVE_INFINITY;
  };
  let simplex: { x: number[]; f: number }[] = [{ x: [...x0], f: value(x0) }];
  for (let i = 0; i < n; i++) {
    const x = [...x0];
    x[i] += steps[i];
    simplex.push({ x, f: value(x) });
  }
  let iterations = 0;
  let converged = false;
  const combine = (a: number[], b: number[], t: number) => a.map((ai, i) => ai + t * (b[i] - ai));
  while (evaluations < maxEval) {
    simplex.sort((a, b) => a.f - b.f);
    const best = simplex[0];
    const worst = simplex[n];
    const fSpread = Math.abs(worst.f - best.f);
    const xSpread = Math.max(...simplex.slice(1).map((v) => Math.max(...v.x.map((xi, i) => Math.abs(xi - best.x[i])))));
    if (fSpread <= fTol && xSpread <= xTol) {
      converged = true;
      break;
    }
    if (xSpread <= xTol) {
      converged = true;
      break;
    }
    iterations++;
    const centroid = new Array<number>(n).fill(0);
    for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) centroid[i] += simplex[k].x[i] / n;
    // Reflection: x_r = c + (c − x_worst).
    const xr = combine(centroid, worst.x, -1);
    const fr = value(xr);
    if (fr < best.f) {
      const xe = combine(centroid, worst.x, -2);
      const fe = value(xe);
      simplex[n] = fe < fr ? { x: xe, f: fe } : { x: xr, f: fr };
      continue;
    }
    if (fr < simplex[n - 1].f) {
      simplex[n] = { x: xr, f: fr };
      continue;
    }
    // Contraction, outside or inside.
    const outside = fr < worst.f;
    const xc = outside ? combine(centroid, worst.x, -0.5) : combine(centroid, worst.x, 0.5);
    const fc = value(xc);
    if (fc < (outside ? fr : worst.f)) {
      simplex[n] = { x: xc, f: fc };
      continue;
    }
    // Shrink toward the best vertex.
    simplex = simplex.map((v, k) => (k === 0 ? v : { x: combine(best.x, v.x, 0.5), f: Number.NaN }));
    for (let k = 1; k <= n; k++) simplex[k].f = value(simplex[k].x);
  }
  simplex.sort((a, b) => a.f - b.f);
  return { x: simplex[0].x, fx: simplex[0].f, evaluations, iterations, converged };
}
