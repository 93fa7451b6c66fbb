import { compileCached } from './prepare-problem';
import type { FitSpec, FitSuccess } from './types';

/** A fitted model as a function: parameters plus an evaluator (used by derived quantities and the bootstrap). */
export interface FittedCurve {
  spec: FitSpec;
  params: Record<string, number>;
  /**
   * Model values at x (units of y); covariates the model needs and not given are held at their mean
   * over the fitted data. Non-finite values are returned as they come (callers decide).
   */
  predict(x: ArrayLike<number>, covariates?: Record<string, ArrayLike<number> | number>): Float64Array;
}

/**
 * Wraps parameters of a fitted model as a {@link FittedCurve}.
 * @param spec - the fit's spec (from `FitSuccess.spec`)
 * @param params - parameter values by name (default: the fit's own, when a FitSuccess is passed)
 * @returns the curve
 * @throws RangeError when the spec's expression cannot be compiled or a parameter is missing
 * @example fittedCurve(fit).predict([2e-4], { Tin: 20 })
 */
export function fittedCurve(fit: FitSuccess | FitSpec, params?: Record<string, number>): FittedCurve {
  const spec = 'spec' in fit ? fit.spec : fit;
  const values = params ?? ('spec' in fit ? Object.fromEntries(Object.entries(fit.params).map(([k, v]) => [k, v.value])) : undefined);
  if (!values) throw new RangeError('fittedCurve: parameter values are required with a bare spec');
  const compiled = compileCached(spec.expression, spec.parameterNames, spec.covariateNames);
  if (!compiled.ok) throw new RangeError(`fittedCurve: ${compiled.reason}`);
  const model = compiled.model;
  const p = spec.parameterNames.map((k) => {
    if (typeof values[k] !== 'number') throw new RangeError(`fittedCurve: no value for parameter ${k}`);
    return values[k];
  });
  return {
    spec,
    params: values,
    predict(x, covariates = {}) {
      const m = x.length;
      const cov = model.covariates.map((name) => {
        const c = covariates[name];
        if (c === undefined) return new Float64Array(m).fill(spec.covariateMeans[name]);
        if (typeof c === 'number') return new Float64Array(m).fill(c);
        return Float64Array.from(c);
      });
      const out = new Float64Array(m);
      model.values(p, x, cov, out);
      return out;
    },
  };
}
