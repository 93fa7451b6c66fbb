/**
 * Choosing a flow from a fitted heater (DOMAIN.md §1.2, §1.3, §1.6):
 * - an interior optimum of delivered heat q(V̇) = ρ·V̇·cp·(Tout(V̇) − Tin), with its standard
 *   uncertainty by the delta method, reported only when it lies inside the tested flow range (the
 *   exponential fit always has one at 1/k, largely an artefact of its shape; the coil has none);
 * - for the coil model, the flow at which q reaches a chosen fraction (default 90 %) of its
 *   ceiling UA·(Ts − Tin) (NTU = 0.2146 at 90 %);
 * - the minimum flow that keeps the outlet below each limit (boiling, 60, 49, 40 °C), best
 *   estimate with its uncertainty, and a conservative value where the upper prediction bound of
 *   the outlet meets the limit.
 */
import type { FitSuccess } from '../fit';
import { requireFinite, requireInRange } from '../units/guards';
import { goldenSectionMax } from '../stats/golden-section';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';
import { saturationTempC } from '../water/saturation-pressure';
import { CAUTION_THRESHOLDS_C } from '../safety/cautions';
import { ntuForCeilingFraction } from './coil-ntu';
import { deltaMethodU, fittedCurve, type FittedCurve } from './fitted-curve';

/** An outlet-temperature limit. */
export interface FlowLimit {
  label: string;
  limitC: number;
}

/** The default limits: boiling at 1 atm, 60 °C, 49 °C and the 40 °C spa limit. */
export const DEFAULT_FLOW_LIMITS: FlowLimit[] = [
  { label: 'boiling', limitC: saturationTempC(101325) },
  { label: 'scalds in seconds', limitC: CAUTION_THRESHOLDS_C.scaldSeconds },
  { label: 'scald', limitC: CAUTION_THRESHOLDS_C.scald },
  { label: 'spa', limitC: CAUTION_THRESHOLDS_C.spaLimit },
];

/** Minimum flow for one limit. */
export interface MinimumFlow extends FlowLimit {
  /** best estimate, m³/s; 0 when the outlet never reaches the limit; null when no flow in range keeps it below */
  flowM3PerS: number | null;
  /** standard uncertainty of the best estimate, m³/s (null when not available) */
  flowU: number | null;
  /** where the upper prediction bound of the outlet meets the limit, m³/s (null as above) */
  conservativeFlowM3PerS: number | null;
  extrapolated: boolean;
  note: string;
}

/** Everything `chooseFlow` reports. */
export interface FlowChoice {
  model: string;
  inletTempC: number;
  optimum: { flowM3PerS: number; flowU: number | null; heatW: number; heatU: number | null } | null;
  optimumNote: string;
  ceiling: { fraction: number; flowM3PerS: number; flowU: number | null; heatCeilingW: number; heatCeilingU: number | null; extrapolated: boolean } | null;
  minimumFlows: MinimumFlow[];
  notes: string[];
}

function heatAt(curve: FittedCurve, p: ArrayLike<number>, x: number, tin: number, rhoCp: number): number {
  return rhoCp * x * (curve.evaluate(p, [x], tin)[0] - tin);
}

/** Interior maximum of q on [a, b]; null when the maximum is at an end. */
function interiorMax(curve: FittedCurve, p: ArrayLike<number>, a: number, b: number, tin: number, rhoCp: number): number | null {
  const n = 200;
  const xs = Array.from({ length: n + 1 }, (_, i) => a + ((b - a) * i) / n);
  const ys = curve.evaluate(p, xs, tin);
  let best = 0;
  for (let i = 1; i <= n; i++) if (xs[i] * (ys[i] - tin) > xs[best] * (ys[best] - tin)) best = i;
  if (best === 0 || best === n) return null;
  return goldenSectionMax((x) => heatAt(curve, p, x, tin, rhoCp), xs[best - 1], xs[best + 1], { maxIterations: 200, relTol: 1e-13 });
}

/**
 * Smallest flow in [a, b] above which y(x) ≤ limit: a 400-point log grid finds the last flow where
 * y exceeds the limit (or is not finite), then bisection the crossing after it. The one search for
 * minimum flows (here and in test planning).
 * @param y outlet temperature (or its upper bound), °C, at a flow
 * @param a lowest flow, m³/s, > 0
 * @param b highest flow, m³/s, > a
 * @param limit °C
 * @param yGrid optional: y at many flows in one call, the same values as `y` at each (a fitted
 *   curve evaluates a whole grid far faster than one flow at a time); the grid scan uses it
 * @returns m³/s; 0 when y ≤ limit over the whole range; null when y exceeds it even at b
 * @example lowestFlowBelowLimit((x) => 20 + 1e-3 / x, 1e-5, 1e-3, 30) // ≈ 1e-4
 */
export function lowestFlowBelowLimit(y: (x: number) => number, a: number, b: number, limit: number, yGrid?: (xs: number[]) => ArrayLike<number>): number | null {
  const n = 400;
  const xs = Array.from({ length: n + 1 }, (_, i) => a * (b / a) ** (i / n));
  const ys = yGrid ? yGrid(xs) : xs.map(y);
  let last = -1;
  for (let i = 0; i <= n; i++) if (!(ys[i] <= limit)) last = i;
  if (last === -1) return 0;
  if (last === n) return null;
  let lo = xs[last], hi = xs[last + 1];
  for (let i = 0; i < 100 && hi - lo > 1e-14 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (!(y(mid) <= limit)) lo = mid; else hi = mid;
  }
  return hi; // the side where y ≤ limit
}

/**
 * @param fit a successful fit (heater built-ins: x = volume flow m³/s, y = outlet °C)
 * @param inletTempC the inlet temperature to plan for, °C
 * @param options.fraction of the coil's heat ceiling (default 0.9); options.limits (default
 *   DEFAULT_FLOW_LIMITS); options.level for the conservative bound (default the fit's)
 * @throws RangeError for a fraction outside (0, 1) or an inlet outside the water range.
 * @example chooseFlow(coilFit, 20).ceiling?.flowM3PerS
 */
export function chooseFlow(
  fit: FitSuccess, inletTempC: number, options: { fraction?: number; limits?: FlowLimit[]; level?: number } = {},
): FlowChoice {
  const tin = requireFinite(inletTempC, 'inletTempC');
  const rho = waterDensityKgPerM3(tin, undefined, 'inletTempC');
  const cp = waterCpJPerKgK(tin);
  const rhoCp = rho * cp;
  const fraction = options.fraction ?? 0.9;
  const level = requireInRange(options.level ?? fit.level, 'level', 0.5, 0.9999);
  const curve = fittedCurve(fit);
  const [lo, hi] = curve.xRange;
  const p0 = curve.values;
  const notes: string[] = [];

  // interior optimum of delivered heat
  let optimum: FlowChoice['optimum'] = null;
  let optimumNote: string;
  const xStar = interiorMax(curve, p0, lo, hi, tin, rhoCp);
  if (xStar !== null) {
    const flowU = deltaMethodU(curve, (p) => interiorMax(curve, p, lo, hi, tin, rhoCp));
    const heatU = deltaMethodU(curve, (p) => {
      const x = interiorMax(curve, p, lo, hi, tin, rhoCp);
      return x === null ? null : heatAt(curve, p, x, tin, rhoCp);
    });
    optimum = { flowM3PerS: xStar, flowU, heatW: heatAt(curve, p0, xStar, tin, rhoCp), heatU };
    optimumNote = 'Delivered heat has a maximum inside the tested flows.';
    if (fit.model.startsWith('exp')) optimumNote += ' An exponential fit always has one (at 1/k), whatever the hardware does: compare with the coil model before relying on it.';
  } else {
    const wide = interiorMax(curve, p0, lo / 10, hi * 10, tin, rhoCp);
    optimumNote = fit.model === 'coil'
      ? 'The coil model has no optimum: heat keeps rising with flow towards its ceiling UA·(Ts − Tin). Choose a flow by the fraction of the ceiling, the pump or the outlet limits.'
      : wide !== null
        ? `The model's heat maximum (${(wide * 60000).toFixed(2)} L/min) lies outside the tested flows, so it is not reported: test around it first.`
        : 'No maximum of delivered heat inside the tested flows.';
  }

  // coil: fraction of the ceiling
  let ceiling: FlowChoice['ceiling'] = null;
  const iTs = curve.parameterNames.indexOf('Ts'), iUA = curve.parameterNames.indexOf('UA');
  if (fit.model === 'coil' && iTs >= 0 && iUA >= 0) {
    const N = ntuForCeilingFraction(fraction);
    const flowOf = (p: number[]) => p[iUA] / (N * rhoCp);
    const q = (p: number[]) => p[iUA] * (p[iTs] - tin);
    const f = flowOf(p0);
    ceiling = {
      fraction, flowM3PerS: f, flowU: deltaMethodU(curve, flowOf), heatCeilingW: q(p0), heatCeilingU: deltaMethodU(curve, q),
      extrapolated: f < lo || f > hi,
    };
  }

  // minimum flows for outlet limits
  const a = lo / 20, b = hi * 20;
  const minimumFlows = (options.limits ?? DEFAULT_FLOW_LIMITS).map((lim): MinimumFlow => {
    const L = requireFinite(lim.limitC, 'limits[].limitC');
    const base = { label: lim.label, limitC: L };
    if (!(L > tin)) return { ...base, flowM3PerS: null, flowU: null, conservativeFlowM3PerS: null, extrapolated: false, note: 'The inlet is already at or above this limit.' };
    const best = (p: number[]) => lowestFlowBelowLimit((x) => curve.evaluate(p, [x], tin)[0], a, b, L, (xs) => curve.evaluate(p, xs, tin));
    const f = best(p0);
    const flowU = f !== null && f > 0 ? deltaMethodU(curve, (p) => { const v = best(p); return v === null || v === 0 ? null : v; }) : null;
    const cons = lowestFlowBelowLimit((x) => curve.band([x], tin, level)[0].piHigh, a, b, L, (xs) => curve.band(xs, tin, level).map((q) => q.piHigh));
    const worst = cons === null ? f : Math.max(f ?? 0, cons);
    const extrapolated = (f !== null && f > 0 && (f < lo || f > hi)) || (cons !== null && cons > 0 && (cons < lo || cons > hi));
    let note: string;
    if (f === null) note = 'No flow in the considered range keeps the outlet below this limit.';
    else if (f === 0 && (cons ?? 0) === 0) note = 'The outlet stays below this limit at every flow considered.';
    else note = `Keep the flow above ${(((worst ?? f) as number) * 60000).toFixed(2)} L/min (the conservative value) to stay below ${L.toFixed(1)} °C.`;
    if (extrapolated) note += ' This lies outside the tested flows: treat it as an estimate.';
    return { ...base, flowM3PerS: f, flowU, conservativeFlowM3PerS: cons, extrapolated, note };
  });
  if (!curve.inletTransferable) notes.push(`The ${fit.model} model is empirical: these flows hold only at the inlet temperature it was fitted at.`);
  return { model: fit.model, inletTempC: tin, optimum, optimumNote, ceiling, minimumFlows, notes };
}
