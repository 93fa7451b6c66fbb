/**
 * Quantities typed by people ("18 ft", "4.5 gpm", "75 degF") → SI numbers, and SI numbers →
 * display units. SI is kept inside analysis/; temperatures are carried in °C (`tempC`).
 */
import type { Unit } from 'mathjs';
import { math } from './math';
import { describeValue } from './guards';

/** The physical quantities the workbench reads, each with the SI unit it is returned in. */
export const SI_UNITS = {
  length: 'm',
  area: 'm^2',
  volume: 'm^3',
  volumeFlow: 'm^3/s',
  massFlow: 'kg/s',
  mass: 'kg',
  time: 's',
  speed: 'm/s',
  power: 'W',
  energy: 'J',
  conductance: 'W/K',
  heatTransferCoefficient: 'W/(m^2 K)',
  irradiance: 'W/m^2',
  pressure: 'Pa',
  density: 'kg/m^3',
  specificHeat: 'J/(kg K)',
  specificEnergy: 'J/kg',
  temperature: 'degC',
} as const;

export type QuantityKind = keyof typeof SI_UNITS | 'temperatureDifference';

const TEMPERATURE_UNITS = new Set(['K', 'degC', 'degF', 'degR', 'celsius', 'fahrenheit', 'kelvin', 'rankine']);

/**
 * Spellings people type that mathjs does not read: "75 °F", "75°C", "75 ℉" → degF/degC.
 * @example normaliseUnitText('75 °F') // '75 degF'
 */
export function normaliseUnitText(text: string): string {
  return text
    .trim()
    .replace(/\s*(?:°|º)\s*F\b/g, ' degF')
    .replace(/\s*(?:°|º)\s*C\b/g, ' degC')
    .replace(/\s*℉/g, ' degF')
    .replace(/\s*℃/g, ' degC');
}

function parseUnit(text: unknown, field: string): Unit {
  if (typeof text !== 'string' || text.trim() === '') {
    throw new TypeError(`${field} must be a quantity with a unit such as "18 ft", got ${describeValue(text)}`);
  }
  let u: Unit;
  try {
    u = math.unit(normaliseUnitText(text));
  } catch (e) {
    throw new RangeError(`${field}: cannot read ${JSON.stringify(text)} as a quantity (${(e as Error).message})`);
  }
  if (u.value == null) throw new RangeError(`${field}: ${JSON.stringify(text)} has a unit but no number`);
  return u;
}

/**
 * Reads a quantity string and returns its value in the SI unit of `kind` (°C for temperature,
 * K for a temperature difference).
 *
 * @param text a number with a unit that mathjs reads, e.g. `"4.5 gpm"`, `"18 ft"`, `"75 degF"`.
 * @param kind the quantity expected; a unit of another dimension is refused.
 * @param field the input's name, used in error messages.
 * @returns the SI value (m, m³, m³/s, W, J, W/K, °C, K …).
 * @throws TypeError when `text` is not a non-empty string; RangeError when it cannot be read,
 *   has the wrong dimension (`"5 kg"` for a flow), or is a temperature below absolute zero.
 * @example parseQuantity('4.5 gpm', 'volumeFlow', 'flow') // 2.8390588e-4 (m³/s)
 */
export function parseQuantity(text: unknown, kind: QuantityKind, field: string): number {
  const u = parseUnit(text, field);
  if (kind === 'temperatureDifference') return parseTemperatureDifference(u, field, text as string);
  const target = SI_UNITS[kind];
  if (!u.equalBase(math.unit(target))) {
    throw new RangeError(`${field}: ${JSON.stringify(text)} is not a ${kind} (expected a unit like ${target})`);
  }
  const value = u.toNumber(target);
  if (!Number.isFinite(value)) throw new RangeError(`${field}: ${JSON.stringify(text)} is not a finite ${kind}`);
  if (kind === 'temperature' && value < -273.15) {
    throw new RangeError(`${field}: ${JSON.stringify(text)} is below absolute zero`);
  }
  return value;
}

function parseTemperatureDifference(u: Unit, field: string, text: string): number {
  if (u.units.length !== 1 || !TEMPERATURE_UNITS.has(u.units[0].unit.name) || u.units[0].power !== 1) {
    if (u.equalBase(math.unit('K'))) return u.toNumber('K');
    throw new RangeError(`${field}: ${JSON.stringify(text)} is not a temperature difference (expected K, degC or degF)`);
  }
  const name = u.units[0].unit.name;
  const own = u.toNumber(name);
  const perK = name === 'degF' || name === 'degR' || name === 'fahrenheit' || name === 'rankine' ? 1 / 1.8 : 1;
  return own * perK;
}

/**
 * Converts an SI value (°C for temperature) to another unit for display.
 * @throws RangeError when the unit does not fit the kind.
 * @example fromSI(2.8390588e-4, 'volumeFlow', 'gpm') // 4.5
 */
export function fromSI(value: number, kind: keyof typeof SI_UNITS, toUnit: string): number {
  const u = math.unit(value, SI_UNITS[kind]);
  try {
    return u.toNumber(toUnit);
  } catch (e) {
    throw new RangeError(`cannot express a ${kind} in ${JSON.stringify(toUnit)}: ${(e as Error).message}`);
  }
}

/**
 * Converts a number between two units of the same dimension (temperatures as absolute values).
 * @throws RangeError when the units do not match.
 * @example convert(1, 'therm', 'Btu') // 100000
 */
export function convert(value: number, fromUnit: string, toUnit: string): number {
  try {
    return math.unit(value, fromUnit).toNumber(toUnit);
  } catch (e) {
    throw new RangeError(`cannot convert ${fromUnit} to ${toUnit}: ${(e as Error).message}`);
  }
}
