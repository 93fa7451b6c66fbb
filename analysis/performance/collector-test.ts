/**
 * Steady-state efficiency test of a solar collector in the ISO 9806 form (DOMAIN.md §4 [13, 13b, 13d];
 * the quasi-dynamic form is not covered). Per trial:
 *     η = ṁ·cp·(Tout − Tin) / (A·G),   x = (Tm − Ta)/G,   Tm = (Tin + Tout)/2
 * with A the area the caller states (gross or aperture: the coefficients are on that basis), G the
 * irradiance in the collector plane, ṁ = ρ(Tin)·V̇ (the flow measured on the inlet side, common
 * practice) unless a mass flow is given, cp at Tm (IAPWS-IF97, or the fluid's own). The curve
 *     η = η0 − a1·x − a2·G·x²       (a2 = 0 for the first-order form)
 * is linear in (η0, a1, a2) and is fitted by weighted linear least squares (Householder QR with
 * refinement, `linearLeastSquares`), with the covariance s²·(XᵀWX)⁻¹ from a pivoted QR of the
 * weighted design (`analyseJacobian`), as every fit of the engine reports it. Weights are
 * 1/u²(η) when measurement uncertainties are given (first-order GUM: relative uncertainties of ΔT,
 * flow and G in quadrature, DOMAIN.md §2.5), else all 1. Below ambient the x² term is x·|x|, as
 * in the curve of collector-efficiency.ts. Trials outside the steadiness limits are left out
 * (collector-steadiness.ts).
 */
import { analyseJacobian } from '../fit/jacobian-analysis';
import { linearLeastSquares } from '../fit/linear-least-squares';
import { studentTQuantile } from '../stats/distributions';
import { compensatedSum } from '../stats/compensated-sum';
import { requireFinite, requireInRange, requireNonNegative, requirePositive } from '../units/guards';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';
import { REFERENCE_IRRADIANCE_W_PER_M2, secondOrderExcessK2, type CollectorParameters } from './collector-efficiency';
import { collectorSteadiness, distinctWithin, ISO9806_STEADY_LIMITS, type CollectorTestLimits, type CollectorTrialSpread } from './collector-steadiness';

/** Most trials one test may hold (bounded work). */
export const MAX_COLLECTOR_TRIALS = 10_000;
const BAND_POINTS = 41;

/** One steady-state trial, SI. Give `flowM3PerS` or `massFlowKgPerS`. */
export interface CollectorTrial {
  /** G in the collector plane, W/m², > 0 */
  irradianceWPerM2: number;
  inletTempC: number;
  outletTempC: number;
  /** surrounding air, °C */
  ambientTempC: number;
  /** volume flow, m³/s (density at the inlet temperature) */
  flowM3PerS?: number;
  /** mass flow, kg/s */
  massFlowKgPerS?: number;
  windMPerS?: number;
  /** largest deviations from the period mean, for the steadiness check */
  spread?: CollectorTrialSpread;
}

/** What to fit. */
export interface CollectorTestInput {
  trials: CollectorTrial[];
  /** the area the efficiency refers to, m² */
  areaM2: number;
  areaBasis: 'gross' | 'aperture';
  /** a heat-transfer fluid other than water: its cp (J/(kg·K)) and density (kg/m³) */
  fluid?: { cpJPerKgK?: number; densityKgPerM3?: number };
  /** standard uncertainties for weights: ΔT (K), flow and irradiance (fractions) */
  uncertainty?: { temperatureDifferenceK?: number; flowRelative?: number; irradianceRelative?: number };
  /** 2 (default) or 1 for the first-order form (a2 = 0) */
  order?: 1 | 2;
  /** confidence level, default 0.95 */
  level?: number;
  /** irradiance of the confidence band, W/m² (default G* = 1000) */
  bandIrradianceWPerM2?: number;
  /** steadiness limits (default ISO9806_STEADY_LIMITS) */
  limits?: Partial<CollectorTestLimits>;
}

/** A coefficient with its standard error and t interval. */
export interface CollectorEstimate { value: number; stdErr: number; ciLow: number; ciHigh: number }

/** One point of the fit. */
export interface CollectorPoint {
  /** index of the trial in the input */
  index: number;
  massFlowKgPerS: number;
  heatW: number;
  efficiency: number;
  meanTempC: number;
  /** (Tm − Ta)/G, m²·K/W */
  xM2KPerW: number;
  fitted: number;
  residual: number;
  /** standard uncertainty of η used for the weight (null unweighted) */
  efficiencyU: number | null;
}

/** A successful test. */
export interface CollectorTestResult {
  ok: true;
  areaBasis: 'gross' | 'aperture';
  areaM2: number;
  eta0: CollectorEstimate;
  a1WPerM2K: CollectorEstimate;
  /** exactly 0 with stdErr 0 in the first-order form */
  a2WPerM2K2: CollectorEstimate;
  /** names of the fitted coefficients, the order of `covariance` */
  parameterNames: string[];
  covariance: number[][];
  n: number;
  df: number;
  r2: number | null;
  residualSD: number;
  weighted: boolean;
  level: number;
  points: CollectorPoint[];
  excluded: { index: number; reasons: string[] }[];
  /** the curve against x at `bandIrradianceWPerM2`, with its confidence band */
  band: { xM2KPerW: number; efficiency: number; ciLow: number; ciHigh: number; extrapolated: boolean }[];
  bandIrradianceWPerM2: number;
  xRangeM2KPerW: [number, number];
  /** the coefficients for collectorPowerW / collectorOutlet (null when they are unphysical) */
  parameters: CollectorParameters | null;
  warnings: string[];
}

/**
 * Fits the steady-state efficiency curve of a collector test.
 * @param input trials and area (see {@link CollectorTestInput})
 * @returns the coefficients with standard errors, covariance, r², residual SD, residuals, the
 *   excluded trials and the band; `{ ok: false, reason }` for too few valid trials or a degenerate
 *   spread of x (fewer distinct Tm − Ta, within 1 K, than coefficients)
 * @throws TypeError / RangeError naming the field for malformed input (non-finite values,
 *   G ≤ 0, no flow, more than MAX_COLLECTOR_TRIALS trials, a level outside (0, 1))
 * @example collectorTest({ areaM2: 2, areaBasis: 'gross', trials }).eta0.value
 */
export function collectorTest(input: CollectorTestInput): CollectorTestResult | { ok: false; reason: string } {
  const A = requirePositive(input?.areaM2, 'areaM2');
  if (input.areaBasis !== 'gross' && input.areaBasis !== 'aperture') throw new RangeError(`areaBasis must be "gross" or "aperture", got ${String(input.areaBasis)}`);
  if (!Array.isArray(input.trials) || input.trials.length === 0) throw new RangeError('trials must be a non-empty array');
  if (input.trials.length > MAX_COLLECTOR_TRIALS) throw new RangeError(`trials: at most ${MAX_COLLECTOR_TRIALS} trials, got ${input.trials.length}`);
  const order = input.order ?? 2;
  if (order !== 1 && order !== 2) throw new RangeError(`order must be 1 or 2, got ${String(order)}`);
  const level = requireInRange(input.level ?? 0.95, 'level', 1e-6, 1 - 1e-6);
  const Gb = requirePositive(input.bandIrradianceWPerM2 ?? REFERENCE_IRRADIANCE_W_PER_M2, 'bandIrradianceWPerM2');
  const cpFluid = input.fluid?.cpJPerKgK === undefined ? undefined : requirePositive(input.fluid.cpJPerKgK, 'fluid.cpJPerKgK');
  const rhoFluid = input.fluid?.densityKgPerM3 === undefined ? undefined : requirePositive(input.fluid.densityKgPerM3, 'fluid.densityKgPerM3');
  const u = input.uncertainty;
  const uDT = u?.temperatureDifferenceK === undefined ? undefined : requireNonNegative(u.temperatureDifferenceK, 'uncertainty.temperatureDifferenceK');
  const uQ = u?.flowRelative === undefined ? 0 : requireNonNegative(u.flowRelative, 'uncertainty.flowRelative');
  const uG = u?.irradianceRelative === undefined ? 0 : requireNonNegative(u.irradianceRelative, 'uncertainty.irradianceRelative');
  const weighted = u !== undefined && (uDT ?? 0) + uQ + uG > 0;

  const trials = input.trials.map((t, i) => readTrial(t, i, rhoFluid));
  const limits = { ...ISO9806_STEADY_LIMITS, ...(input.limits ?? {}) };
  const check = collectorSteadiness(trials.map((t) => ({ ...t, flow: t.massFlowKgPerS })), limits);
  const warnings = [...check.warnings];
  const excluded = check.reasons.flatMap((r, index) => (r.length > 0 ? [{ index, reasons: r }] : []));
  const used = trials.flatMap((t, index) => (check.reasons[index].length === 0 ? [{ t, index }] : []));
  const p = order + 1;
  if (used.length <= p) return { ok: false, reason: `${used.length} valid trial(s) cannot fit ${p} coefficients with an uncertainty: at least ${p + 1} are needed${excluded.length ? ` (${excluded.length} excluded by the steadiness limits)` : ''}` };

  const pts = used.map(({ t, index }) => {
    const meanTempC = (t.inletTempC + t.outletTempC) / 2;
    const cp = cpFluid ?? waterCpJPerKgK(meanTempC, undefined, `trials[${index}] mean temperature`);
    const dT = t.outletTempC - t.inletTempC;
    const heatW = t.massFlowKgPerS * cp * dT;
    const efficiency = heatW / (A * t.irradianceWPerM2);
    const rel = Math.hypot(uDT === undefined ? 0 : uDT / dT, uQ, uG);
    return { index, t, meanTempC, heatW, efficiency, excessK: meanTempC - t.ambientTempC, efficiencyU: weighted ? efficiency * rel : null };
  });
  if (distinctWithin(pts.map((q) => q.excessK), 1).length < p) {
    return { ok: false, reason: `the trials span too few mean-temperature excesses Tm − Ta (fewer than ${p} distinct within 1 K): test at more inlet temperatures spread over the operating range` };
  }
  const m = pts.length;
  const sw = pts.map((q) => (q.efficiencyU === null ? 1 : 1 / q.efficiencyU));
  if (!sw.every((v) => Number.isFinite(v) && v > 0)) return { ok: false, reason: 'a trial has a zero or non-finite efficiency uncertainty: the weights cannot be formed' };
  const design = (q: (typeof pts)[number]) => [1, -q.excessK / q.t.irradianceWPerM2, -secondOrderExcessK2(q.excessK) / q.t.irradianceWPerM2].slice(0, p);
  const rows = pts.map(design);
  const columns = Array.from({ length: p }, (_, j) => Float64Array.from(rows, (r, i) => r[j] * sw[i]));
  const ls = linearLeastSquares(columns, pts.map((q, i) => q.efficiency * sw[i]));
  if (!ls.ok) return { ok: false, reason: `the curve cannot be fitted: ${ls.reason}` };
  const jac = new Float64Array(m * p);
  columns.forEach((c, j) => jac.set(c, j * m));
  const ja = analyseJacobian(jac, m, p, ['eta0', 'a1', 'a2']);
  if (!ja.ok) return { ok: false, reason: `the spread of x is degenerate: ${ja.reason}` };

  const b = Array.from(ls.coefficients);
  const df = m - p;
  const s2 = ls.rss / df;
  const covariance = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (__, j) => s2 * ja.analysis.inverse[i * p + j]));
  const tq = studentTQuantile((1 + level) / 2, df);
  const est = (j: number): CollectorEstimate => {
    if (j >= p) return { value: 0, stdErr: 0, ciLow: 0, ciHigh: 0 };
    const se = Math.sqrt(Math.max(0, covariance[j][j]));
    return { value: b[j], stdErr: se, ciLow: b[j] - tq * se, ciHigh: b[j] + tq * se };
  };
  const fitted = rows.map((r) => r.reduce((s, v, j) => s + v * b[j], 0));
  const w = sw.map((v) => v * v);
  const sumW = compensatedSum(w);
  const yBar = compensatedSum(pts.map((q, i) => w[i] * q.efficiency)) / sumW;
  const sst = compensatedSum(pts.map((q, i) => w[i] * (q.efficiency - yBar) ** 2));
  const xs = pts.map((q) => q.excessK / q.t.irradianceWPerM2);
  const xRange: [number, number] = [Math.min(...xs), Math.max(...xs)];

  const from = Math.min(0, xRange[0]);
  const band = Array.from({ length: BAND_POINTS }, (_, k) => {
    const x = from + ((xRange[1] - from) * k) / (BAND_POINTS - 1);
    const g = [1, -x, -Gb * secondOrderExcessK2(x)].slice(0, p);
    const eff = g.reduce((s, v, j) => s + v * b[j], 0);
    let v = 0;
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) v += g[i] * covariance[i][j] * g[j];
    const se = Math.sqrt(Math.max(0, v));
    return { xM2KPerW: x, efficiency: eff, ciLow: eff - tq * se, ciHigh: eff + tq * se, extrapolated: x < xRange[0] || x > xRange[1] };
  });

  const [eta0, a1, a2] = [est(0), est(1), est(2)];
  if (m < 16) warnings.push(`${m} valid points: the steady-state test asks for at least 16 (four inlet temperatures, four points each)`);
  if (!(eta0.value > 0 && eta0.value <= 1)) warnings.push(`η0 = ${eta0.value.toFixed(4)} is outside (0, 1]: check the area, flow and irradiance units`);
  if (a1.value < 0) warnings.push(`a1 = ${a1.value.toFixed(3)} W/(m²·K) is negative: heat losses would fall as the collector warms`);
  if (a2.value < 0) warnings.push(`a2 = ${a2.value.toFixed(4)} W/(m²·K²) is negative; ISO 9806 practice is to refit with a2 = 0 (order 1) when it is not significant`);
  const physical = eta0.value > 0 && eta0.value <= 1 && a1.value >= 0 && a2.value >= 0;
  return {
    ok: true, areaBasis: input.areaBasis, areaM2: A, eta0, a1WPerM2K: a1, a2WPerM2K2: a2,
    parameterNames: ['eta0', 'a1', 'a2'].slice(0, p), covariance, n: m, df,
    r2: sst > 0 ? 1 - ls.rss / sst : null, residualSD: Math.sqrt(s2), weighted, level,
    points: pts.map((q, i) => ({
      index: q.index, massFlowKgPerS: q.t.massFlowKgPerS, heatW: q.heatW, efficiency: q.efficiency, meanTempC: q.meanTempC,
      xM2KPerW: xs[i], fitted: fitted[i], residual: q.efficiency - fitted[i], efficiencyU: q.efficiencyU,
    })),
    excluded, band, bandIrradianceWPerM2: Gb, xRangeM2KPerW: xRange,
    parameters: physical ? { areaM2: A, areaBasis: input.areaBasis, eta0: eta0.value, a1WPerM2K: a1.value, a2WPerM2K2: a2.value } : null,
    warnings,
  };
}

function readTrial(t: CollectorTrial, i: number, rhoFluid: number | undefined) {
  const f = (k: string) => `trials[${i}].${k}`;
  if (t === null || typeof t !== 'object') throw new TypeError(`trials[${i}] must be an object`);
  const inletTempC = requireFinite(t.inletTempC, f('inletTempC'));
  let massFlowKgPerS: number;
  if (t.massFlowKgPerS !== undefined) massFlowKgPerS = requirePositive(t.massFlowKgPerS, f('massFlowKgPerS'));
  else if (t.flowM3PerS !== undefined) massFlowKgPerS = requirePositive(t.flowM3PerS, f('flowM3PerS')) * (rhoFluid ?? waterDensityKgPerM3(inletTempC, undefined, f('inletTempC')));
  else throw new RangeError(`${f('flowM3PerS')} or ${f('massFlowKgPerS')} is required`);
  const s = t.spread;
  return {
    irradianceWPerM2: requirePositive(t.irradianceWPerM2, f('irradianceWPerM2')),
    inletTempC,
    outletTempC: requireFinite(t.outletTempC, f('outletTempC')),
    ambientTempC: requireFinite(t.ambientTempC, f('ambientTempC')),
    massFlowKgPerS,
    windMPerS: t.windMPerS === undefined ? undefined : requireNonNegative(t.windMPerS, f('windMPerS')),
    spread: s === undefined ? undefined : {
      irradianceWPerM2: s.irradianceWPerM2 === undefined ? undefined : requireNonNegative(s.irradianceWPerM2, f('spread.irradianceWPerM2')),
      ambientTempK: s.ambientTempK === undefined ? undefined : requireNonNegative(s.ambientTempK, f('spread.ambientTempK')),
      inletTempK: s.inletTempK === undefined ? undefined : requireNonNegative(s.inletTempK, f('spread.inletTempK')),
      flowRelative: s.flowRelative === undefined ? undefined : requireNonNegative(s.flowRelative, f('spread.flowRelative')),
    },
  };
}
