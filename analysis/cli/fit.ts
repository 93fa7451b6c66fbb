/**
 * `npm run -s analysis -- fit < input.json`: one fit, for batch use and outside checks.
 * Malformed input (not an object, x/y not arrays of numbers, model not a string, …) throws
 * InputError (exit 2); a fit that cannot be done prints {"ok":false,"reason":…} (exit 0).
 */
import { fitModel } from '../fit';
import type { FitInput, FitSuccess } from '../fit';
import { InputError } from '../units/reading-input';

export const help = `fit: least-squares fit of a model to x/y data (solver checked against NIST StRD)

usage: npm run -s analysis -- fit < input.json

input (one JSON object):
  x          array of numbers (built-in heater models: volume flow, m³/s)
  y          array of numbers, same length (built-in heater models: outlet temperature, °C)
  model      a built-in name — coil, exp-approach, exp-inlet, poly1, poly2, poly3, power —
             or a mathjs expression in x, e.g. "b1*(1-exp(-b2*x))"
  start      optional {name: value}; for an expression its keys are the parameters
             (without it every free symbol other than x and covariates is a parameter)
  weights    optional array of weights 1/u² (u = standard uncertainty of each y)
  covariates optional {name: array}; coil needs Tin (°C) and takes rho (kg/m³; default IAPWS-IF97
             at each outlet temperature, the bucket's water) and cp (J/(kg·K); default IAPWS-IF97
             at the mean of inlet and outlet), the same water as the coil command; exp-inlet needs Tin
  bounds     optional {name: [low, high]} (null for an open side)
  level      optional confidence level, default 0.95
  detail     optional "full" to print every statistic, diagnostic and band point

output (one JSON object):
  {"ok":true, "model":…, "params":{"b1":{"value":…,"stdErr":…,"ciLow":…,"ciHigh":…,"identifiable":true},…},
   "rss":…, "residualSD":…, "df":…, "r2":…, "aicc":…, "iterations":…, "converged":true,
   "stoppingReason":…, "warnings":[…]}
  a parameter the data cannot determine has "identifiable":false, stdErr/ciLow/ciHigh null and a
  warning starting "not identifiable: <name>"
  or {"ok":false, "code":…, "reason":…} when the fit cannot be done (exit code 0).

exit codes: 0 result printed (ok true or false), 2 malformed input (the message on stderr):
  not an object, x/y not arrays of numbers or of different lengths, numbers too large for double
  precision, weights not > 0, bounds with low ≥ high, level outside (0, 1), a missing covariate.`;

function checkNumbers(name: string, v: unknown): void {
  if (!Array.isArray(v)) throw new InputError(`${name} must be an array of numbers`);
  v.forEach((e, i) => {
    if (typeof e !== 'number') throw new InputError(`${name}[${i}] is not a number (got ${JSON.stringify(e)})`);
  });
}

/** Runs one fit from parsed JSON input and returns the JSON-ready output. */
export function run(input: unknown): unknown {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) throw new InputError('input must be one JSON object');
  const o = input as Record<string, unknown>;
  checkNumbers('x', o.x);
  checkNumbers('y', o.y);
  if (typeof o.model !== 'string') throw new InputError('model must be a string (a built-in name or an expression in x)');
  if (o.weights !== undefined) checkNumbers('weights', o.weights);
  if (o.start !== undefined && (typeof o.start !== 'object' || o.start === null || Array.isArray(o.start))) throw new InputError('start must be an object of numbers');
  if (o.covariates !== undefined) {
    if (typeof o.covariates !== 'object' || o.covariates === null || Array.isArray(o.covariates)) throw new InputError('covariates must be an object of arrays');
    for (const [k, v] of Object.entries(o.covariates)) checkNumbers(`covariates.${k}`, v);
  }
  if (o.detail !== undefined && o.detail !== 'full') throw new InputError('detail must be "full" when given');
  const fit = fitModel(o as unknown as FitInput);
  // malformed input (mismatched lengths, numbers that overflow, non-positive weights, bad bounds or
  // level, a missing covariate) exits 2 as promised; a fit that cannot be done is a result
  if (!fit.ok && fit.code === 'invalid-input') throw new InputError(fit.reason);
  if (!fit.ok) return fit;
  if (o.detail === 'full') {
    const { spec: _spec, ...rest } = fit;
    return rest;
  }
  return summary(fit);
}

function summary(fit: FitSuccess) {
  const unidentified = new Set(fit.warnings.filter((w) => w.code === 'not-identifiable').map((w) => w.parameter));
  return {
    ok: true,
    model: fit.model,
    params: Object.fromEntries(
      fit.parameterNames.map((k) => {
        const p = fit.params[k];
        // a parameter the data cannot determine has no standard error or interval worth printing
        if (unidentified.has(k)) return [k, { value: p.value, stdErr: null, ciLow: null, ciHigh: null, identifiable: false }];
        return [k, { value: p.value, stdErr: p.stdErr, ciLow: p.ciLow, ciHigh: p.ciHigh, identifiable: true }];
      }),
    ),
    rss: fit.rss,
    residualSD: fit.residualSD,
    df: fit.df,
    r2: fit.r2,
    aicc: fit.aicc,
    iterations: fit.iterations,
    converged: fit.converged,
    stoppingReason: fit.stoppingReason,
    warnings: fit.warnings.map((w) => w.message),
  };
}
