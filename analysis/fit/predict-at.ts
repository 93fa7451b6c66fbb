import { studentTQuantile } from '../stats/distributions';
import { compileCached } from './prepare-problem';
import type { BandPoint, FitSuccess } from './types';

/**
 * Predictions of a fitted model with t-based confidence intervals for the mean and prediction
 * intervals for one new observation: se_mean = √(gᵀ C g) with g = ∂f/∂p at x and C the parameter
 * covariance (delta method); se_pred = √(se_mean² + s²·v), v = 1 unweighted, mean(1/w) weighted.
 *
 * @param fit - a successful fit from {@link fitModel}
 * @param x - where to predict (unit of the fit's x; heater built-ins: m³/s)
 * @param covariates - per-point covariates by name; any the model needs but not given are held at
 *   their mean over the fitted data (e.g. Tin, °C)
 * @param level - confidence level in (0, 1), default 0.95
 * @returns one {@link BandPoint} per x (units of y), `extrapolated` outside the fitted x range
 * @throws RangeError for a non-finite x, covariate arrays of the wrong length, a level outside (0, 1),
 *   or a model that cannot be evaluated at some x
 * @example predictAt(fit, [2e-4], { Tin: [20] })[0].ciHigh
 */
export function predictAt(fit: FitSuccess, x: number[], covariates: Record<string, number[]> = {}, level = 0.95): BandPoint[] {
  if (!(level > 0 && level < 1)) throw new RangeError(`predictAt: level must be in (0, 1), got ${level}`);
  const m = x.length;
  x.forEach((v, i) => {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`predictAt: x[${i}] is not a finite number (got ${v})`);
  });
  const { spec } = fit;
  const compiled = compileCached(spec.expression, spec.parameterNames, spec.covariateNames);
  if (!compiled.ok) throw new RangeError(`predictAt: ${compiled.reason}`);
  const model = compiled.model;
  const cov = model.covariates.map((name) => {
    const given = covariates[name];
    if (given === undefined) return new Float64Array(m).fill(spec.covariateMeans[name]);
    if (given.length !== m || given.some((v) => !Number.isFinite(v))) throw new RangeError(`predictAt: covariate ${name} must have ${m} finite values`);
    return Float64Array.from(given);
  });
  // typed arrays, as everywhere else the compiled model is called (one kind of argument keeps it optimised)
  const p = new Float64Array(spec.parameterNames.map((k) => fit.params[k].value));
  const n = p.length;
  const xs = new Float64Array(x);
  const f = new Float64Array(m);
  const g = new Float64Array(m * n);
  model.values(p, xs, cov, f);
  model.gradient(p, xs, cov, g);
  const t = level === fit.level ? fit.tQuantile : studentTQuantile((1 + level) / 2, fit.df); // the fit's own t at its own level
  const s2 = fit.residualSD ** 2;
  const [lo, hi] = fit.xRange;
  const slack = 1e-12 * Math.max(Math.abs(lo), Math.abs(hi));
  const band: BandPoint[] = [];
  for (let i = 0; i < m; i++) {
    let v = 0;
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) v += g[i + a * m] * fit.covariance[a][b] * g[i + b * m];
    const seMean = Math.sqrt(Math.max(0, v));
    const sePred = Math.sqrt(seMean * seMean + s2 * spec.predictionVarianceFactor);
    const y = f[i];
    if (!Number.isFinite(y) || !Number.isFinite(seMean)) throw new RangeError(`predictAt: the model cannot be evaluated at x = ${x[i]}`);
    band.push({
      x: x[i], y, seMean,
      ciLow: y - t * seMean, ciHigh: y + t * seMean,
      piLow: y - t * sePred, piHigh: y + t * sePred,
      extrapolated: x[i] < lo - slack || x[i] > hi + slack,
    });
  }
  return band;
}
