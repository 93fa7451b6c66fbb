/**
 * The GUM budget of a bucket-and-thermometer trial (DOMAIN.md §2.5):
 *     V̇ = V / (t̄ + δt),   q = ρ · V̇ · cp · (Tout − Tin),
 * with inputs: bucket volume V (usually rectangular ± a), the mean fill time t̄ (Type A, ν = n − 1),
 * the timing correction δt = 0 (start and stop events, each ± its own u, combined √2·u),
 * and the two temperatures (rectangular ± a each; optional correlation r between the sensors).
 * Returns one budget for the flow and one for the heat rate.
 */
import { requireInRange, requireNonNegative, requirePositive } from '../units/guards';
import { trialWaterProperties } from '../water/trial-water';
import { bucketFlow } from './bucket-flow';
import { gumBudget, rectangularU, type Budget, type BudgetInput } from './gum-budget';

/** Inputs of the trial budget, SI (volumes in m³, times in s, temperatures in °C / K). */
export interface HeatRateBudgetInput {
  bucketVolumeM3: number;
  /** half-width of the bucket-volume error, m³ (rectangular); or give `volumeUncertaintyM3` */
  volumeHalfWidthM3?: number;
  /** standard uncertainty of the bucket volume, m³ (normal) */
  volumeUncertaintyM3?: number;
  fillTimesS: number[];
  /** standard uncertainty of each timing event (start, stop), s; default 0.1 s (from memory, DOMAIN.md §2.5) */
  timingEventUncertaintyS?: number;
  inletTempC: number;
  outletTempC: number;
  /** half-width of each sensor's error, K (rectangular), e.g. 1.0 for Type T standard limits */
  sensorHalfWidthK: number;
  /** correlation between the two sensors' errors, −1…1 (default 0) */
  sensorCorrelation?: number;
  /** kg/m³; default IF97 at the outlet (bucket) temperature */
  densityKgPerM3?: number;
  /** J/(kg·K); default IF97 at the mean water temperature */
  cpJPerKgK?: number;
  /** coverage probability for k from ν_eff (default 0.95), unless `k` is fixed */
  level?: number;
  k?: number;
}

/** Budgets of a trial. */
export interface HeatRateBudget {
  flow: Budget;
  heat: Budget;
  densityKgPerM3: number;
  cpJPerKgK: number;
}

/**
 * Builds the flow and heat-rate budgets.
 * @throws TypeError / RangeError naming the field (non-positive volume or times, outlet below
 *   inlet, temperatures outside the water formulation, |r| > 1).
 * @example heatRateBudget({ bucketVolumeM3: 0.02, volumeHalfWidthM3: 0.0001, fillTimesS: [79.8, 80.4, 80.1],
 *   inletTempC: 17.5, outletTempC: 45, sensorHalfWidthK: 0.5, k: 2 }).heat.U // ≈ 874 W (the demo lab's 20 L bucket)
 */
export function heatRateBudget(o: HeatRateBudgetInput): HeatRateBudget {
  const V = requirePositive(o.bucketVolumeM3, 'bucketVolumeM3');
  const flow = bucketFlow(V, o.fillTimesS);
  let uV: number;
  let vDist: string;
  if (o.volumeUncertaintyM3 !== undefined) {
    uV = requireNonNegative(o.volumeUncertaintyM3, 'volumeUncertaintyM3');
    vDist = 'normal';
  } else {
    uV = rectangularU(requireNonNegative(o.volumeHalfWidthM3 ?? 0, 'volumeHalfWidthM3'));
    vDist = 'rectangular';
  }
  const uEvent = requireNonNegative(o.timingEventUncertaintyS ?? 0.1, 'timingEventUncertaintyS');
  const Tin = o.inletTempC, Tout = o.outletTempC;
  const water = trialWaterProperties(Tin, Tout);
  if (Tout < Tin) throw new RangeError(`outletTempC (${Tout}) is below inletTempC (${Tin}): inconsistent for a heater`);
  const rho = o.densityKgPerM3 === undefined ? water.densityKgPerM3 : requirePositive(o.densityKgPerM3, 'densityKgPerM3');
  const cp = o.cpJPerKgK === undefined ? water.cpJPerKgK : requirePositive(o.cpJPerKgK, 'cpJPerKgK');
  const uT = rectangularU(requireNonNegative(o.sensorHalfWidthK, 'sensorHalfWidthK'));
  const r = requireInRange(o.sensorCorrelation ?? 0, 'sensorCorrelation', -1, 1);

  const volumeAndTime: BudgetInput[] = [
    { name: 'bucket volume', value: V, u: uV, distribution: vDist, unit: 'm^3' },
    { name: 'fill time (scatter of fills)', value: flow.meanTimeS, u: flow.typeAUncertaintyS, dof: flow.n > 1 ? flow.dof : undefined, distribution: 'type A', unit: 's' },
    { name: 'fill time (start and stop events)', value: 0, u: Math.SQRT2 * uEvent, distribution: 'normal', unit: 's' },
  ];
  const flowFn = ([v, t, dt]: number[]) => v / (t + dt);
  const level = o.level;
  const flowBudget = gumBudget(flowFn, volumeAndTime, { level, k: o.k });
  const inputs: BudgetInput[] = [
    ...volumeAndTime,
    { name: 'inlet temperature', value: Tin, u: uT, distribution: 'rectangular', unit: 'degC' },
    { name: 'outlet temperature', value: Tout, u: uT, distribution: 'rectangular', unit: 'degC' },
  ];
  const heatFn = ([v, t, dt, tin, tout]: number[]) => rho * (v / (t + dt)) * cp * (tout - tin);
  const heat = gumBudget(heatFn, inputs, {
    level, k: o.k,
    correlations: r !== 0 ? [{ a: 'inlet temperature', b: 'outlet temperature', r }] : [],
  });
  return { flow: flowBudget, heat, densityKgPerM3: rho, cpJPerKgK: cp };
}
