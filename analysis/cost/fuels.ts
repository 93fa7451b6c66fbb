/**
 * Fuels and their heat content, with the sources of every default (DOMAIN.md §1.7, §6).
 * All heat contents are higher (gross) heating values, HHV, as US gas-appliance ratings use;
 * gross/net ratios are given to report an LHV (net) figure too. Prices are never defaulted:
 * they are the user's.
 */
import { convert } from '../units/parse-quantity';

export type FuelKind = 'natural-gas' | 'propane' | 'electric-resistance' | 'heat-pump' | 'wood';

/** One fuel's defaults. */
export interface FuelInfo {
  kind: FuelKind;
  /** the unit its price is quoted in */
  priceUnit: 'therm' | 'gal' | 'kWh' | 'cord';
  /** heat content per price unit, J (HHV) */
  heatContentJ: number;
  basis: 'HHV';
  /** HHV/LHV, when known */
  grossToNet: number | null;
  /** default efficiency (or COP for the heat pump) */
  defaultEfficiency: number;
  source: string;
}

const BTU = (btu: number) => convert(btu, 'Btu', 'J');

/** Defaults by fuel. Each `source` names where the number comes from. */
export const FUELS: Record<FuelKind, FuelInfo> = {
  'natural-gas': {
    kind: 'natural-gas', priceUnit: 'therm', heatContentJ: BTU(100_000), basis: 'HHV', grossToNet: 1073 / 971,
    defaultEfficiency: 0.82,
    source: '1 therm = 100,000 Btu (EIA, Units and calculators explained: Btu); 82 % minimum thermal efficiency of gas pool heaters since April 2013 (ASAP, DOE standard); HHV/LHV 1,073/971 Btu/ft³ (Menon, Piping Calculations Manual, via Engineers Edge). Field heaters often reach only 50–75 % (FSEC).',
  },
  propane: {
    kind: 'propane', priceUnit: 'gal', heatContentJ: BTU(91_452), basis: 'HHV', grossToNet: 21_500 / 19_770,
    defaultEfficiency: 0.82,
    source: '91,452 Btu per gallon of liquid propane (EIA); HHV/LHV 21,500/19,770 Btu/lb (Menon via Engineers Edge); 82 % as for gas pool heaters.',
  },
  'electric-resistance': {
    kind: 'electric-resistance', priceUnit: 'kWh', heatContentJ: 3.6e6, basis: 'HHV', grossToNet: null,
    defaultEfficiency: 1,
    source: '1 kWh = 3.6 MJ = 3,412 Btu (EIA; NIST SP 811); resistance heating delivers all of it (η ≈ 1).',
  },
  'heat-pump': {
    kind: 'heat-pump', priceUnit: 'kWh', heatContentJ: 3.6e6, basis: 'HHV', grossToNet: null,
    defaultEfficiency: 5,
    source: 'COP (delivered heat per electric energy) typically 3–7 at 80 °F air and water, falling as the air cools (DOE Energy Saver); 5 is a mid value: enter the COP of your unit at your air temperature.',
  },
  wood: {
    kind: 'wood', priceUnit: 'cord', heatContentJ: BTU(20e6), basis: 'HHV', grossToNet: null,
    defaultEfficiency: 0.3,
    source: 'About 20 million Btu per cord (EIA estimate; species range 15.5–32 MMBtu, moisture ignored). 30 % is our assumption for an open-fire coil: measure yours (fuel-efficiency.ts).',
  },
};

/**
 * Net (as-fired) calorific value of wet wood (Bioenergy Lists, "Heating value" practice page):
 * NCV = GCV·(1 − w) − 2.447·w − 2.447·h·9.01·(1 − w)   [MJ/kg, w and h as fractions].
 * @param gcvMJPerKg gross calorific value, dry basis, MJ/kg (18–21 for biomass)
 * @param moistureFraction moisture as a fraction of wet mass, 0–1
 * @param hydrogenFraction hydrogen as a fraction of dry mass (about 0.06)
 * @returns MJ/kg wet basis
 * @example woodNetCalorificValueMJPerKg(19, 0.25, 0.06) // ≈ 12.6
 */
export function woodNetCalorificValueMJPerKg(gcvMJPerKg: number, moistureFraction: number, hydrogenFraction = 0.06): number {
  if (!(gcvMJPerKg > 0)) throw new RangeError(`gcvMJPerKg must be greater than 0, got ${gcvMJPerKg}`);
  if (!(moistureFraction >= 0 && moistureFraction < 1)) throw new RangeError(`moistureFraction must be in [0, 1), got ${moistureFraction}`);
  if (!(hydrogenFraction >= 0 && hydrogenFraction < 0.2)) throw new RangeError(`hydrogenFraction must be in [0, 0.2), got ${hydrogenFraction}`);
  const w = moistureFraction;
  return gcvMJPerKg * (1 - w) - 2.447 * w - 2.447 * hydrogenFraction * 9.01 * (1 - w);
}
