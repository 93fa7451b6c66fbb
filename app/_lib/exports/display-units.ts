import { convert, fromSI } from '@/analysis/units/parse-quantity';

/** Which units the headers and converted values use: SI-style lab units or US customary. */
export type UnitSystem = 'si' | 'us';

/** Quantities that appear in exports (values inside are SI, temperatures in °C). */
export type ExportQuantity =
  | 'volumeFlow' | 'massFlow' | 'temperature' | 'temperatureDifference' | 'power' | 'conductance'
  | 'volume' | 'mass' | 'energy' | 'irradiance' | 'speed' | 'length' | 'area' | 'time';

/** A display unit: its label for headers and an exact affine map from the SI value. */
export interface DisplayUnit {
  /** as people write it: "L/min", "°F", "Btu/h" */
  label: string;
  /** the mathjs unit the factors come from (analysis/units, NIST SP 811 factors) */
  mathUnit: string;
  /** display = si · factor + offset */
  factor: number;
  offset: number;
}

// [SI value's unit, si display, us display]; labels beside the mathjs names.
const TABLE: Record<ExportQuantity, [si: string, siShow: [string, string], usShow: [string, string]]> = {
  volumeFlow: ['m^3/s', ['L/min', 'L/min'], ['gpm', 'gpm']],
  massFlow: ['kg/s', ['kg/s', 'kg/s'], ['lb/min', 'lb/min']],
  temperature: ['degC', ['°C', 'degC'], ['°F', 'degF']],
  temperatureDifference: ['K', ['K', 'K'], ['°F', 'degFdiff']],
  power: ['W', ['kW', 'kW'], ['Btu/h', 'Btu/hour']],
  conductance: ['W/K', ['W/K', 'W/K'], ['Btu/(h·°F)', 'Btu/(hour degFdiff)']],
  volume: ['m^3', ['L', 'L'], ['gal', 'gal']],
  mass: ['kg', ['kg', 'kg'], ['lb', 'lb']],
  energy: ['J', ['kWh', 'kWh'], ['therm', 'therm']],
  irradiance: ['W/m^2', ['W/m²', 'W/m^2'], ['Btu/(h·ft²)', 'Btu/(hour ft^2)']],
  speed: ['m/s', ['m/s', 'm/s'], ['mph', 'mph']],
  length: ['m', ['m', 'm'], ['ft', 'ft']],
  area: ['m^2', ['m²', 'm^2'], ['ft²', 'ft^2']],
  time: ['s', ['s', 's'], ['s', 's']],
};

const cache = new Map<string, DisplayUnit>();

/**
 * The display unit of a quantity in a unit system, with its conversion from SI taken once from
 * analysis/units (`convert`, `fromSI`; NIST SP 811 factors) as an affine map, so that a long
 * series converts without a mathjs call per value.
 * @example displayUnit('temperature', 'us') // { label: '°F', factor: 1.8, offset: 32, … }
 */
export function displayUnit(quantity: ExportQuantity, system: UnitSystem): DisplayUnit {
  const id = `${quantity}:${system}`;
  const hit = cache.get(id);
  if (hit) return hit;
  const row = TABLE[quantity];
  if (!row) throw new RangeError(`unknown quantity ${JSON.stringify(quantity)}`);
  const [siUnit, siShow, usShow] = row;
  const [label, mathUnit] = system === 'us' ? usShow : siShow;
  let factor: number, offset: number;
  if (quantity === 'temperature') {
    offset = fromSI(0, 'temperature', mathUnit);
    factor = fromSI(1, 'temperature', mathUnit) - offset;
  } else {
    offset = 0;
    factor = convert(1, siUnit, mathUnit);
  }
  // 15 significant digits drop binary noise (1.7999999999999998 → 1.8); SP 811 factors have fewer
  const unit = { label, mathUnit, factor: Number(factor.toPrecision(15)), offset: Number(offset.toPrecision(15)) };
  cache.set(id, unit);
  return unit;
}

/**
 * Converts an SI value for display; null and undefined stay null.
 * @example toDisplay(2.8390588e-4, 'volumeFlow', 'us') // ≈ 4.5 (gpm)
 */
export function toDisplay(value: number | null | undefined, quantity: ExportQuantity, system: UnitSystem): number | null {
  if (value === null || value === undefined) return null;
  const u = displayUnit(quantity, system);
  return value * u.factor + u.offset;
}

/**
 * A difference or spread (standard error, interval half-width) for display: the factor only.
 * Temperatures become temperature differences.
 * @example spreadToDisplay(1, 'temperature', 'us') // 1.8
 */
export function spreadToDisplay(value: number | null | undefined, quantity: ExportQuantity, system: UnitSystem): number | null {
  if (value === null || value === undefined) return null;
  return value * displayUnit(quantity, system).factor;
}
