/**
 * Sequential design: the single next run (flow) that cuts the largest remaining parameter
 * uncertainty of a fit the most. With the fit's covariance C and one more outlet reading of variance
 * σ² at a flow with sensitivities g, the covariance becomes (C⁻¹ + ggᵀ/σ²)⁻¹ = C − Cg(Cg)ᵀ/(σ² + gᵀCg)
 * (Sherman–Morrison), so parameter j's variance falls by (Cg)ⱼ²/(σ² + gᵀCg). The target is the
 * parameter with the largest relative standard error — relative to |θ − Tin| for a temperature
 * (what drives the heat), to |θ| otherwise (our convention) — and the flow is the one over the safe
 * range (upper prediction bound ≤ the limit, as in plan-session.ts) that lowers its variance most.
 */
import type { FitSuccess } from '../fit';
import { studentTQuantile } from '../stats/distributions';
import { requireFinite, requireInRange, requirePositive } from '../units/guards';
import { lowestFlowBelowLimit } from '../performance/choose-flow';
import { quadraticForm } from './information-matrix';
import { fitResponseModel, responseAt } from './model-response';
import { MAX_PLAN_GRID_POINTS } from './plan-session';

/** Where the next run could go. */
export interface NextRunOptions {
  inletTempC: number;
  /** the flows the pump can give, m³/s */
  flowRangeM3PerS: [number, number];
  /** the upper prediction bound of the outlet must stay at or below this, °C */
  maxOutletTempC: number;
  /** standard uncertainty of one outlet reading, K (default the fit's residual SD) */
  measurementUK?: number;
  /** prediction-interval level (default the fit's) */
  level?: number;
  /** candidate flows (default 201, at most MAX_PLAN_GRID_POINTS) */
  gridPoints?: number;
}

/** The suggested run. */
export interface NextRun {
  ok: true;
  flowM3PerS: number;
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  /** the parameter whose uncertainty the run targets */
  targetParameter: string;
  /** standard errors now and expected after the run, by parameter (SI) */
  stdErrNow: Record<string, number>;
  stdErrAfter: Record<string, number>;
  /** relative standard error of the target now and after */
  relativeStdErrNow: number;
  relativeStdErrAfter: number;
  feasibleRangeM3PerS: [number, number];
  measurementUK: number;
}

/**
 * @param fit a successful fit of coil, exp-inlet or exp-approach (its trials are in the fit)
 * @param o where the run could go, see {@link NextRunOptions}
 * @returns the run, or `{ ok: false, reason }` when no flow in range is safe or the fit has no
 *   uncertainty to cut (an exact fit without a measurement u)
 * @throws TypeError / RangeError naming the field (flows not 0 < low < high, a limit at or below the
 *   inlet, a grid over MAX_PLAN_GRID_POINTS, a model other than the three)
 * @example nextRun(fit, { inletTempC: 15, flowRangeM3PerS: [3.3e-5, 3.3e-4], maxOutletTempC: 95 }).flowM3PerS
 */
export function nextRun(fit: FitSuccess, o: NextRunOptions): NextRun | { ok: false; reason: string } {
  const model = fitResponseModel(fit);
  const names = model.parameterNames;
  const p = names.length;
  const tin = requireFinite(o.inletTempC, 'inletTempC');
  const [lo, hi] = [requirePositive(o.flowRangeM3PerS?.[0], 'flowRangeM3PerS[0]'), requireFinite(o.flowRangeM3PerS?.[1], 'flowRangeM3PerS[1]')];
  if (!(hi > lo)) throw new RangeError(`flowRangeM3PerS must satisfy low < high, got [${lo}, ${hi}]`);
  const limit = requireFinite(o.maxOutletTempC, 'maxOutletTempC');
  if (!(limit > tin)) throw new RangeError(`maxOutletTempC (${limit}) must be above inletTempC (${tin})`);
  const u = o.measurementUK === undefined ? fit.residualSD : requirePositive(o.measurementUK, 'measurementUK');
  if (!(u > 0)) return { ok: false, reason: 'the fit is exact (residual SD 0): give the measurement uncertainty of the outlet' };
  const level = requireInRange(o.level ?? fit.level, 'level', 0.5, 0.9999);
  const grid = o.gridPoints ?? 201;
  if (!Number.isInteger(grid) || grid < 21 || grid > MAX_PLAN_GRID_POINTS) throw new RangeError(`gridPoints must be a whole number from 21 to ${MAX_PLAN_GRID_POINTS}, got ${String(grid)}`);

  const theta = names.map((k) => fit.params[k].value);
  const C = Float64Array.from(fit.covariance.flat());
  const t = studentTQuantile((1 + level) / 2, fit.df);
  const response = responseAt(model, tin);
  const at = (f: number) => {
    const r = response(theta, [f]);
    const g = r.rows[0];
    const half = t * Math.sqrt(quadraticForm(C, g) + u * u);
    return { f, y: r.y[0], g, piLow: r.y[0] - half, piHigh: r.y[0] + half };
  };
  const crossing = lowestFlowBelowLimit((f) => at(f).piHigh, lo, hi, limit);
  if (crossing === null) return { ok: false, reason: `no flow up to ${(hi * 60000).toFixed(2)} L/min keeps the outlet's upper prediction bound below ${limit.toFixed(1)} °C` };
  const safeLo = Math.max(lo, crossing);

  const scale = names.map((k, j) => (model.parameterUnits[k] === '°C' ? Math.abs(theta[j] - tin) : Math.abs(theta[j])) || 1);
  const se = names.map((_, j) => Math.sqrt(Math.max(0, C[j * p + j])));
  const target = se.reduce((best, s, j) => (s / scale[j] > se[best] / scale[best] ? j : best), 0);
  let best: { c: ReturnType<typeof at>; cut: number } | null = null;
  for (let i = 0; i < grid; i++) {
    const c = at(safeLo + ((hi - safeLo) * i) / (grid - 1));
    if (!(c.piHigh <= limit) || !c.g.every(Number.isFinite)) continue;
    const cg = Array.from({ length: p }, (_, a) => c.g.reduce((s, gb, b) => s + C[a * p + b] * gb, 0));
    const cut = cg[target] ** 2 / (u * u + quadraticForm(C, c.g));
    if (best === null || cut > best.cut) best = { c, cut };
  }
  if (best === null) return { ok: false, reason: 'the model cannot be evaluated at any safe flow' };
  const { c } = best;
  const cg = Array.from({ length: p }, (_, a) => c.g.reduce((s, gb, b) => s + C[a * p + b] * gb, 0));
  const denom = u * u + quadraticForm(C, c.g);
  const after = names.map((_, j) => Math.sqrt(Math.max(0, C[j * p + j] - (cg[j] * cg[j]) / denom)));
  return {
    ok: true, flowM3PerS: c.f, predictedOutletTempC: c.y, piLowC: c.piLow, piHighC: c.piHigh,
    targetParameter: names[target],
    stdErrNow: Object.fromEntries(names.map((k, j) => [k, se[j]])),
    stdErrAfter: Object.fromEntries(names.map((k, j) => [k, after[j]])),
    relativeStdErrNow: se[target] / scale[target], relativeStdErrAfter: after[target] / scale[target],
    feasibleRangeM3PerS: [safeLo, hi], measurementUK: u,
  };
}
