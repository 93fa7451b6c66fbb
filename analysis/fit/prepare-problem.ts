import { BUILTIN_MODELS, type BuiltinModel } from './builtin-models';
import { LruCache, MODEL_CACHE_CAPACITY } from './lru-cache';
import { compileModel, type CompileResult, type CompiledModel } from './model-expression';
import type { FitFailure, FitInput, FitWarning } from './types';

/** A validated fitting problem: data as typed arrays, the compiled model, bounds and start values. */
export interface Problem {
  modelName: string;
  expression: string;
  builtin: BuiltinModel | null;
  compiled: CompiledModel;
  parameters: string[];
  x: Float64Array;
  y: Float64Array;
  weights: Float64Array | null;
  /** √w per point (1 when unweighted) */
  sw: Float64Array;
  /** covariate arrays in `compiled.covariates` order */
  cov: Float64Array[];
  /** every covariate available, defaults included */
  covariates: Record<string, Float64Array>;
  bounds: [number, number][];
  userStart: number[] | null;
  /** built-ins with some start values given: those values, null for the ones the rule supplies */
  startOverrides: (number | null)[] | null;
  warnings: FitWarning[];
}

const cache = new LruCache<CompileResult>(MODEL_CACHE_CAPACITY);

/**
 * {@link compileModel} memoised per (expression, parameters, covariates) in a bounded LRU cache:
 * symbolic differentiation is the slow part, and every fit, prediction and bootstrap of the same
 * model reuses it.
 * @example compileCached('a*exp(-k*x)', ['a', 'k'], [])
 */
export function compileCached(expression: string, parameters: string[] | undefined, covariates: string[]): CompileResult {
  const key = `${expression}\u0000${parameters?.join(',') ?? '*'}\u0000${covariates.join(',')}`;
  return cache.get(key, () => compileModel(expression, { parameters, covariates }));
}

const fail = (code: FitFailure['code'], reason: string): FitFailure => ({ ok: false, code, reason });

function numberArray(name: string, v: unknown, n?: number): Float64Array | FitFailure {
  if (!Array.isArray(v)) return fail('invalid-input', `${name} must be an array of numbers`);
  if (n !== undefined && v.length !== n) return fail('invalid-input', `${name} has ${v.length} values but x has ${n}`);
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) {
    const e = v[i];
    if (typeof e !== 'number' || !Number.isFinite(e)) {
      const got = typeof e === 'number' ? `${e}${Number.isNaN(e) ? '' : ': too large for double precision'}` : JSON.stringify(e) ?? String(e);
      return fail('invalid-input', `${name}[${i}] is not a finite number (got ${got})`);
    }
    out[i] = e;
  }
  return out;
}

const isFailure = (v: unknown): v is FitFailure => typeof v === 'object' && v !== null && (v as FitFailure).ok === false;

/**
 * Validates a {@link FitInput} and builds the {@link Problem}. Never throws: anything malformed gives
 * `{ ok: false, code, reason }` naming the offending field, index or symbol.
 * @param input - see {@link FitInput}
 * @returns the problem or the failure
 * @example prepareProblem({ x, y, model: 'coil', covariates: { Tin } })
 */
export function prepareProblem(input: FitInput): { ok: true; problem: Problem } | FitFailure {
  if (typeof input !== 'object' || input === null) return fail('invalid-input', 'the fit input must be an object');
  const x = numberArray('x', input.x);
  if (isFailure(x)) return x;
  const y = numberArray('y', input.y, x.length);
  if (isFailure(y)) return y;
  if (x.length === 0) return fail('too-few-points', 'there are no points to fit');
  if (typeof input.model !== 'string' || input.model.trim() === '') return fail('invalid-input', 'model must be a built-in name or an expression');
  let weights: Float64Array | null = null;
  if (input.weights !== undefined && input.weights !== null) {
    const w = numberArray('weights', input.weights, x.length);
    if (isFailure(w)) return w;
    const bad = w.findIndex((v) => !(v > 0));
    if (bad >= 0) return fail('invalid-input', `weights[${bad}] must be > 0 (got ${w[bad]})`);
    weights = w;
  }
  const warnings: FitWarning[] = [];
  const covariates: Record<string, Float64Array> = {};
  if (input.covariates !== undefined && input.covariates !== null) {
    if (typeof input.covariates !== 'object') return fail('invalid-input', 'covariates must be an object of arrays');
    for (const [name, values] of Object.entries(input.covariates)) {
      if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name) || name === 'x') return fail('invalid-input', `"${name}" cannot be a covariate name`);
      const c = numberArray(`covariates.${name}`, values, x.length);
      if (isFailure(c)) return c;
      covariates[name] = c;
    }
  }
  const builtin = Object.prototype.hasOwnProperty.call(BUILTIN_MODELS, input.model) ? BUILTIN_MODELS[input.model] : null;
  if (builtin) {
    for (const c of builtin.requiredCovariates) {
      if (!covariates[c]) return fail('invalid-input', `model "${builtin.name}" needs the covariate ${c} on every point`);
    }
    const derived = builtin.derivedCovariates;
    const missing = derived ? derived.names.filter((c) => !covariates[c]) : [];
    if (derived && missing.length > 0) {
      let values: Record<string, Float64Array>;
      try {
        values = derived.derive({ x, y, covariates });
      } catch (e) {
        return fail('invalid-input', `${(e as Error).message}; give ${missing.join(' and ')} as covariates for such points`);
      }
      for (const c of missing) {
        covariates[c] = values[c];
        warnings.push({ code: 'default-property', message: `no ${c} given: ${derived.how[c]} was used for every point` });
      }
    }
  }
  const expression = builtin ? builtin.expression : input.model;
  let startNames: string[] | undefined;
  if (input.start !== undefined && input.start !== null) {
    if (typeof input.start !== 'object') return fail('invalid-input', 'start must be an object of numbers by parameter name');
    startNames = Object.keys(input.start);
    for (const k of startNames) {
      const v = (input.start as Record<string, unknown>)[k];
      if (typeof v !== 'number' || !Number.isFinite(v)) return fail('invalid-input', `start.${k} is not a finite number`);
    }
  }
  const compiled = compileCached(expression, builtin ? builtin.parameters : startNames, Object.keys(covariates));
  if (!compiled.ok) return fail('invalid-expression', compiled.reason);
  const model = compiled.model;
  if (!builtin && !/(^|[^A-Za-z0-9_.])x(?![A-Za-z0-9_])/.test(expression) && model.covariates.length === 0) {
    return fail('invalid-expression', `model "${input.model}" is neither a built-in (${Object.keys(BUILTIN_MODELS).join(', ')}) nor an expression in x`);
  }
  let userStart: number[] | null = null;
  let startOverrides: (number | null)[] | null = null;
  if (startNames) {
    for (const k of startNames) if (!model.parameters.includes(k)) return fail('invalid-input', `start.${k} is not a parameter of model "${input.model}" (parameters: ${model.parameters.join(', ')})`);
    const missing = model.parameters.filter((k) => !startNames!.includes(k));
    if (missing.length > 0 && !builtin) return fail('invalid-input', `no start value for ${missing.join(', ')}`);
    if (missing.length === 0) userStart = model.parameters.map((k) => (input.start as Record<string, number>)[k]);
    else startOverrides = model.parameters.map((k) => (startNames!.includes(k) ? (input.start as Record<string, number>)[k] : null));
  }
  const bounds: [number, number][] = []; // appended, not mapped: one array layout for the code that reads it
  for (let j = 0; j < model.parameters.length; j++) bounds.push([-Infinity, Infinity]);
  if (input.bounds !== undefined && input.bounds !== null) {
    if (typeof input.bounds !== 'object') return fail('invalid-input', 'bounds must be an object of [low, high] pairs');
    for (const [k, b] of Object.entries(input.bounds)) {
      const j = model.parameters.indexOf(k);
      if (j < 0) return fail('invalid-input', `bounds.${k} is not a parameter of the model (parameters: ${model.parameters.join(', ')})`);
      if (!Array.isArray(b) || b.length !== 2) return fail('invalid-input', `bounds.${k} must be [low, high]`);
      const lo = b[0] === null ? -Infinity : b[0];
      const hi = b[1] === null ? Infinity : b[1];
      if (typeof lo !== 'number' || typeof hi !== 'number' || Number.isNaN(lo) || Number.isNaN(hi) || !(lo < hi)) {
        return fail('invalid-input', `bounds.${k} must satisfy low < high (got ${JSON.stringify(b)})`);
      }
      bounds[j] = [lo, hi];
    }
  }
  if (builtin?.positiveX) {
    const bad = x.findIndex((v) => !(v > 0));
    if (bad >= 0) return fail('invalid-input', `x[${bad}] = ${x[bad]}: ${builtin.requirement}`);
  }
  const n = x.length;
  const p = model.parameters.length;
  if (n <= p) return fail('too-few-points', `${n} point${n === 1 ? '' : 's'} cannot fit ${p} parameters with an uncertainty: at least ${p + 1} are needed`);
  if (x.every((v) => v === x[0])) return fail('degenerate-x', `all ${n} x values are equal (${x[0]}): the dependence on x cannot be fitted`);
  const sw = weights ? weights.map(Math.sqrt) : new Float64Array(n).fill(1);
  const cov = model.covariates.map((c) => covariates[c]);
  return {
    ok: true,
    problem: { modelName: input.model, expression, builtin, compiled: model, parameters: model.parameters, x, y, weights, sw, cov, covariates, bounds, userStart, startOverrides, warnings },
  };
}
