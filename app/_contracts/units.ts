/**
 * The one units edge: SI values (as stored and computed) → the reader's display units, with their
 * labels, for every screen, plot and export. Isomorphic on purpose — no 'server-only', no React,
 * no entities — so client components, server pages, `app/_lib/plots` and `app/_lib/exports` all
 * import this module and nothing else converts for display.
 *
 * The factors are composed from the exact definitions of analysis/units/exact-factors.ts (NIST SP
 * 811 B.8/B.9), the same table the mathjs instance of analysis/units is built from; the browser
 * does not load mathjs for them. Each factor is rounded to 15 significant digits (binary noise:
 * 1.7999999999999998 → 1.8), and test/unit/units/display.test.ts checks every one against
 * mathjs's conversion of `mathUnit` (analysis/units `convert`). Typed input goes the other way
 * through `parseQuantity` of analysis/units, with `mathUnit` as the unit to append.
 */
import {
  FAHRENHEIT_AT_0_CELSIUS, FAHRENHEIT_PER_KELVIN, JOULES_PER_BTU, JOULES_PER_KILOWATT_HOUR, JOULES_PER_THERM,
  KILOGRAMS_PER_POUND, LITRES_PER_US_GALLON, METRES_PER_FOOT, METRES_PER_MILE, SECONDS_PER_HOUR, SECONDS_PER_MINUTE,
} from '@/analysis/units/exact-factors';
import type { UnitSystem } from '@/analysis/units/unit-system';

/** The quantities people read, each stored in SI (temperatures in °C, differences in K). */
export type DisplayQuantity =
  | 'volumeFlow' | 'massFlow' | 'temperature' | 'temperatureDifference' | 'power' | 'conductance'
  | 'volume' | 'poolVolume' | 'mass' | 'energy' | 'irradiance' | 'speed' | 'length' | 'area' | 'time';

/** One display unit of a quantity: its label, the unit analysis/units reads, and the map from SI. */
export interface DisplayUnit {
  quantity: DisplayQuantity;
  system: UnitSystem;
  /** as people write it: "L/min", "°F", "Btu/h" */
  label: string;
  /** the same unit as analysis/units (mathjs) reads it in typed input: "L/min", "degF", "Btu/hour" */
  mathUnit: string;
  /** display = si · factor + offset */
  factor: number;
  offset: number;
  /** SI value → display value */
  from(si: number): number;
  /** display value → SI value */
  to(shown: number): number;
}

const L_PER_M3 = 1000;
const W_PER_KW = 1000;
const BTU_PER_HOUR_PER_W = SECONDS_PER_HOUR / JOULES_PER_BTU;

type Side = [label: string, mathUnit: string, factor: number, offset?: number];
/** [SI unit of the stored value, SI-style display, US display]; factors are display units per SI unit. */
export const DISPLAY_TABLE: Record<DisplayQuantity, [si: string, siShow: Side, usShow: Side]> = {
  volumeFlow: ['m^3/s', ['L/min', 'L/min', SECONDS_PER_MINUTE * L_PER_M3], ['gpm', 'gpm', (SECONDS_PER_MINUTE * L_PER_M3) / LITRES_PER_US_GALLON]],
  massFlow: ['kg/s', ['kg/s', 'kg/s', 1], ['lb/min', 'lb/min', SECONDS_PER_MINUTE / KILOGRAMS_PER_POUND]],
  temperature: ['degC', ['°C', 'degC', 1, 0], ['°F', 'degF', FAHRENHEIT_PER_KELVIN, FAHRENHEIT_AT_0_CELSIUS]],
  temperatureDifference: ['K', ['K', 'K', 1], ['°F', 'degFdiff', FAHRENHEIT_PER_KELVIN]],
  power: ['W', ['kW', 'kW', 1 / W_PER_KW], ['Btu/h', 'Btu/hour', BTU_PER_HOUR_PER_W]],
  conductance: ['W/K', ['W/K', 'W/K', 1], ['Btu/(h·°F)', 'Btu/(hour degFdiff)', BTU_PER_HOUR_PER_W / FAHRENHEIT_PER_KELVIN]],
  volume: ['m^3', ['L', 'L', L_PER_M3], ['gal', 'gal', L_PER_M3 / LITRES_PER_US_GALLON]],
  poolVolume: ['m^3', ['m³', 'm^3', 1], ['gal', 'gal', L_PER_M3 / LITRES_PER_US_GALLON]],
  mass: ['kg', ['kg', 'kg', 1], ['lb', 'lb', 1 / KILOGRAMS_PER_POUND]],
  energy: ['J', ['kWh', 'kWh', 1 / JOULES_PER_KILOWATT_HOUR], ['therm', 'therm', 1 / JOULES_PER_THERM]],
  irradiance: ['W/m^2', ['W/m²', 'W/m^2', 1], ['Btu/(h·ft²)', 'Btu/(hour ft^2)', BTU_PER_HOUR_PER_W * METRES_PER_FOOT ** 2]],
  speed: ['m/s', ['m/s', 'm/s', 1], ['mph', 'mph', SECONDS_PER_HOUR / METRES_PER_MILE]],
  length: ['m', ['m', 'm', 1], ['ft', 'ft', 1 / METRES_PER_FOOT]],
  area: ['m^2', ['m²', 'm^2', 1], ['ft²', 'ft^2', 1 / METRES_PER_FOOT ** 2]],
  time: ['s', ['s', 's', 1], ['s', 's', 1]],
};

const cache = new Map<string, DisplayUnit>();

/**
 * The display unit of a quantity in a unit system.
 * @throws RangeError for an unknown quantity or a system other than 'si' or 'us'
 * @example displayUnit('temperature', 'us') // { label: '°F', mathUnit: 'degF', factor: 1.8, offset: 32, … }
 * @example displayUnit('volumeFlow', 'us').from(2.8390588e-4) // ≈ 4.5 (gpm)
 */
export function displayUnit(quantity: DisplayQuantity, system: UnitSystem): DisplayUnit {
  const id = `${quantity}:${system}`;
  const hit = cache.get(id);
  if (hit) return hit;
  if (system !== 'si' && system !== 'us') throw new RangeError(`unit system must be 'si' or 'us', got ${JSON.stringify(system)}`);
  const row = DISPLAY_TABLE[quantity];
  if (!row) throw new RangeError(`unknown quantity ${JSON.stringify(quantity)}`);
  const [label, mathUnit, rawFactor, rawOffset = 0] = system === 'us' ? row[2] : row[1];
  // 15 significant digits drop binary noise; the SP 811 definitions have fewer
  const factor = Number(rawFactor.toPrecision(15));
  const offset = Number(rawOffset.toPrecision(15));
  const unit: DisplayUnit = {
    quantity, system, label, mathUnit, factor, offset,
    from: (si) => si * factor + offset,
    to: (shown) => (shown - offset) / factor,
  };
  cache.set(id, unit);
  return unit;
}

/**
 * Converts an SI value for display; null and undefined stay null (empty cells).
 * @example toDisplay(2.8390588e-4, 'volumeFlow', 'us') // ≈ 4.5 (gpm)
 */
export function toDisplay(value: number | null | undefined, quantity: DisplayQuantity, system: UnitSystem): number | null {
  if (value === null || value === undefined) return null;
  return displayUnit(quantity, system).from(value);
}

/**
 * A difference or spread (standard error, interval half-width, residual) for display: the factor
 * only, so temperatures become temperature differences.
 * @example spreadToDisplay(1, 'temperature', 'us') // 1.8
 */
export function spreadToDisplay(value: number | null | undefined, quantity: DisplayQuantity, system: UnitSystem): number | null {
  if (value === null || value === undefined) return null;
  return value * displayUnit(quantity, system).factor;
}

/**
 * A number for labels and summaries: 3 significant figures, no exponent below 10⁶, grouping for
 * thousands (e.g. `68.0`, `29,400`); a dash when not finite.
 */
export function fmt(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return '–';
  if (v === 0) return '0';
  const mag = Math.floor(Math.log10(Math.abs(v)));
  const decimals = Math.max(0, Math.min(6, digits - 1 - mag));
  return v.toLocaleString('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

/**
 * An SI value in a display unit with its label, to `digits` significant figures.
 * @example withUnit(20, displayUnit('temperature', 'us')) // '68.0 °F'
 */
export function withUnit(si: number, unit: DisplayUnit, digits = 3): string {
  return `${fmt(unit.from(si), digits)} ${unit.label}`;
}

/** The display units a screen or a plot usually needs, for one system. */
export interface DisplayUnits {
  system: UnitSystem;
  /** absolute temperature, from °C */
  temp: DisplayUnit;
  /** temperature difference (rise, residuals, SD), from K */
  tempDiff: DisplayUnit;
  /** volume flow, from m³/s */
  flow: DisplayUnit;
  /** heat rate, from W */
  power: DisplayUnit;
  /** energy, from J */
  energy: DisplayUnit;
  /** a bucket's or a sample's volume, from m³ */
  volume: DisplayUnit;
}

/**
 * The common display units of a system, each as displayUnit gives it.
 * @throws RangeError for a system other than 'si' or 'us'
 * @example displayUnits('us').temp.from(20) // 68
 */
export function displayUnits(system: UnitSystem): DisplayUnits {
  return {
    system,
    temp: displayUnit('temperature', system),
    tempDiff: displayUnit('temperatureDifference', system),
    flow: displayUnit('volumeFlow', system),
    power: displayUnit('power', system),
    energy: displayUnit('energy', system),
    volume: displayUnit('volume', system),
  };
}
