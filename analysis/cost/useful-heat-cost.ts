/**
 * Cost per useful therm (100,000 Btu delivered to the water) and per degree of a pool
 * (DOMAIN.md §6): c = price / (heat content per unit × η), with η the COP for a heat pump.
 * Money is in whatever currency the price is in; results are not rounded (round at display).
 * A heat pump takes a single COP or a COP-by-air-temperature table (heat-pump-cop.ts).
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import { convert } from '../units/parse-quantity';
import { energyPerDegreeJPerK } from '../pool/energy-per-degree';
import { FUELS, type FuelKind } from './fuels';
import { copAtAirTemp, type CopAtAir, type CopPoint } from './heat-pump-cop';

/** Joules in one useful therm (100,000 Btu_IT, the EIA therm). */
export const USEFUL_THERM_J = convert(100_000, 'Btu', 'J');

/** Inputs of the cost of useful heat. */
export interface UsefulHeatCostInput {
  fuel: FuelKind;
  /** price per the fuel's price unit (therm, gal, kWh, cord) */
  pricePerUnit: number;
  /** efficiency 0–1, or COP for the heat pump; default from FUELS */
  efficiency?: number;
  /** heat content per price unit, J (HHV); default from FUELS */
  heatContentJ?: number;
  /** heat pump only: COP by air temperature, instead of `efficiency` (needs `airTempC`) */
  copTable?: CopPoint[];
  /** heat pump only: the air temperature to read `copTable` at, °C */
  airTempC?: number;
}

/** Cost of useful heat. */
export interface UsefulHeatCost {
  perUsefulTherm: number;
  perUsefulKWh: number;
  efficiency: number;
  heatContentJ: number;
  basis: 'HHV';
  priceUnit: string;
  /** how the COP was read from `copTable` (present only when a table was given) */
  copAtAir?: CopAtAir;
}

/**
 * @throws TypeError / RangeError naming the field: negative price, efficiency outside (0, 1]
 *   for a burner or resistance heater, COP ≤ 0, heat content ≤ 0, unknown fuel; a `copTable`
 *   for another fuel, with `efficiency` too, or without `airTempC`.
 * @example usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.2, efficiency: 4 }).perUsefulTherm // ≈ 1.465
 * @example usefulHeatCost({ fuel: 'heat-pump', pricePerUnit: 0.2, copTable: [{ airTempC: 5, cop: 3 }, { airTempC: 25, cop: 5 }], airTempC: 25 }).perUsefulTherm // ≈ 1.172
 */
export function usefulHeatCost(i: UsefulHeatCostInput): UsefulHeatCost {
  const info = FUELS[i.fuel];
  if (!info) throw new RangeError(`fuel must be one of ${Object.keys(FUELS).join(', ')}, got ${JSON.stringify(i.fuel)}`);
  const price = requireNonNegative(i.pricePerUnit, 'pricePerUnit');
  let copAtAir: CopAtAir | undefined;
  if (i.copTable !== undefined) {
    if (i.fuel !== 'heat-pump') throw new RangeError(`copTable applies to the heat-pump fuel only, got ${JSON.stringify(i.fuel)}`);
    if (i.efficiency !== undefined) throw new RangeError('give efficiency (a single COP) or copTable, not both');
    if (i.airTempC === undefined) throw new RangeError('airTempC is required with copTable');
    copAtAir = copAtAirTemp(i.copTable, i.airTempC);
  } else if (i.airTempC !== undefined) throw new RangeError('airTempC is used only with copTable');
  const eff = requirePositive(copAtAir?.cop ?? i.efficiency ?? info.defaultEfficiency, i.fuel === 'heat-pump' ? 'cop' : 'efficiency');
  if (i.fuel !== 'heat-pump' && eff > 1) throw new RangeError(`efficiency must be at most 1, got ${eff}`);
  const hc = requirePositive(i.heatContentJ ?? info.heatContentJ, 'heatContentJ');
  const perJ = price / (hc * eff);
  const out: UsefulHeatCost = { perUsefulTherm: perJ * USEFUL_THERM_J, perUsefulKWh: perJ * 3.6e6, efficiency: eff, heatContentJ: hc, basis: 'HHV', priceUnit: info.priceUnit };
  if (copAtAir) out.copAtAir = copAtAir;
  return out;
}

/**
 * Cost to raise a body of water by one degree (losses during heat-up not included).
 * @param volumeM3 water volume, m³
 * @param perUsefulTherm cost of one useful therm
 * @param tempC water temperature for ρ and cp, °C (default 25)
 * @returns { perDegF, perK }
 * @example costPerDegree(40, 2) // { perDegF: 1.756, perK: 3.162 }
 */
export function costPerDegree(volumeM3: number, perUsefulTherm: number, tempC = 25): { perDegF: number; perK: number } {
  const c = requireNonNegative(perUsefulTherm, 'perUsefulTherm');
  const perK = (energyPerDegreeJPerK(volumeM3, tempC) / USEFUL_THERM_J) * c;
  return { perDegF: perK / 1.8, perK };
}

/**
 * Useful heat implied by a fuel bill: therms bought × η.
 * @example usefulThermsFromBill(1200, 1.5, 0.8) // 640
 */
export function usefulThermsFromBill(billCost: number, pricePerTherm: number, efficiency: number): number {
  return (requireNonNegative(billCost, 'billCost') / requirePositive(pricePerTherm, 'pricePerTherm')) * requirePositive(efficiency, 'efficiency');
}

/**
 * Fractional saving of `after` against `before`.
 * @example savingFraction(1000, 250) // 0.75
 */
export function savingFraction(before: number, after: number): number {
  const b = requirePositive(before, 'before');
  return (b - requireFinite(after, 'after')) / b;
}
