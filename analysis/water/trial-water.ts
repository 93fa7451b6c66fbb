/**
 * The water properties of a heater trial, written once for every path that needs them (trial
 * derivations, GUM budgets, the coil fit's defaults, the `coil` command): the density of the water
 * whose volume was measured (DOMAIN.md §1.1: a bucket holds outlet water, so ρ(Tout) by default)
 * and cp at the mean of the inlet and outlet temperatures, both IAPWS-IF97 at 1 atm.
 */
import { waterCpJPerKgK, waterDensityKgPerM3 } from './water-properties';

/** Where the trial's volume flow was measured. */
export type VolumeMeasuredAt = 'outlet' | 'inlet';

/** Density and specific heat of a trial's water. */
export interface TrialWater {
  /** kg/m³, at the temperature of the measured water */
  densityKgPerM3: number;
  /** J/(kg·K), at the mean water temperature */
  cpJPerKgK: number;
}

/**
 * @param inletTempC °C
 * @param outletTempC °C
 * @param measuredAt which water's volume was measured (default 'outlet': the bucket)
 * @param fields how errors name the two temperatures (default inletTempC, outletTempC)
 * @throws TypeError when not finite; RangeError naming the field for a temperature outside liquid water at 1 atm (0–100 °C).
 * @example trialWaterProperties(17.5, 52) // { densityKgPerM3: 987.1, cpJPerKgK: 4179.0 } (a Stovepipe Coil A trial of the demo lab)
 */
export function trialWaterProperties(
  inletTempC: number, outletTempC: number, measuredAt: VolumeMeasuredAt = 'outlet',
  fields: { inlet: string; outlet: string } = { inlet: 'inletTempC', outlet: 'outletTempC' },
): TrialWater {
  const rhoIn = waterDensityKgPerM3(inletTempC, undefined, fields.inlet);
  const rhoOut = waterDensityKgPerM3(outletTempC, undefined, fields.outlet);
  return {
    densityKgPerM3: measuredAt === 'inlet' ? rhoIn : rhoOut,
    cpJPerKgK: waterCpJPerKgK((inletTempC + outletTempC) / 2),
  };
}
