/**
 * A heater model (x = volume flow m³/s, y = outlet °C) evaluated with its sensitivities ∂y/∂θ at
 * chosen parameters, flows and one inlet temperature: the rows of the Jacobian that experimental
 * design works with. The model is compiled once by the fitting engine (analytic mathjs derivatives);
 * covariates follow `heaterCovariates` (Tin, and rho and cp from IF97 at the inlet).
 */
import { BUILTIN_MODELS, type FitSuccess } from '../fit';
import { compileCached } from '../fit/prepare-problem';
import { heaterCovariates } from '../performance/fitted-curve';

/** Heater built-ins a test session can be planned for. */
export const PLANNABLE_MODELS = ['coil', 'exp-inlet', 'exp-approach'] as const;

/** What is needed to evaluate a model away from its data. */
export interface ResponseModel {
  name: string;
  expression: string;
  parameterNames: string[];
  /** unit of each parameter ('°C' marks a temperature) */
  parameterUnits: Record<string, string>;
  covariateNames: string[];
  /** values of covariates other than Tin, rho and cp */
  covariateMeans: Record<string, number>;
}

/**
 * The response model of a built-in heater model.
 * @throws RangeError for a name that is not one of PLANNABLE_MODELS
 * @example builtinResponseModel('coil').parameterNames // ['Ts', 'UA']
 */
export function builtinResponseModel(name: string): ResponseModel {
  if (!(PLANNABLE_MODELS as readonly string[]).includes(name)) throw new RangeError(`model must be one of ${PLANNABLE_MODELS.join(', ')}, got ${JSON.stringify(name)}`);
  const b = BUILTIN_MODELS[name];
  return {
    name, expression: b.expression, parameterNames: b.parameters.slice(), parameterUnits: { ...b.parameterUnits },
    covariateNames: [...b.requiredCovariates, ...(b.derivedCovariates?.names ?? [])], covariateMeans: {},
  };
}

/**
 * The response model of a fit (its own expression and covariates).
 * @throws RangeError when the fit is not of a heater model with x = flow (one of PLANNABLE_MODELS)
 * @example fitResponseModel(coilFit).name // 'coil'
 */
export function fitResponseModel(fit: FitSuccess): ResponseModel {
  const b = builtinResponseModel(fit.model);
  return { ...b, expression: fit.spec.expression, parameterNames: fit.spec.parameterNames.slice(), covariateNames: fit.spec.covariateNames.slice(), covariateMeans: { ...fit.spec.covariateMeans } };
}

/** Outlet temperatures (°C) and sensitivity rows rows[i][j] = ∂y_i/∂θ_j at flows (m³/s). */
export type ResponseAt = (params: ArrayLike<number>, flowsM3PerS: number[]) => { y: Float64Array; rows: number[][] };

/**
 * The model's response at one inlet temperature, compiled once (the covariates are fixed by the
 * inlet), for repeated evaluation; non-finite values are returned as they come.
 * @param model see {@link ResponseModel}
 * @param inletTempC inlet temperature, °C
 * @returns a function of parameters (in `model.parameterNames` order, SI) and flows (m³/s, > 0)
 * @throws RangeError when the expression cannot be compiled or the inlet is outside the liquid range
 * @example responseAt(builtinResponseModel('coil'), 15)([88, 430], [1.5e-4]).y[0]
 */
export function responseAt(model: ResponseModel, inletTempC: number): ResponseAt {
  const compiled = compileCached(model.expression, model.parameterNames, model.covariateNames);
  if (!compiled.ok) throw new RangeError(`cannot evaluate the model: ${compiled.reason}`);
  const c = compiled.model;
  const n = model.parameterNames.length;
  const values = heaterCovariates(c.covariates, 1, inletTempC, model.covariateMeans);
  const fixed = c.covariates.map((k) => values[k][0]);
  return (params, flowsM3PerS) => {
    const m = flowsM3PerS.length;
    const cov = fixed.map((v) => new Float64Array(m).fill(v));
    const y = new Float64Array(m);
    const g = new Float64Array(m * n);
    c.values(params, flowsM3PerS, cov, y);
    c.gradient(params, flowsM3PerS, cov, g);
    return { y, rows: Array.from({ length: m }, (_, i) => Array.from({ length: n }, (__, j) => g[i + j * m])) };
  };
}
