/**
 * A fitted heater curve from the fitting engine (analysis/fit), ready to evaluate at any flow
 * and inlet temperature with any parameter vector (for delta-method uncertainty of derived
 * quantities). Covariates: Tin = the chosen inlet temperature; rho and cp (coil model) = IF97 at
 * the inlet temperature, so mass flow is ρ(Tin)·V̇; any other covariate is held at its mean over
 * the fitted data.
 */
import { predictAt, type BandPoint, type FitSuccess } from '../fit';
import { compileCached } from '../fit/prepare-problem';
import { requireFinite } from '../units/guards';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';

/** A fitted curve with its parameters and covariance. */
export interface FittedCurve {
  model: string;
  parameterNames: string[];
  values: number[];
  covariance: number[][];
  /** [min, max] of the tested volume flows, m³/s */
  xRange: [number, number];
  /** the range of inlet temperatures in the fitted data, °C (null when the fit had no Tin) */
  fittedInletRangeC: [number, number] | null;
  /** true for the physical coil model, which holds at any inlet temperature */
  inletTransferable: boolean;
  /** outlet temperatures, °C, at flows x (m³/s) and one inlet temperature, for parameters p */
  evaluate(p: ArrayLike<number>, x: number[], inletTempC: number): Float64Array;
  /** the engine's intervals (confidence for the mean, prediction for one trial) at flows x */
  band(x: number[], inletTempC: number, level?: number): BandPoint[];
}

/**
 * The covariates of a heater model at one inlet temperature, the module's rule: Tin = the inlet,
 * rho and cp = IF97 at the inlet (ṁ = ρ(Tin)·V̇), any other covariate its mean over the fitted data.
 * @param names covariate names the model uses
 * @param m points
 * @param inletC inlet temperature, °C (0–100)
 * @param means fallback values by name (a fit's `spec.covariateMeans`)
 * @throws RangeError for an inlet outside the liquid range, or a covariate with no value
 * @example heaterCovariates(['Tin', 'rho', 'cp'], 2, 20) // { Tin: [20, 20], rho: [998.2, 998.2], cp: [4184.4, 4184.4] }
 */
export function heaterCovariates(names: string[], m: number, inletC: number, means: Record<string, number> = {}): Record<string, number[]> {
  const out: Record<string, number[]> = {};
  for (const name of names) {
    let v: number;
    if (name === 'Tin') v = requireFinite(inletC, 'inletTempC');
    else if (name === 'rho') v = waterDensityKgPerM3(inletC, undefined, 'inletTempC');
    else if (name === 'cp') v = waterCpJPerKgK(inletC, undefined, 'inletTempC');
    else if (typeof means[name] === 'number') v = means[name];
    else throw new RangeError(`no value for the covariate ${name}`);
    out[name] = new Array(m).fill(v);
  }
  return out;
}

/**
 * Wraps a successful fit.
 * @throws RangeError when the fit's expression cannot be compiled (should not happen for a fit
 *   the engine produced).
 * @example fittedCurve(fit).evaluate([fit.params.Ts.value, fit.params.UA.value], [2e-4], 20)
 */
export function fittedCurve(fit: FitSuccess): FittedCurve {
  const spec = fit.spec;
  const compiled = compileCached(spec.expression, spec.parameterNames, spec.covariateNames);
  if (!compiled.ok) throw new RangeError(`cannot evaluate the fitted model: ${compiled.reason}`);
  const model = compiled.model;
  const tin = spec.covariates.Tin;
  // The covariates at one inlet are the same for every flow and parameter vector: a flow search or a
  // delta-method gradient evaluates the curve thousands of times at one inlet, so the IF97 values
  // are worked out once per inlet temperature (the values are identical, only not recomputed).
  const perInlet = new Map<number, Record<string, number>>();
  const covFor = (m: number, inletC: number): Record<string, number[]> => {
    let one = perInlet.get(inletC);
    if (!one) {
      const c = heaterCovariates(model.covariates, 1, inletC, spec.covariateMeans);
      one = Object.fromEntries(Object.entries(c).map(([k, v]) => [k, v[0]]));
      if (perInlet.size > 64) perInlet.clear();
      perInlet.set(inletC, one);
    }
    const out: Record<string, number[]> = {};
    for (const k in one) out[k] = new Array(m).fill(one[k]);
    return out;
  };
  return {
    model: fit.model,
    parameterNames: spec.parameterNames.slice(),
    values: spec.parameterNames.map((k) => fit.params[k].value),
    covariance: fit.covariance,
    xRange: fit.xRange,
    fittedInletRangeC: tin && tin.length ? [Math.min(...tin), Math.max(...tin)] : null,
    inletTransferable: fit.model === 'coil',
    evaluate(p, x, inletTempC) {
      requireFinite(inletTempC, 'inletTempC');
      const cov = covFor(x.length, inletTempC);
      const out = new Float64Array(x.length);
      model.values(p, x, model.covariates.map((n) => cov[n]), out);
      return out;
    },
    band(x, inletTempC, level = fit.level) {
      return predictAt(fit, x, covFor(x.length, inletTempC), level);
    },
  };
}

/**
 * Standard uncertainty of a derived scalar g(p) by the delta method with central differences:
 * u² = ∇gᵀ·C·∇g, step 1e-3 of each parameter's standard error.
 * @returns the standard uncertainty, or null when g cannot be evaluated near the estimate
 * @example deltaMethodU(curve, (p) => 1 / p[1])
 */
export function deltaMethodU(curve: Pick<FittedCurve, 'values' | 'covariance'>, g: (p: number[]) => number | null): number | null {
  const p0 = curve.values;
  const n = p0.length;
  const grad: number[] = [];
  for (let j = 0; j < n; j++) {
    const se = Math.sqrt(Math.max(curve.covariance[j][j], 0));
    const h = se > 0 ? se * 1e-3 : Math.max(Math.abs(p0[j]) * 1e-7, 1e-12);
    const up = p0.slice(); up[j] += h;
    const dn = p0.slice(); dn[j] -= h;
    const a = g(up), b = g(dn);
    if (a === null || b === null || !Number.isFinite(a) || !Number.isFinite(b)) return null;
    grad.push((a - b) / (2 * h));
  }
  let v = 0;
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) v += grad[a] * curve.covariance[a][b] * grad[b];
  return Math.sqrt(Math.max(v, 0));
}
