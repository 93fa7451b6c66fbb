import type { Problem } from './prepare-problem';
import { applyQt, householderQr, type HouseholderQr } from './householder-qr';

/**
 * On one side of the interval the residual sum of squares must rise by at least this fraction of
 * what the linearised model predicts, or the data are taken not to determine the parameter (ours).
 */
export const FLAT_FRACTION = 0.1;

/** One parameter the data cannot determine. */
export interface Unidentified {
  /** index into the problem's parameters */
  index: number;
  name: string;
  /** the side(s) of the interval on which the RSS stays flat */
  side: 'below' | 'above' | 'both';
}

/**
 * Parameters the data cannot determine, by the profile of the RSS across each parameter's
 * interval (Bates & Watts, Nonlinear Regression Analysis and Its Applications, Wiley 1988, §6.1).
 * With the other parameters at their best values for each value of pⱼ, the linear theory
 * predicts RSS(pⱼ + τ) = RSS + τ²/Cⱼⱼ (C = (JᵀJ)⁻¹ of the weighted Jacobian J): at the ends of the
 * interval, τ = ±t·s·√Cⱼⱼ, a rise of t²·s². There pⱼ is held, the others start on the linearised
 * profile trace τ·C·eⱼ/Cⱼⱼ and are re-fitted by one Gauss–Newton step with the Jacobian of the
 * estimate (a chord step: no new derivatives), and the RSS is evaluated at both points. When the
 * lower of the two rises by less than {@link FLAT_FRACTION} of the prediction on either side, a
 * point with pⱼ at the end of its interval fits the data about as well as the estimate: the data
 * do not pin the parameter down (the column of a saturated exponential, an amplitude multiplying
 * a term the data do not show), and its standard error and interval only describe the curvature
 * at the estimate. The test can miss a flat profile the chord step does not find; it never flags
 * a parameter without a point that shows it.
 *
 * The residual scale has a floor, s ≥ √ε·rms(√w·ŷ) (ε the double-precision unit round-off): on
 * data fitted to round-off, s is round-off too and the interval is tiny, yet a parameter whose
 * column, scaled by the parameter, is of the order of the round-off of the fitted values moves
 * nothing at that scale either. With the floor such a parameter shows up, while a parameter the
 * data determine exactly (a polynomial coefficient of exact data) still rises quadratically.
 *
 * Cost: per parameter one QR of the other columns and four model evaluations.
 *
 * @param problem - the prepared problem (model, data, weights, bounds)
 * @param p - the estimate
 * @param jac - the weighted Jacobian ∂(√w·f)/∂p at the estimate, column-major m×n
 * @param inverse - (JᵀJ)⁻¹, n×n row-major (analyseJacobian)
 * @param s - residual standard deviation √(RSS/df)
 * @param t - the Student t quantile of the interval
 * @returns the parameters that are not identifiable (empty for a well-posed fit)
 * @example unidentifiedParameters(problem, sol.p, jac, inverse, s, t).map((u) => u.name) // ['UA'] for flat outlet data
 */
export function unidentifiedParameters(problem: Problem, p: ArrayLike<number>, jac: ArrayLike<number>, inverse: ArrayLike<number>, s: number, t: number): Unidentified[] {
  const { x, y, sw, compiled, bounds } = problem;
  const m = x.length, n = p.length;
  const f = new Float64Array(m);
  const r = new Float64Array(m);
  /** RSS at q; the weighted residuals stay in r */
  const rssAt = (q: ArrayLike<number>): number => {
    try {
      compiled.values(q, x, problem.cov, f);
    } catch {
      return Infinity;
    }
    let sum = 0;
    for (let i = 0; i < m; i++) {
      r[i] = sw[i] * (y[i] - f[i]);
      sum += r[i] * r[i];
    }
    return Number.isFinite(sum) ? sum : Infinity;
  };
  const rss0 = rssAt(p);
  if (!Number.isFinite(rss0)) return [];
  let fitScale = 0;
  for (let i = 0; i < m; i++) fitScale += (sw[i] * f[i]) ** 2; // f holds ŷ after rssAt(p)
  const sEff = Math.max(s, Math.sqrt(Number.EPSILON) * Math.sqrt(fitScale / m));
  const predictedRise = t * t * sEff * sEff;
  const out: Unidentified[] = [];
  const q = new Float64Array(n);
  const others = new Float64Array(m * Math.max(n - 1, 1));
  const z = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const cjj = inverse[j * n + j];
    if (!(cjj > 0 && cjj < Infinity)) {
      // a variance factor that overflows (or is lost to round-off): the column is nothing at working precision
      out.push({ index: j, name: problem.parameters[j], side: 'both' });
      continue;
    }
    let qr: HouseholderQr | null = null;
    if (n > 1) {
      for (let k = 0, c = 0; k < n; k++) if (k !== j) { for (let i = 0; i < m; i++) others[i + c * m] = jac[i + k * m]; c++; }
      qr = householderQr(Float64Array.from(others.subarray(0, m * (n - 1))), m, n - 1, true);
    }
    const tauMax = t * sEff * Math.sqrt(cjj);
    const flat: boolean[] = [];
    for (const sign of [-1, 1]) {
      // the farthest fraction of the way to the end that keeps every parameter inside its bounds
      let frac = 1;
      for (let k = 0; k < n; k++) {
        const d = (sign * tauMax * inverse[k * n + j]) / cjj;
        if (d === 0) continue;
        const room = d > 0 ? bounds[k][1] - p[k] : bounds[k][0] - p[k];
        if (Number.isFinite(room)) frac = Math.min(frac, room / d);
      }
      if (!(frac > 1e-6)) { flat.push(false); continue; }
      for (let k = 0; k < n; k++) q[k] = p[k] + (frac * sign * tauMax * inverse[k * n + j]) / cjj;
      let best = rssAt(q);
      if (qr && Number.isFinite(best)) {
        // chord step for the others: min ‖r − J₋ⱼ·δ‖ with the factorization J₋ⱼ·P = Q·R
        applyQt(qr, r);
        let ok = true;
        for (let i = n - 2; i >= 0; i--) {
          let v = r[i];
          for (let c = i + 1; c < n - 1; c++) v -= qr.a[i + c * m] * z[c];
          z[i] = v / qr.rdiag[i];
          if (!Number.isFinite(z[i])) ok = false;
        }
        if (ok) {
          for (let i = 0; i < n - 1; i++) {
            const c = qr.ipvt[i]; // column i of R is column c of J₋ⱼ, that is parameter c (below j) or c + 1
            const k = c < j ? c : c + 1;
            q[k] = Math.min(Math.max(q[k] + z[i], bounds[k][0]), bounds[k][1]);
          }
          best = Math.min(best, rssAt(q));
        }
      }
      flat.push(best - rss0 < FLAT_FRACTION * predictedRise * frac * frac);
    }
    if (flat[0] || flat[1]) {
      out.push({ index: j, name: problem.parameters[j], side: flat[0] && flat[1] ? 'both' : flat[0] ? 'below' : 'above' });
    }
  }
  return out;
}
