import { extendedResiduals } from './extended-residuals';
import { linearLeastSquares } from './linear-least-squares';
import type { Problem } from './prepare-problem';

/**
 * Final Gauss–Newton corrections with residuals evaluated in double-double arithmetic: once LM has
 * converged in double precision, p ← p + δ with δ = argmin ‖J δ − √w·(y − f(p))‖ while the
 * extended-precision sum of squares decreases (at most 3 steps). This is iterative refinement for
 * nonlinear least squares: it removes the error that rounding in f leaves in p when the residuals are
 * tiny next to y, and changes nothing measurable otherwise.
 *
 * @param problem - the prepared problem
 * @param p - converged parameters (not modified)
 * @returns the polished parameters (p itself when no extended evaluation is possible or no step helps)
 */
export function polishSolution(problem: Problem, p: Float64Array): Float64Array {
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
  if (!Number.isFinite(bestRss)) return p;
  const jac = new Float64Array(m * n);
  let bestR = Float64Array.from(r);
  for (let it = 0; it < 3 && bestRss > 0; it++) {
    const target = Float64Array.from(bestR, (v, i) => sw[i] * v);
    compiled.gradient(best, x, cov, jac);
    const columns = Array.from({ length: n }, (_, j) => Float64Array.from({ length: m }, (_, i) => sw[i] * jac[i + j * m]));
    const step = linearLeastSquares(columns, target, { maxSteps: 2 });
    if (!step.ok) break;
    const next = Float64Array.from(best, (v, j) => v + step.coefficients[j]);
    if (next.some((v, j) => !Number.isFinite(v) || v < problem.bounds[j][0] || v > problem.bounds[j][1])) break;
    const nextRss = rss(next);
    if (!(nextRss < bestRss)) break;
    const gain = (bestRss - nextRss) / bestRss;
    best = next;
    bestRss = nextRss;
    bestR = Float64Array.from(r);
    if (gain < 1e-12) break;
  }
  return best;
}
