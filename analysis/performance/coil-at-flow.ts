/**
 * The constant-source coil at a measured volume flow (DOMAIN.md §1.1, §1.2): the mass flow is
 * ṁ = ρ·V̇ with ρ at the temperature of the water whose volume was measured (the outlet for a
 * bucket, as in the trials), and cp at the mean water temperature: the trial water rule of
 * analysis/water/trial-water.ts, the same the coil fit uses, so a UA fitted from trials and the
 * outlet predicted for it agree. Because ρ(Tout) and cp depend on the outlet, the relation is
 * solved by fixed-point iteration (the properties change by less than 1e-3 per kelvin, so it
 * contracts at once; a few iterations reach round-off).
 */
import { requireFinite, requirePositive } from '../units/guards';
import { trialWaterProperties, type VolumeMeasuredAt } from '../water/trial-water';
import { coilPerformance, type CoilResult } from './coil-ntu';

/** The coil at a measured flow, with the water properties used. */
export interface CoilAtFlow extends CoilResult {
  massFlowKgPerS: number;
  /** kg/m³ of the measured water (null when a mass flow was given) */
  densityKgPerM3: number | null;
  cpJPerKgK: number;
}

/** Liquid range of the property evaluation at 1 atm: an outlet past boiling is evaluated at the boiling point (its cautions say so). */
const liquid = (tC: number) => Math.min(Math.max(tC, 0), 99.97);

/**
 * @param o give exactly one of `flowM3PerS` (volume flow, > 0) and `massFlowKgPerS` (> 0)
 * @param o.measuredAt which water's volume the flow is (default 'outlet', the bucket)
 * @throws TypeError / RangeError naming the field (non-positive flow or UA, a source outside
 *   0…1000 °C, an inlet outside liquid water at 1 atm, neither or both flows).
 * @example coilAtFlow({ sourceTempC: 88, inletTempC: 17.5, uaWPerK: 430, flowM3PerS: 1.5e-4 }).outletTempC // ≈ 52.8 (the demo lab's Stovepipe Coil A at 9 L/min)
 */
export function coilAtFlow(o: {
  sourceTempC: number; inletTempC: number; uaWPerK: number; flowM3PerS?: number; massFlowKgPerS?: number; measuredAt?: VolumeMeasuredAt;
}): CoilAtFlow {
  if ((o.flowM3PerS === undefined) === (o.massFlowKgPerS === undefined)) throw new RangeError('give exactly one of flowM3PerS and massFlowKgPerS');
  const flow = o.flowM3PerS === undefined ? null : requirePositive(o.flowM3PerS, 'flowM3PerS');
  const mass = o.massFlowKgPerS === undefined ? null : requirePositive(o.massFlowKgPerS, 'massFlowKgPerS');
  const Tin = requireFinite(o.inletTempC, 'inletTempC');
  const at = o.measuredAt ?? 'outlet';
  const solve = (tOut: number) => {
    const water = trialWaterProperties(Tin, liquid(tOut), at);
    const m = mass ?? water.densityKgPerM3 * (flow as number);
    return { water, m, r: coilPerformance({ sourceTempC: o.sourceTempC, inletTempC: Tin, uaWPerK: o.uaWPerK, massFlowKgPerS: m, cpJPerKgK: water.cpJPerKgK }) };
  };
  let s = solve(Tin);
  for (let i = 0; i < 50; i++) {
    const next = solve(s.r.outletTempC);
    const done = Math.abs(next.r.outletTempC - s.r.outletTempC) <= 1e-13 * Math.max(1, Math.abs(s.r.outletTempC));
    s = next;
    if (done) break;
  }
  return { ...s.r, massFlowKgPerS: s.m, densityKgPerM3: mass === null ? s.water.densityKgPerM3 : null, cpJPerKgK: s.water.cpJPerKgK };
}
