import { extent } from '../stats/extent';
import { goldenSectionMax } from '../stats/golden-section';
import { fittedCurve, type FittedCurve } from './fitted-curve';
import type { FitSuccess } from './types';

/** The flow that maximises delivered heat, when there is one inside the searched range. */
export interface HeatOptimum {
  /** the maximum lies strictly inside the range (not at an end) */
  interior: boolean;
  /** flow at the maximum within the range (m³/s); the range end when not interior */
  flowM3PerS: number;
  /** heat delivered there, ρ·cp·Q·(Tout − Tin) (W) */
  heatW: number;
  /** searched range (m³/s) */
  range: [number, number];
  /** plain words */
  note: string;
}

/**
 * Maximises delivered heat q(Q) = ρ·cp·Q·(Tout(Q) − Tin) over a flow range for a fitted heater
 * model (x = volume flow in m³/s, y = outlet temperature in °C): a 400-point scan, then golden-section
 * refinement around the best point. DOMAIN.md §1.2–1.3: the constant-source coil has no interior
 * maximum (q rises toward UA·(Ts − Tin)); the exponential-toward-inlet form always has one at Q = 1/k.
 *
 * @param fit - a successful fit (or a {@link FittedCurve} from a bootstrap resample)
 * @param options.TinC - inlet temperature (°C), default the mean over the fitted data
 * @param options.rhoKgPerM3 - water density (kg/m³), default the fit's mean rho covariate or 1000
 * @param options.cpJPerKgK - specific heat (J/(kg·K)), default the fit's mean cp covariate or 4186
 * @param options.range - flow range to search (m³/s), default the tested range (optimum reported only inside it)
 * @returns the optimum (interior: false when heat rises or falls monotonically over the range)
 * @throws RangeError for a range that is not increasing and positive, or a model that cannot be evaluated there
 * @example heatOptimum(expInletFit).flowM3PerS * 60000 // 1/k of the fit, in L/min
 */
export function heatOptimum(fit: FitSuccess | FittedCurve, options: { TinC?: number; rhoKgPerM3?: number; cpJPerKgK?: number; range?: [number, number] } = {}): HeatOptimum {
  const curve = 'predict' in fit ? fit : fittedCurve(fit);
  const { spec } = curve;
  const tin = options.TinC ?? spec.covariateMeans.Tin;
  if (typeof tin !== 'number' || !Number.isFinite(tin)) throw new RangeError('heatOptimum: an inlet temperature TinC is needed (the fit has no Tin covariate)');
  const rho = options.rhoKgPerM3 ?? spec.covariateMeans.rho ?? 1000;
  const cp = options.cpJPerKgK ?? spec.covariateMeans.cp ?? 4186;
  const range = options.range ?? extent(spec.x);
  const [a, b] = range;
  if (!(a >= 0 && b > a && Number.isFinite(b))) throw new RangeError(`heatOptimum: range must satisfy 0 ≤ from < to, got [${a}, ${b}]`);
  const cov = { Tin: tin, rho, cp };
  const heat = (q: number[]): number[] => {
    const t = curve.predict(q, cov);
    return q.map((v, i) => rho * cp * v * (t[i] - tin));
  };
  const N = 400;
  const grid = Array.from({ length: N + 1 }, (_, k) => a + ((b - a) * k) / N);
  const h = heat(grid);
  if (h.some((v) => !Number.isFinite(v))) throw new RangeError('heatOptimum: the model cannot be evaluated over the whole range');
  let k = 0;
  for (let i = 1; i <= N; i++) if (h[i] > h[k]) k = i;
  if (k === 0 || k === N) {
    return { interior: false, flowM3PerS: grid[k], heatW: h[k], range, note: k === N ? 'heat keeps rising with flow over the range: no interior optimum' : 'heat falls with flow over the whole range: no interior optimum' };
  }
  const q = goldenSectionMax((v) => heat([v])[0], grid[k - 1], grid[k + 1], { maxIterations: 80, relTol: 1e-12 });
  return { interior: true, flowM3PerS: q, heatW: heat([q])[0], range, note: 'interior maximum of delivered heat inside the searched range' };
}
