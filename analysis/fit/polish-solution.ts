import { extendedResiduals } from './extended-residuals';
import { linearLeastSquares } from './linear-least-squares';
import type { Problem } from './prepare-problem';

/** Polished parameters with the extended-precision residuals there. */
export interface PolishedSolution {
  /** the polished parameters (the converged ones when no extended evaluation is possible or no step helps) */
  p: Float64Array;
  /** y − f(x; p) at the returned p, evaluated in double-double; null when that evaluation is not possible */
  residuals: Float64Array | null;
}

/**
 * Final Gauss–Newton corrections with residuals evaluated in double-double arithmetic: once LM has
 * converged in double precision, p ← p + δ with δ = argmin ‖J δ − √w·(y − f(p))‖ while the
 * the steps are tiny next to the residuals and keep shrinking (at most 10 steps). This is iterative
 * refinement for nonlinear least squares: near the minimum the sum of squares is too flat for LM's
 * tests to resolve the last digits of p (its change falls below 1e-16 of itself), and when the
 * residuals are tiny next to y rounding in f hides them; the Gauss–Newton step works from the
 * residuals themselves and recovers those digits.
 *
 * @param problem - the prepared problem
 * @param p - converged parameters (not modified)
 * @returns the polished parameters and the extended residuals there (the statistics reuse them)
 * @example const { p, residuals } = polishSolution(problem, sol.p)
 */
export function polishSolution(problem: Problem, p: Float64Array): PolishedSolution {
  const { x, y, sw, cov, compiled, parameters, expression } = problem;
  const m = x.length;
  const n = parameters.length;
  const r = new Float64Array(m);
  const rss = (q: Float64Array): number => {
    if (!extendedResiduals(expression, parameters, compiled.covariates, q, x, cov, y, r)) return NaN;
    let s = 0;
    for (let i = 0; i < m; i++) s += (sw[i] * r[i]) ** 2;
    return s;
  };
  let best = p;
  let bestRss = rss(p);
  if (!Number.isFinite(bestRss)) return { p, residuals: null };
  const jac = new Float64Array(m * n);
  const bestR = Float64Array.from(r);
  const target = new Float64Array(m);
  const columns = Array.from({ length: n }, () => new Float64Array(m));
  let previousShift = Infinity;
  for (let it = 0; it < 10 && bestRss > 0; it++) {
    for (let i = 0; i < m; i++) target[i] = sw[i] * bestR[i];
    compiled.gradient(best, x, cov, jac);
    for (let j = 0; j < n; j++) {
      const c = columns[j];
      for (let i = 0; i < m; i++) c[i] = sw[i] * jac[i + j * m];
    }
    const step = linearLeastSquares(columns, target, { maxSteps: 2 });
    if (!step.ok) break;
    // ‖J δ‖: how far the step moves the fitted values; a polish step must be tiny next to ‖r‖ and
    // shrink from one step to the next (Gauss–Newton converging), else it is left alone
    let shift = 0;
    for (let i = 0; i < m; i++) {
      let v = 0;
      for (let j = 0; j < n; j++) v += columns[j][i] * step.coefficients[j];
      shift += v * v;
    }
    shift = Math.sqrt(shift);
    if (!(shift <= 0.1 * Math.sqrt(bestRss)) || !(shift < previousShift)) break;
    const next = new Float64Array(n);
    let inside = true;
    for (let j = 0; j < n; j++) {
      const v = best[j] + step.coefficients[j];
      next[j] = v;
      if (!Number.isFinite(v) || v < problem.bounds[j][0] || v > problem.bounds[j][1]) inside = false;
    }
    if (!inside) break;
    // the sum of squares cannot resolve changes below ~1e-15 of itself: only refuse clear increases
    const nextRss = rss(next);
    if (!(nextRss <= bestRss * (1 + 1e-13))) break;
    best = next;
    bestRss = Math.min(bestRss, nextRss);
    bestR.set(r);
    previousShift = shift;
    if (shift === 0) break;
  }
  return { p: best, residuals: bestR };
}
