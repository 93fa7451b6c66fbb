/**
 * Planning a test session: which flows to run, how often and in what order, so that the fit of a
 * heater model (x = flow m³/s, y = outlet °C) pins its parameters down best — a locally D-optimal
 * exact design computed from the model's sensitivities at a prior (d-optimal-design.ts), under the
 * rules of a safe and checkable session:
 * - no planned flow whose upper prediction bound of the outlet exceeds the limit: the range starts at
 *   the minimum safe flow (for the coil, above the closed-form minimum of DOMAIN.md §1.6,
 *   ṁ_min = UA / (cp·ln[(Ts − Tin)/(Ts − T_lim)]), raised until the bound clears the limit);
 * - at least four distinct flows (and more than the parameters), so the pure-error lack-of-fit test
 *   has degrees of freedom (NIST/SEMATECH e-Handbook §4.6.1 [41]);
 * - a replicate besides the reference pair, and a reference flow at the start and at the end to see
 *   drift (DOMAIN.md §1.4: open fires drift; common practice);
 * - the other runs in random order from a seeded generator (mulberry32), the seed recorded.
 * Prediction intervals use the prior's covariance Σ: y ± q·√(gᵀΣg + u²), q the Student t quantile
 * at the prior fit's degrees of freedom (normal without them). A guessed prior is given the stated
 * default uncertainty GUESS_PRIOR_U. Expected standard errors after the session are √diag((GᵀG/u²)⁻¹)
 * over the planned runs, u the outlet's measurement uncertainty (the session's data alone).
 */
import type { FitSuccess } from '../fit';
import { mulberry32 } from '../fit/random';
import { normalQuantile, studentTQuantile } from '../stats/distributions';
import { requireFinite, requireInRange, requirePositive } from '../units/guards';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';
import { saturationTempC } from '../water/saturation-pressure';
import { minimumMassFlowKgPerS } from '../performance/coil-ntu';
import { lowestFlowBelowLimit } from '../performance/choose-flow';
import { mergeCautions, sourceAboveBoilingCaution, temperatureCautions, type Caution } from '../safety/cautions';
import { approximateDesignOnRange, exactDesign } from './d-optimal-design';
import { informationMatrix, logDet, quadraticForm, symmetricInverse } from './information-matrix';
import { builtinResponseModel, responseAt, type ResponseModel } from './model-response';

/** Fewest runs of a session: four distinct flows, the reference at start and end, one more replicate. */
export const MIN_PLAN_TRIALS = 6;
/** Most runs of a session (bounded work). */
export const MAX_PLAN_TRIALS = 60;
/** Most candidate flows of the design search (bounded work). */
export const MAX_PLAN_GRID_POINTS = 401;
/** Outlet measurement u when none is given: Type T standard limits ±1.0 °C as a rectangular distribution, 1/√3 K (DOMAIN.md §2.2, §2.5). */
export const DEFAULT_OUTLET_U_K = 1 / Math.sqrt(3);
/** Standard uncertainty given to a guessed prior (our default, no source): 10 K on a temperature, 25 % of any other parameter. */
export const GUESS_PRIOR_U = { temperatureK: 10, relative: 0.25 } as const;

/** What is known before the session. */
export interface PlanPrior {
  /** parameter values by name, SI (coil: Ts °C, UA W/K) */
  values: Record<string, number>;
  /** covariance in the model's parameter order (a saved fit's); absent for a guess */
  covariance?: number[][];
  /** degrees of freedom of the fit the covariance comes from */
  df?: number;
}

/** What to plan. */
export interface SessionPlanInput {
  /** coil, exp-inlet or exp-approach */
  model: string;
  prior: PlanPrior;
  inletTempC: number;
  /** the flows the pump can give, m³/s, 0 < low < high */
  flowRangeM3PerS: [number, number];
  /** the outlet must stay below this, °C (upper prediction bound) */
  maxOutletTempC: number;
  /** runs in the session, MIN_PLAN_TRIALS–MAX_PLAN_TRIALS */
  trials: number;
  /** standard uncertainty of one outlet reading, K (default DEFAULT_OUTLET_U_K) */
  measurementUK?: number;
  /** seed of the run order (default 1) */
  seed?: number;
  /** level of the prediction intervals (default 0.95) */
  level?: number;
  /** candidate flows over the safe range (default 201, at most MAX_PLAN_GRID_POINTS) */
  gridPoints?: number;
  /** distinct flows in the plan (default and least: 4, and more than the parameters) */
  distinctFlows?: number;
}

/** One run of the plan. */
export interface PlannedRun {
  order: number;
  flowM3PerS: number;
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  purpose: 'design' | 'replicate' | 'reference';
}

/** Information of a set of flows relative to the best design on the same range. */
export interface DesignSummary {
  flowsM3PerS: number[];
  /** (det M/n ÷ det M*)^(1/p), M* of the D-optimal approximate design on the safe range */
  dEfficiency: number;
  /** expected standard error of each parameter after the runs, SI */
  expectedStdErr: Record<string, number>;
}

/** A planned session. */
export interface SessionPlan extends DesignSummary {
  ok: true;
  model: string;
  parameterNames: string[];
  runs: PlannedRun[];
  distinctFlows: number;
  referenceFlowM3PerS: number;
  evenlySpaced: DesignSummary;
  /** the D-optimal approximate design on the safe range: support flows and weights */
  optimum: { points: { flowM3PerS: number; weight: number }[]; maxVariance: number };
  feasibleRangeM3PerS: [number, number];
  /** lowest flow whose upper prediction bound stays at or below the limit (the range's low end when it is already safe) */
  minimumSafeFlowM3PerS: number;
  /** coil: the closed form of DOMAIN.md §1.6 at the prior's best estimate (null for other models or when the outlet cannot reach the limit) */
  closedFormMinimumFlowM3PerS: number | null;
  prior: { source: 'covariance' | 'guess'; stdErr: Record<string, number>; df: number | null };
  measurementUK: number;
  level: number;
  seed: number;
  notes: string[];
  cautions: Caution[];
}

/**
 * The prior of a saved fit: its parameters, covariance and degrees of freedom (planSession checks
 * that the fit's model can be planned).
 * @example priorFromFit(fit).values.UA
 */
export function priorFromFit(fit: FitSuccess): PlanPrior {
  return { values: Object.fromEntries(fit.parameterNames.map((k) => [k, fit.params[k].value])), covariance: fit.covariance.map((r) => r.slice()), df: fit.df };
}

function readPrior(model: ResponseModel, prior: PlanPrior): { theta: number[]; sigma: Float64Array; source: 'covariance' | 'guess'; df: number | null } {
  if (prior === null || typeof prior !== 'object' || prior.values === null || typeof prior.values !== 'object') throw new TypeError('prior must be an object with values by parameter name');
  const names = model.parameterNames;
  const p = names.length;
  const theta = names.map((k) => requireFinite(prior.values[k], `prior.values.${k}`));
  const sigma = new Float64Array(p * p);
  if (prior.covariance === undefined) {
    names.forEach((k, j) => {
      const u = model.parameterUnits[k] === '°C' ? GUESS_PRIOR_U.temperatureK : GUESS_PRIOR_U.relative * Math.abs(theta[j]);
      sigma[j * p + j] = u * u;
    });
    return { theta, sigma, source: 'guess', df: null };
  }
  const c = prior.covariance;
  if (!Array.isArray(c) || c.length !== p || c.some((row) => !Array.isArray(row) || row.length !== p)) throw new RangeError(`prior.covariance must be a ${p}×${p} array (${names.join(', ')})`);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < p; j++) {
      const v = requireFinite(c[i][j], `prior.covariance[${i}][${j}]`);
      if (Math.abs(v - c[j][i]) > 1e-9 * Math.max(Math.abs(v), Math.abs(c[j][i]), 1e-300)) throw new RangeError('prior.covariance must be symmetric');
      sigma[i * p + j] = v;
    }
    if (!(c[i][i] >= 0)) throw new RangeError(`prior.covariance[${i}][${i}] must be 0 or more`);
  }
  const df = prior.df === undefined ? null : requirePositive(prior.df, 'prior.df');
  return { theta, sigma, source: 'covariance', df };
}

/**
 * Plans a session (see the module note).
 * @param input see {@link SessionPlanInput}
 * @returns the plan, or `{ ok: false, reason }` when no flow in the pump's range keeps the outlet's
 *   upper prediction bound below the limit, or the model cannot be evaluated there
 * @throws TypeError / RangeError naming the field for malformed input (unknown model, missing prior
 *   value, a covariance of the wrong shape, flows not 0 < low < high, a limit at or below the inlet,
 *   trials outside MIN_PLAN_TRIALS–MAX_PLAN_TRIALS, a grid over MAX_PLAN_GRID_POINTS)
 * @example planSession({ model: 'coil', prior: { values: { Ts: 88, UA: 430 } }, inletTempC: 15, flowRangeM3PerS: [2 / 60000, 20 / 60000], maxOutletTempC: 95, trials: 8 })
 */
export function planSession(input: SessionPlanInput): SessionPlan | { ok: false; reason: string } {
  const model = builtinResponseModel(input?.model);
  const names = model.parameterNames;
  const p = names.length;
  const prior = readPrior(model, input.prior);
  const tin = requireFinite(input.inletTempC, 'inletTempC');
  const rho = waterDensityKgPerM3(tin, undefined, 'inletTempC');
  const cp = waterCpJPerKgK(tin, undefined, 'inletTempC');
  const range = input.flowRangeM3PerS;
  if (!Array.isArray(range) || range.length !== 2) throw new TypeError('flowRangeM3PerS must be [low, high]');
  const lo = requirePositive(range[0], 'flowRangeM3PerS[0]');
  const hi = requireFinite(range[1], 'flowRangeM3PerS[1]');
  if (!(hi > lo)) throw new RangeError(`flowRangeM3PerS must satisfy low < high, got [${lo}, ${hi}]`);
  const limit = requireFinite(input.maxOutletTempC, 'maxOutletTempC');
  if (!(limit > tin)) throw new RangeError(`maxOutletTempC (${limit}) must be above inletTempC (${tin})`);
  const n = input.trials;
  if (!Number.isInteger(n) || n < MIN_PLAN_TRIALS || n > MAX_PLAN_TRIALS) throw new RangeError(`trials must be a whole number from ${MIN_PLAN_TRIALS} (four distinct flows, the reference at start and end, a replicate) to ${MAX_PLAN_TRIALS}, got ${String(n)}`);
  const u = requirePositive(input.measurementUK ?? DEFAULT_OUTLET_U_K, 'measurementUK');
  const seed = requireFinite(input.seed ?? 1, 'seed');
  if (!Number.isInteger(seed)) throw new RangeError(`seed must be a whole number, got ${seed}`);
  const level = requireInRange(input.level ?? 0.95, 'level', 0.5, 0.9999);
  const grid = input.gridPoints ?? 201;
  if (!Number.isInteger(grid) || grid < 21 || grid > MAX_PLAN_GRID_POINTS) throw new RangeError(`gridPoints must be a whole number from 21 to ${MAX_PLAN_GRID_POINTS}, got ${String(grid)}`);
  const minDistinct = input.distinctFlows ?? Math.max(4, p + 1);
  if (!Number.isInteger(minDistinct) || minDistinct < Math.max(4, p + 1) || minDistinct > n - 2) throw new RangeError(`distinctFlows must be a whole number from ${Math.max(4, p + 1)} to trials − 2 (${n - 2}), got ${String(minDistinct)}`);
  const q = prior.df === null ? normalQuantile((1 + level) / 2) : studentTQuantile((1 + level) / 2, prior.df);

  const response = responseAt(model, tin);
  const at = (flows: number[]) => {
    const r = response(prior.theta, flows);
    return flows.map((f, i) => {
      const half = q * Math.sqrt(quadraticForm(prior.sigma, r.rows[i]) + u * u);
      return { flow: f, y: r.y[i], piLow: r.y[i] - half, piHigh: r.y[i] + half, row: r.rows[i].map((g) => g / u) };
    });
  };
  const piHigh = (f: number) => at([f])[0].piHigh;

  let closedForm: number | null = null;
  const iTs = names.indexOf('Ts'), iUA = names.indexOf('UA');
  if (model.name === 'coil' && prior.theta[iTs] > limit && prior.theta[iUA] > 0) {
    closedForm = minimumMassFlowKgPerS({ sourceTempC: prior.theta[iTs], inletTempC: tin, limitTempC: limit, uaWPerK: prior.theta[iUA], cpJPerKgK: cp }) / rho;
  }
  const from = closedForm !== null && closedForm > lo ? Math.min(closedForm, hi) : lo;
  const crossing = from < hi ? lowestFlowBelowLimit(piHigh, from, hi, limit) : piHigh(hi) <= limit ? 0 : null;
  if (crossing === null) return { ok: false, reason: `no flow up to ${fmtLpm(hi)} keeps the outlet's upper ${Math.round(level * 100)} % prediction bound below ${limit.toFixed(1)} °C: raise the pump's flow, lower the fire, or test with a higher limit only where that is safe` };
  const safeLo = Math.max(lo, crossing === 0 ? from : crossing);
  if (!(hi > safeLo * (1 + 1e-6))) return { ok: false, reason: `the safe flows leave no range to plan over: only ${fmtLpm(hi)} keeps the outlet below ${limit.toFixed(1)} °C` };

  const opt = approximateDesignOnRange((f) => at([f])[0].row, [safeLo, hi], grid);
  if (!opt || !Number.isFinite(opt.logDet)) return { ok: false, reason: 'the model gives no information on the parameters over the safe flows (singular information matrix): check the prior' };
  // the levels: the optimum's support, then lack-of-fit flows filling the widest gaps (maximin)
  const gridFlows = Array.from({ length: grid }, (_, i) => safeLo + ((hi - safeLo) * i) / (grid - 1));
  const levels = opt.points.map((s) => s.x);
  while (levels.length < minDistinct) {
    let bestF = gridFlows[0], bestD = -1;
    for (const f of gridFlows) {
      const d = Math.min(...levels.map((l) => Math.abs(l - f)));
      if (d > bestD) { bestD = d; bestF = f; }
    }
    levels.push(bestF);
  }
  const cands = at(levels.sort((x, y) => x - y));
  if (cands.some((c) => !(c.piHigh <= limit) || !c.row.every(Number.isFinite))) return { ok: false, reason: 'the model cannot be evaluated safely at every planned flow' };
  const exact = exactDesign(cands.map((c) => c.row), n, { referencePair: true, minDistinct, requireReplicate: true });
  if (!exact) return { ok: false, reason: `${n} runs cannot cover ${minDistinct} distinct flows with a reference pair and a replicate` };

  const summary = (rows: number[][], flows: number[]): DesignSummary => {
    const m = informationMatrix(rows, p);
    const inv = symmetricInverse(m, p);
    const eff = Math.exp((logDet(m, p) - p * Math.log(rows.length) - opt.logDet) / p);
    return {
      flowsM3PerS: flows,
      dEfficiency: Number.isFinite(eff) ? Math.min(1, eff) : 0,
      expectedStdErr: Object.fromEntries(names.map((k, j) => [k, inv ? Math.sqrt(Math.max(0, inv[j * p + j])) : null]).filter(([, v]) => v !== null)) as Record<string, number>,
    };
  };
  const planned = exact.indices.map((i) => cands[i]);
  const even = at(Array.from({ length: n }, (_, i) => safeLo + ((hi - safeLo) * i) / (n - 1)));
  const ref = planned[0];
  const interior = planned.slice(1, n - 1);
  const rand = mulberry32(seed);
  for (let i = interior.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [interior[i], interior[j]] = [interior[j], interior[i]];
  }
  const ordered = [ref, ...interior, ref];
  const seen = new Set<number>();
  const runs: PlannedRun[] = ordered.map((c, k) => {
    const purpose = k === 0 || k === n - 1 ? 'reference' : c.flow === ref.flow || seen.has(c.flow) ? 'replicate' : 'design';
    seen.add(c.flow);
    return { order: k + 1, flowM3PerS: c.flow, predictedOutletTempC: c.y, piLowC: c.piLow, piHighC: c.piHigh, purpose };
  });

  const notes = [
    'Flows are set points: set each as closely as the pump allows and record the flow you measured.',
    'The design is locally optimal: it is computed at the prior. If the fit lands far from the prior, plan the next runs from the fit.',
    `Expected standard errors assume the outlet scatters by the measurement uncertainty (${u.toFixed(3)} K) and nothing else.`,
  ];
  if (prior.source === 'guess') notes.push(`The prior is a guess: its uncertainty is taken as ${GUESS_PRIOR_U.temperatureK} K on temperatures and ${GUESS_PRIOR_U.relative * 100} % on other parameters (one standard uncertainty, our default).`);
  if (safeLo > lo) notes.push(`Flows below ${fmtLpm(safeLo)} are left out: there the upper prediction bound of the outlet exceeds ${limit.toFixed(1)} °C.`);
  notes.push('With a fire or another drifting source, also repeat the reference flow every three or four runs and note when fuel is added.');
  const boiling = saturationTempC(101325);
  const source = model.name === 'coil' ? sourceAboveBoilingCaution(prior.theta[iTs], boiling) : null;
  const result = summary(planned.map((c) => c.row), planned.map((c) => c.flow));
  return {
    ok: true, model: model.name, parameterNames: names, runs, distinctFlows: new Set(planned.map((c) => c.flow)).size, referenceFlowM3PerS: ref.flow,
    ...result,
    flowsM3PerS: runs.map((r) => r.flowM3PerS),
    evenlySpaced: summary(even.map((c) => c.row), even.map((c) => c.flow)),
    optimum: { points: opt.points.map((s) => ({ flowM3PerS: s.x, weight: s.weight })), maxVariance: opt.maxVariance },
    feasibleRangeM3PerS: [safeLo, hi], minimumSafeFlowM3PerS: safeLo, closedFormMinimumFlowM3PerS: closedForm,
    prior: { source: prior.source, stdErr: Object.fromEntries(names.map((k, j) => [k, Math.sqrt(prior.sigma[j * p + j])])), df: prior.df },
    measurementUK: u, level, seed, notes,
    cautions: mergeCautions(temperatureCautions(Math.max(...runs.map((r) => r.piHighC)), 'planned outlet (upper prediction bound)'), source ? [source] : []),
  };
}

function fmtLpm(m3PerS: number): string {
  return `${(m3PerS * 60000).toFixed(2)} L/min`;
}

/** The prediction of one run at a prior: the outlet, its prediction interval, and its sensitivity to the inlet. */
export interface RunPredictionAt {
  flowM3PerS: number;
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  /** ∂(outlet)/∂(inlet) at this flow (central difference over ±0.5 K) */
  inletSlope: number;
}

/**
 * Predictions at a prior for any flows — the runs added to a session, and the inlet sensitivity
 * of planned ones — with the prediction interval of {@link planSession} (Σ of the prior, or the
 * guess's default uncertainty; Student t at the prior's df, else normal).
 * @throws TypeError / RangeError as planSession for the model, prior, inlet, u and level; RangeError for a flow that is not positive
 * @example predictRuns({ model: 'coil', prior: { values: { Ts: 90, UA: 400 } }, inletTempC: 15 }, [1e-4])[0].predictedOutletTempC
 */
export function predictRuns(
  input: Pick<SessionPlanInput, 'model' | 'prior' | 'inletTempC' | 'measurementUK' | 'level'>,
  flowsM3PerS: number[],
): RunPredictionAt[] {
  const model = builtinResponseModel(input?.model);
  const prior = readPrior(model, input.prior);
  const tin = requireFinite(input.inletTempC, 'inletTempC');
  const u = requirePositive(input.measurementUK ?? DEFAULT_OUTLET_U_K, 'measurementUK');
  const level = requireInRange(input.level ?? 0.95, 'level', 0.5, 0.9999);
  flowsM3PerS.forEach((f, i) => requirePositive(f, `flowsM3PerS[${i}]`));
  const q = prior.df === null ? normalQuantile((1 + level) / 2) : studentTQuantile((1 + level) / 2, prior.df);
  const r = responseAt(model, tin)(prior.theta, flowsM3PerS);
  const up = responseAt(model, tin + 0.5)(prior.theta, flowsM3PerS).y;
  const down = responseAt(model, tin - 0.5)(prior.theta, flowsM3PerS).y;
  return flowsM3PerS.map((f, i) => {
    const half = q * Math.sqrt(quadraticForm(prior.sigma, r.rows[i]) + u * u);
    return { flowM3PerS: f, predictedOutletTempC: r.y[i], piLowC: r.y[i] - half, piHighC: r.y[i] + half, inletSlope: up[i] - down[i] };
  });
}
