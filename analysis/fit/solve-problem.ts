import { boundsTransform } from './bounds-transform';
import { levenbergMarquardt, type LmOptions } from './levenberg-marquardt';
import { linearLeastSquares, polynomialDesign } from './linear-least-squares';
import type { Problem } from './prepare-problem';
import { mulberry32 } from './random';

/** Outcome of solving a problem (parameters in the model's own, bounded space). */
export interface Solution {
  p: Float64Array;
  rss: number;
  iterations: number;
  evaluations: number;
  converged: boolean;
  reason: string;
  method: 'linear-qr' | 'levenberg-marquardt';
  /** how many starting points were tried */
  startsTried: number;
  /** the model or its derivatives could not be evaluated at the start */
  unevaluable: boolean;
}

/** Solver settings shared by every fit (no per-dataset tuning). */
export const SOLVER_OPTIONS: LmOptions = { ftol: 1e-15, xtol: 1e-15, gtol: 0, factor: 100 };
const MAX_RESTARTS = 3;
/** most model evaluations × points spent on an automatic multi-start (well under a second of work) */
const MULTI_START_BUDGET = 1e7;

/**
 * Least squares from one start: Levenberg–Marquardt in the bounds-transformed space, restarted
 * from its own end point (fresh trust region and scaling) while that still lowers the sum of squares.
 * @param problem - the prepared problem
 * @param y - responses to fit (the problem's own, or a bootstrap resample)
 * @param start - starting parameters
 * @param options - LM tolerances (default {@link SOLVER_OPTIONS})
 * @param restarts - how many times to restart from the end point (default 3; the bootstrap uses 0)
 * @returns the solution (converged false when LM did not)
 * @example solveFrom(problem, problem.y, [88, 430])
 */
export function solveFrom(problem: Problem, y: Float64Array, start: ArrayLike<number>, options: LmOptions = SOLVER_OPTIONS, restarts = MAX_RESTARTS): Solution {
  const { compiled, x, cov, sw } = problem;
  const m = x.length;
  const n = problem.parameters.length;
  const t = boundsTransform(problem.bounds);
  const p = new Float64Array(n);
  const dp = new Float64Array(n);
  const f = new Float64Array(m);
  const lm = {
    m,
    n,
    residuals(u: Float64Array, out: Float64Array) {
      t.toExternal(u, p);
      compiled.values(p, x, cov, f);
      for (let i = 0; i < m; i++) out[i] = sw[i] * (f[i] - y[i]);
    },
    jacobian(u: Float64Array, _r: Float64Array, out: Float64Array) {
      t.toExternal(u, p);
      compiled.gradient(p, x, cov, out);
      if (!t.identity) t.derivative(u, dp);
      for (let j = 0; j < n; j++) {
        const s = t.identity ? 1 : dp[j];
        for (let i = 0; i < m; i++) out[i + j * m] *= sw[i] * s;
      }
    },
  };
  let u = t.toInternal(start);
  let res = levenbergMarquardt(lm, u, options);
  let iterations = res.iterations;
  let evaluations = res.evaluations;
  for (let k = 0; k < restarts && res.converged; k++) {
    const again = levenbergMarquardt(lm, res.p, options);
    iterations += again.iterations;
    evaluations += again.evaluations;
    const better = again.converged && again.rss < res.rss;
    const gain = (res.rss - again.rss) / Math.max(res.rss, Number.MIN_VALUE);
    if (better) res = again;
    if (!better || gain < 1e-13) break;
  }
  u = res.p;
  const out = new Float64Array(n);
  t.toExternal(u, out);
  return { p: out, rss: res.rss, iterations, evaluations, converged: res.converged && Number.isFinite(res.rss), reason: res.reason, method: 'levenberg-marquardt', startsTried: 1, unevaluable: res.info === 0 };
}

/** Exact weighted polynomial least squares by QR (no iterations). */
function solvePolynomial(problem: Problem, y: Float64Array, degree: number): Solution | null {
  const { columns, columnsLo } = polynomialDesign(problem.x, degree);
  const sw = problem.sw;
  const wc = columns.map((c) => c.map((v, i) => v * sw[i]));
  const wl = columnsLo.map((c) => c.map((v, i) => v * sw[i]));
  const r = linearLeastSquares(wc, y.map((v, i) => v * sw[i]), { columnsLo: wl });
  if (!r.ok) return null;
  return { p: r.coefficients, rss: r.rss, iterations: 0, evaluations: 1, converged: true, reason: 'exact linear least-squares solution (QR)', method: 'linear-qr', startsTried: 0, unevaluable: false };
}

/** Starting points for an expression without start values: ones, then seeded log-uniform draws. */
function genericStarts(n: number, count: number): number[][] {
  const rand = mulberry32(12345);
  const starts: number[][] = [new Array(n).fill(1), new Array(n).fill(0.1), new Array(n).fill(-1)];
  while (starts.length < count) starts.push(Array.from({ length: n }, () => (rand() < 0.2 ? -1 : 1) * 10 ** (6 * rand() - 3)));
  return starts;
}

/**
 * Solves a prepared problem: polynomials by QR; otherwise LM from the user's start, or from the
 * built-in rule's best candidates, or (an expression without start values) from a seeded multi-start,
 * keeping the lowest sum of squares among converged runs; the multi-start stops early once the same
 * minimum has been found four times or a work budget is spent.
 * @param problem - the prepared problem
 * @param y - responses (default the problem's own)
 * @returns the best solution found
 * @example solveProblem(problem).p
 */
export function solveProblem(problem: Problem, y: Float64Array = problem.y): Solution {
  const degree = problem.builtin?.polynomialDegree;
  const unbounded = problem.bounds.every(([lo, hi]) => lo === -Infinity && hi === Infinity);
  if (degree && unbounded && !problem.userStart) {
    const s = solvePolynomial(problem, y, degree);
    if (s) return s;
  }
  let starts: number[][];
  if (problem.userStart) starts = [problem.userStart];
  else if (degree) {
    const linear = solvePolynomial(problem, y, degree); // bounded polynomial: start LM at the unbounded solution
    starts = [linear ? Array.from(linear.p) : new Array(problem.parameters.length).fill(0)];
  }
  else if (problem.builtin) {
    starts = problem.builtin.starts({ x: problem.x, y, covariates: problem.covariates }).slice(0, 3);
    const over = problem.startOverrides;
    if (over) starts = (starts.length ? starts : [new Array(over.length).fill(1)]).map((s) => s.map((v, j) => over[j] ?? v));
  }
  else starts = genericStarts(problem.parameters.length, 24);
  if (starts.length === 0) starts = [new Array(problem.parameters.length).fill(1)];
  const multiStart = !problem.userStart && !problem.builtin;
  const m = problem.x.length;
  let best: Solution | null = null;
  let tried = 0;
  let pointEvaluations = 0;
  let agreeing = 0;
  for (const s of starts) {
    tried++;
    // a multi-start runs each candidate once and restarts only the winner (below)
    const sol = solveFrom(problem, y, s, SOLVER_OPTIONS, multiStart ? 0 : MAX_RESTARTS);
    pointEvaluations += sol.evaluations * m;
    if (sol.converged && best?.converged && Math.abs(sol.rss - best.rss) <= 1e-10 * best.rss) agreeing++;
    if (sol.converged && (!best || !best.converged || sol.rss < best.rss)) best = sol;
    else if (!best) best = sol;
    if (problem.builtin && best.converged && tried >= 2) break;
    // enough: the same minimum found three more times, or the work budget spent (no hang on big data)
    if (multiStart && best.converged && (agreeing >= 3 || pointEvaluations > MULTI_START_BUDGET)) break;
  }
  if (multiStart && best?.converged) {
    const polished = solveFrom(problem, y, best.p);
    if (polished.converged && polished.rss <= best.rss) best = { ...polished, iterations: best.iterations + polished.iterations, evaluations: best.evaluations + polished.evaluations };
  }
  return { ...(best as Solution), startsTried: tried };
}
