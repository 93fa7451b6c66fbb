import { fittedCurve, type FittedCurve } from './fitted-curve';
import { prepareProblem } from './prepare-problem';
import { mulberry32 } from './random';
import { solveFrom } from './solve-problem';
import type { FitSuccess } from './types';

/** Bootstrap distribution summary of a derived quantity. */
export interface BootstrapResult {
  ok: true;
  /** the quantity at the original fit (null when undefined there) */
  estimate: number | null;
  mean: number;
  sd: number;
  /** percentile interval at `level` */
  ciLow: number;
  ciHigh: number;
  level: number;
  resamples: number;
  /** resamples where the refit converged and the quantity was defined */
  defined: number;
  /** resamples whose refit failed */
  failures: number;
  seed: number;
}

/**
 * Bootstrap interval for a quantity derived from a fitted model (e.g. the flow of maximum heat), by
 * residual resampling: yᵢ* = ŷᵢ + uⱼ/√wᵢ with u the centred leverage-adjusted weighted residuals
 * √wᵢ·eᵢ/√(1 − hᵢ) drawn with replacement (A. C. Davison & D. V. Hinkley, Bootstrap Methods and their
 * Application, Cambridge 1997, Algorithm 6.3); each resample is refitted by LM from the fitted
 * parameters; the interval is the percentile interval. Seeded, so reproducible.
 *
 * @param fit - a successful fit
 * @param derived - the quantity from a fitted curve (return null, or throw, where it is undefined)
 * @param options.resamples - number of resamples (default 1000)
 * @param options.seed - seed of the generator (default 1)
 * @param options.level - interval level in (0, 1), default 0.95
 * @returns the summary, or `{ ok: false, reason }` when fewer than half the resamples give a value
 * @throws RangeError for resamples < 10 or a level outside (0, 1)
 * @example bootstrapDerived(fit, (c) => heatOptimum(c).flowM3PerS, { seed: 7 })
 */
export function bootstrapDerived(fit: FitSuccess, derived: (curve: FittedCurve) => number | null, options: { resamples?: number; seed?: number; level?: number } = {}): BootstrapResult | { ok: false; reason: string } {
  const resamples = options.resamples ?? 1000;
  const seed = options.seed ?? 1;
  const level = options.level ?? 0.95;
  if (!(level > 0 && level < 1)) throw new RangeError(`bootstrapDerived: level must be in (0, 1), got ${level}`);
  const boot = bootstrapParameters(fit, { resamples, seed });
  if (!boot.ok) return boot;
  const { spec } = fit;
  const safe = (c: FittedCurve): number | null => {
    try {
      const v = derived(c);
      return typeof v === 'number' && Number.isFinite(v) ? v : null;
    } catch {
      return null;
    }
  };
  const estimate = safe(fittedCurve(fit));
  const values: number[] = [];
  for (const p of boot.samples) {
    const v = safe(fittedCurve(spec, Object.fromEntries(spec.parameterNames.map((k, j) => [k, p[j]]))));
    if (v !== null) values.push(v);
  }
  if (values.length < resamples / 2) return { ok: false, reason: `the quantity was defined in only ${values.length} of ${resamples} resamples` };
  const s = percentileSummary(values, level);
  return { ok: true, estimate, ...s, level, resamples, defined: values.length, failures: boot.failures, seed };
}

/**
 * The parameter vectors of the residual-bootstrap refits behind {@link bootstrapDerived} (same
 * resampling, same generator), for quantities that combine several fits.
 * @param fit - a successful fit
 * @param options.resamples - number of resamples (default 1000, at least 10)
 * @param options.seed - seed of the generator (default 1)
 * @returns one parameter vector (in `fit.parameterNames` order) per converged refit, and the number that failed
 * @throws RangeError for resamples < 10
 * @example bootstrapParameters(fit, { resamples: 200, seed: 3 }).samples.length
 */
export function bootstrapParameters(fit: FitSuccess, options: { resamples?: number; seed?: number } = {}): { ok: true; samples: number[][]; failures: number } | { ok: false; reason: string } {
  const resamples = options.resamples ?? 1000;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(resamples) || resamples < 10) throw new RangeError(`bootstrapDerived: resamples must be an integer ≥ 10, got ${resamples}`);
  const { spec } = fit;
  const start = Object.fromEntries(spec.parameterNames.map((k) => [k, fit.params[k].value]));
  const prep = prepareProblem({ x: spec.x, y: spec.y, model: spec.model, weights: spec.weights ?? undefined, covariates: spec.covariates, bounds: spec.bounds, start });
  if (!prep.ok) return { ok: false, reason: prep.reason };
  const problem = prep.problem;
  const m = spec.x.length;
  const sw = problem.sw;
  const u = fit.residuals.map((e, i) => (sw[i] * e) / Math.sqrt(Math.max(1e-12, 1 - fit.leverage[i])));
  const uMean = u.reduce((a, b) => a + b, 0) / m;
  for (let i = 0; i < m; i++) u[i] -= uMean;
  const rand = mulberry32(seed);
  const p0 = spec.parameterNames.map((k) => fit.params[k].value);
  const samples: number[][] = [];
  let failures = 0;
  const yStar = new Float64Array(m);
  for (let b = 0; b < resamples; b++) {
    for (let i = 0; i < m; i++) yStar[i] = fit.fitted[i] + u[Math.floor(rand() * m)] / sw[i];
    const sol = solveFrom(problem, yStar, p0, { ftol: 1e-12, xtol: 1e-12, gtol: 0, factor: 100 }, 0);
    if (!sol.converged || !sol.p.every(Number.isFinite)) {
      failures++;
      continue;
    }
    samples.push(Array.from(sol.p));
  }
  return { ok: true, samples, failures };
}

/**
 * Mean, SD and percentile interval of a sample (linear interpolation between order statistics).
 * @param values - the sample (not empty); sorted in place
 * @param level - interval level in (0, 1)
 * @example percentileSummary([1, 2, 3, 4], 0.5) // { mean: 2.5, sd: 1.29, ciLow: 1.75, ciHigh: 3.25 }
 */
export function percentileSummary(values: number[], level: number): { mean: number; sd: number; ciLow: number; ciHigh: number } {
  values.sort((a, b) => a - b);
  const q = (prob: number): number => {
    const h = (values.length - 1) * prob;
    const lo = Math.floor(h);
    return values[lo] + (h - lo) * ((values[Math.min(lo + 1, values.length - 1)] ?? values[lo]) - values[lo]);
  };
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  const sd = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / Math.max(1, values.length - 1));
  return { mean, sd, ciLow: q((1 - level) / 2), ciHigh: q((1 + level) / 2) };
}
