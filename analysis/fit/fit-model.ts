import { extent } from '../stats/extent';
import { firstNonFinitePath } from '../units/guards';
import { compensatedSum, compensatedSumOfSquares } from '../stats/compensated-sum';
import { studentTQuantile, studentTSf } from '../stats/distributions';
import { informationCriteria } from './information-criteria';
import { extendedResiduals } from './extended-residuals';
import { analyseJacobian } from './jacobian-analysis';
import { lackOfFit } from './lack-of-fit';
import { polishSolution } from './polish-solution';
import { predictAt } from './predict-at';
import { prepareProblem, type Problem } from './prepare-problem';
import { groupReplicates } from './replicates';
import { residualDiagnostics } from './residual-diagnostics';
import { unidentifiedParameters } from './identifiability';
import { solveProblem, type Solution } from './solve-problem';
import type { FitFailure, FitInput, FitResult, FitSpec, FitSuccess, FitWarning, ParameterEstimate } from './types';

const CORRELATION_WARNING = 0.95;
const ILL_CONDITIONED = 1e8;

/**
 * Fits a model to (x, y) by weighted least squares and returns everything a reviewer needs:
 * parameters with standard errors, t intervals, covariance and correlation; RSS, residual SD, R²,
 * AIC/AICc/BIC; residual diagnostics (standardized, studentized, leverage, Cook's distance, flags);
 * confidence and prediction bands on a grid; replicate groups with the pure-error lack-of-fit test;
 * the solver's iterations and stopping reason; and warnings.
 *
 * Method: polynomials by Householder QR with iterative refinement; everything else by
 * Levenberg–Marquardt (MINPACK design, analytic Jacobian from mathjs `derivative`), with
 * automatic starting values for every built-in. Standard errors use s² = RSS/df and (JᵀJ)⁻¹ from a
 * pivoted QR of the final weighted Jacobian. Units are the caller's: SI for the heater built-ins
 * (x in m³/s, temperatures in °C, UA in W/K).
 *
 * Degenerate input (non-finite cells, mismatched lengths, too few points, all x equal, unknown
 * symbols or syntax errors, no convergence, unidentifiable parameters) gives
 * `{ ok: false, code, reason }`; the function never throws and never returns NaN.
 *
 * @param input - data, model and options, see {@link FitInput}
 * @returns {@link FitSuccess} or {@link FitFailure}
 * @example fitModel({ x: flows, y: tout, model: 'coil', covariates: { Tin: tin, rho, cp } })
 */
export function fitModel(input: FitInput): FitResult {
  try {
    const prep = prepareProblem(input);
    if (!prep.ok) return prep;
    const level = input.level ?? 0.95;
    if (typeof level !== 'number' || !(level > 0 && level < 1)) return { ok: false, code: 'invalid-input', reason: `level must be in (0, 1), got ${level}` };
    const problem = prep.problem;
    const sol = solveProblem(problem);
    if (!sol.converged) {
      const evaluable = Number.isFinite(sol.rss) && !sol.unevaluable;
      return {
        ok: false,
        code: evaluable ? 'no-convergence' : 'bad-start',
        reason: evaluable
          ? `the fit did not converge (${sol.reason} after ${sol.evaluations} evaluations); try other start values or a simpler model`
          : `the model or its derivatives give non-finite values at the starting values tried (${problem.parameters.join(', ')})${problem.builtin?.requirement ? `; ${problem.builtin.requirement}` : ''}; give start values where it can be evaluated`,
      };
    }
    return summarise(problem, sol, input, level);
  } catch (e) {
    return { ok: false, code: 'invalid-input', reason: `the fit could not be done: ${(e as Error).message}` };
  }
}

/**
 * Builds the full result from a converged solution (after the extended-precision polish): all the
 * statistics, diagnostics, bands, replicates and warnings of {@link FitSuccess}. Used by fitModel.
 * @param problem - the prepared problem
 * @param solved - a converged solution of it
 * @param input - the original input (grid, replicate tolerance)
 * @param level - confidence level in (0, 1)
 * @returns the result, or a failure when the Jacobian at the solution is singular or the model not finite
 * @example summarise(problem, solveProblem(problem), input, 0.95)
 */
export function summarise(problem: Problem, solved: Solution, input: FitInput, level: number): FitSuccess | FitFailure {
  const { x, y, sw, weights, compiled, parameters: names } = problem;
  let sol = solved;
  const m = x.length;
  const n = names.length;
  let polishedResiduals: Float64Array | null = null;
  if (sol.method === 'levenberg-marquardt') {
    const polished = polishSolution(problem, sol.p);
    sol = { ...sol, p: polished.p };
    polishedResiduals = polished.residuals;
  }
  const f = new Float64Array(m);
  const jac = new Float64Array(m * n);
  compiled.values(sol.p, x, problem.cov, f);
  compiled.gradient(sol.p, x, problem.cov, jac);
  weightRows(jac, sw, m, n);
  if (!f.every(Number.isFinite) || !sol.p.every(Number.isFinite)) {
    return { ok: false, code: 'no-convergence', reason: 'the fit ended where the model is not finite' };
  }
  const ja = analyseJacobian(jac, m, n, names);
  if (!ja.ok) return { ok: false, code: 'singular', reason: ja.reason };
  const { inverse, leverage, conditionNumber } = ja.analysis;
  // the polish ends with the extended residuals at its result: the same evaluation, not repeated
  const precise = polishedResiduals ?? new Float64Array(m);
  const extended = polishedResiduals !== null || extendedResiduals(problem.expression, names, compiled.covariates, sol.p, x, problem.cov, y, precise);
  const residuals = filled(m, (i) => (extended ? precise[i] : y[i] - f[i]));
  const wres = filled(m, (i) => sw[i] * residuals[i]);
  const rss = compensatedSumOfSquares(wres);
  const df = m - n;
  const s2 = rss / df;
  const s = Math.sqrt(s2);
  const t = studentTQuantile((1 + level) / 2, df);
  const warnings: FitWarning[] = [...problem.warnings];

  const covariance = filled(n, (i) => filled(n, (j) => (s2 === 0 ? 0 : s2 * inverse[i * n + j])));
  const se = filled(n, (j) => Math.sqrt(Math.max(0, covariance[j][j])));
  const correlation = filled(n, (i) => filled(n, (j) => (i === j ? 1 : se[i] > 0 && se[j] > 0 ? covariance[i][j] / (se[i] * se[j]) : 0)));
  const params: Record<string, ParameterEstimate> = {};
  names.forEach((k, j) => {
    const v = sol.p[j];
    const [lo, hi] = problem.bounds[j];
    const tol = 1e-6 * (Number.isFinite(hi - lo) ? hi - lo : Math.max(1, Math.abs(v)));
    const atBound = v - lo <= tol ? 'lower' : hi - v <= tol ? 'upper' : null;
    if (atBound) warnings.push({ code: 'at-bound', message: `${k} = ${v.toPrecision(6)} sits on its ${atBound} bound: its standard error and interval are not reliable` });
    params[k] = {
      value: v,
      stdErr: se[j],
      ciLow: v - t * se[j],
      ciHigh: v + t * se[j],
      tValue: se[j] > 0 ? v / se[j] : null,
      pValue: se[j] > 0 ? Math.min(1, 2 * studentTSf(Math.abs(v / se[j]), df)) : null,
      atBound,
    };
  });
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (Math.abs(correlation[i][j]) > CORRELATION_WARNING) {
        warnings.push({ code: 'high-correlation', message: `${names[i]} and ${names[j]} are strongly correlated (r = ${correlation[i][j].toFixed(3)}): the data cannot tell them apart well; report the covariance, not two separate errors` });
      }
    }
  }
  for (const u of unidentifiedParameters(problem, sol.p, jac, inverse, s, t)) {
    const where = u.side === 'both' ? 'on both sides' : u.side === 'below' ? 'below the estimate' : 'above the estimate';
    warnings.push({
      code: 'not-identifiable', parameter: u.name,
      message: `not identifiable: ${u.name} — the data cannot determine it: the residual sum of squares stays flat across its ${Number((level * 100).toPrecision(4))} % interval ${where}, so its standard error and interval are not meaningful; add trials that move it (for a coil: low flows for Ts, a spread of outlet temperatures for UA) or fix it`,
    });
  }
  if (conditionNumber > ILL_CONDITIONED) warnings.push({ code: 'ill-conditioned', message: `the Jacobian is ill-conditioned (condition number ${conditionNumber.toExponential(1)}): parameters are poorly determined and sensitive to the data` });
  if (!compiled.analytic.every(Boolean)) warnings.push({ code: 'numeric-jacobian', message: `no analytic derivative for ${names.filter((_, j) => !compiled.analytic[j]).join(', ')}: central differences were used` });
  if (!problem.userStart && !problem.builtin) warnings.push({ code: 'auto-start', message: `no start values given: ${sol.startsTried} automatic starting points were tried and the best fit kept; check it is the one you expect` });
  physicalChecks(problem, sol.p, warnings);

  const sumW = weights ? compensatedSum(weights) : m;
  const yBar = weights ? compensatedSum(filled(m, (i) => y[i] * weights[i])) / sumW : compensatedSum(y) / m;
  const sst = compensatedSumOfSquares(filled(m, (i) => sw[i] * (y[i] - yBar)));
  const r2 = sst > 0 ? 1 - rss / sst : null;
  const adjustedR2 = r2 === null ? null : 1 - ((1 - r2) * (m - 1)) / df;
  const sumLogW = weights ? compensatedSum(filled(m, (i) => Math.log(weights[i]))) : 0;
  const ic = informationCriteria(rss, m, n, sumLogW);
  if (rss === 0) warnings.push({ code: 'exact-fit', message: 'the model passes exactly through every point: residual-based statistics are zero and information criteria undefined' });

  const { standardizedResiduals, studentizedResiduals, cooksDistance, dffits, flags } = residualDiagnostics(wres, leverage, s, df, n);

  const [xMin, xMax] = extent(x);
  const covariateMeans: Record<string, number> = Object.fromEntries(Object.entries(problem.covariates).map(([k, v]) => [k, compensatedSum(v) / m]));
  const spec: FitSpec = {
    model: problem.modelName,
    expression: problem.expression,
    parameterNames: names,
    covariateNames: compiled.covariates,
    x: filled(m, (i) => x[i]),
    y: filled(m, (i) => y[i]),
    weights: weights ? filled(m, (i) => weights[i]) : null,
    covariates: Object.fromEntries(Object.entries(problem.covariates).map(([k, v]) => [k, filled(m, (i) => v[i])])),
    bounds: Object.fromEntries(names.map((k, j) => [k, finiteOrNull(problem.bounds[j])])),
    covariateMeans,
    predictionVarianceFactor: weights ? compensatedSum(filled(m, (i) => 1 / weights[i])) / m : 1,
  };
  const groups = groupReplicates(x, y, input.replicateTolerance);
  const replicates = groups.filter((g) => g.n > 1);
  const result: FitSuccess = {
    ok: true,
    model: problem.modelName,
    expression: problem.expression,
    method: sol.method,
    parameterNames: names,
    params,
    covariance,
    correlation,
    n: m,
    p: n,
    df,
    rss,
    residualSD: s,
    r2,
    adjustedR2,
    rmse: Math.sqrt(rss / m),
    ...ic,
    level,
    tQuantile: t,
    fitted: filled(m, (i) => f[i]),
    residuals,
    standardizedResiduals,
    studentizedResiduals,
    leverage: filled(m, (i) => leverage[i]),
    cooksDistance,
    dffits,
    flags,
    band: [],
    iterations: sol.iterations,
    evaluations: sol.evaluations,
    converged: true,
    stoppingReason: sol.reason,
    conditionNumber,
    jacobian: sol.method === 'linear-qr' ? 'linear' : compiled.analytic.every(Boolean) ? 'analytic' : compiled.analytic.some(Boolean) ? 'mixed' : 'numeric',
    xRange: [xMin, xMax],
    replicates,
    lackOfFit: replicates.length > 0 ? lackOfFit(y, weights, rss, groups, n) : null,
    warnings,
    spec,
  };
  const from = input.grid?.from ?? xMin;
  const to = input.grid?.to ?? xMax;
  const points = Math.max(2, Math.min(1000, Math.round(input.grid?.points ?? 41)));
  if (Number.isFinite(from) && Number.isFinite(to) && to > from) {
    const gx = filled(points, (k) => from + ((to - from) * k) / (points - 1));
    try {
      result.band = predictAt(result, gx, {}, level);
    } catch {
      result.band = [];
    }
    if (from < xMin || to > xMax) warnings.push({ code: 'extrapolation', message: `the band runs outside the data range [${xMin}, ${xMax}]: predictions there are extrapolations` });
  }
  const bad = firstNonFinitePath(result, 'result'); // NaN never leaves fitModel
  if (bad) {
    return { ok: false, code: 'out-of-range', reason: `the statistics overflow or underflow double precision (${bad}); rescale x or y (for example to other units) and fit again` };
  }
  return result;
}

/** jac[i + j·m] ·= sw[i] for every column j (in a function of its own: optimised while summarise is not yet). */
function weightRows(jac: Float64Array, sw: Float64Array, m: number, n: number): void {
  for (let j = 0; j < n; j++) for (let i = 0; i < m; i++) jac[i + j * m] *= sw[i];
}

/**
 * [value(0), …, value(k − 1)] built by appending: every such array has the same packed layout
 * (`map` gives holey ones once V8 optimises its caller, and code reading both kinds was deoptimised
 * again and again), and it is much quicker than `Array.from` over a typed array.
 */
function filled<T>(k: number, value: (i: number) => T): T[] {
  const out: T[] = [];
  for (let i = 0; i < k; i++) out.push(value(i));
  return out;
}

/** A [low, high] bound pair with null for an infinite end (written out: a `map` here kept deoptimising summarise). */
function finiteOrNull([lo, hi]: [number, number]): [number | null, number | null] {
  return [Number.isFinite(lo) ? lo : null, Number.isFinite(hi) ? hi : null];
}

/** Physical sanity of the heater built-ins (DOMAIN.md §7 item 6). */
function physicalChecks(problem: Problem, p: Float64Array, warnings: FitWarning[]): void {
  const name = problem.builtin?.name;
  const yMax = extent(problem.y)[1];
  if (name === 'coil') {
    if (p[0] < yMax) warnings.push({ code: 'unphysical', message: `fitted source temperature Ts = ${p[0].toFixed(2)} °C is below the hottest observed outlet (${yMax.toFixed(2)} °C)` });
    if (!(p[1] > 0)) warnings.push({ code: 'unphysical', message: `fitted UA = ${p[1].toPrecision(4)} W/K is not positive` });
  } else if (name === 'exp-inlet') {
    warnings.push({ code: 'unphysical', message: 'Tout = Tin + A·exp(−kQ) always puts a heat maximum at Q = 1/k whatever the hardware does; check the residual pattern against the coil model' });
  } else if (name === 'exp-approach') {
    const tinMin = problem.covariates.Tin ? extent(problem.covariates.Tin)[0] : null;
    if (tinMin !== null && p[0] > tinMin) warnings.push({ code: 'unphysical', message: `fitted asymptote Tinf = ${p[0].toFixed(2)} °C is above the inlet: heat would grow without bound at high flow` });
  }
}
