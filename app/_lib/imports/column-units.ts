/**
 * The units a column of an imported sheet may be in, the spellings people use for them in
 * headers and cells (`°F`, `[C]`, `gpm`, `l/min`, `Liter`), and their conversion to SI through
 * the shared units module (analysis/units, NIST SP 811 factors). A conversion is resolved once
 * per unit into `si = scale · x + offset` (every unit here is affine), so a million cells cost a
 * multiply-add each rather than a mathjs parse.
 */
import { parseQuantity, type QuantityKind } from '@/analysis/units/parse-quantity';

/** What a mapped column holds. `fillTime` may be mapped to several columns. */
export type TrialField =
  | 'time'
  | 'bucketVolume'
  | 'fillTime'
  | 'flow'
  | 'inletTemp'
  | 'outletTemp'
  | 'ambientTemp'
  | 'irradiance'
  | 'wind'
  | 'notes';

export const TRIAL_FIELDS: readonly TrialField[] = [
  'time', 'bucketVolume', 'fillTime', 'flow', 'inletTemp', 'outletTemp', 'ambientTemp', 'irradiance', 'wind', 'notes',
];

/** The dimension of each field's numbers (`time` may also hold dates: unit `datetime`). */
export const FIELD_KIND: Record<TrialField, 'temperature' | 'volume' | 'time' | 'volumeFlow' | 'irradiance' | 'speed' | 'text'> = {
  time: 'time',
  bucketVolume: 'volume',
  fillTime: 'time',
  flow: 'volumeFlow',
  inletTemp: 'temperature',
  outletTemp: 'temperature',
  ambientTemp: 'temperature',
  irradiance: 'irradiance',
  wind: 'speed',
  notes: 'text',
};

/** Canonical unit names (mathjs spellings) offered per kind; `datetime` = dates or clock times. */
export const UNITS_BY_KIND = {
  temperature: ['degC', 'degF', 'K'],
  volume: ['L', 'mL', 'gal', 'm^3', 'ft^3'],
  time: ['s', 'min', 'h', 'ms', 'datetime'],
  volumeFlow: ['L/min', 'L/s', 'L/h', 'gpm', 'gph', 'm^3/h', 'm^3/s', 'mL/s', 'mL/min'],
  irradiance: ['W/m^2', 'kW/m^2'],
  speed: ['m/s', 'km/h', 'mph'],
} as const;

export type ColumnUnit =
  | (typeof UNITS_BY_KIND)['temperature'][number]
  | (typeof UNITS_BY_KIND)['volume'][number]
  | (typeof UNITS_BY_KIND)['time'][number]
  | (typeof UNITS_BY_KIND)['volumeFlow'][number]
  | (typeof UNITS_BY_KIND)['irradiance'][number]
  | (typeof UNITS_BY_KIND)['speed'][number];

/** Human labels for the units (for the mapping screen). */
export const UNIT_LABEL: Record<ColumnUnit, string> = {
  degC: '°C', degF: '°F', K: 'K',
  L: 'L', mL: 'mL', gal: 'US gal', 'm^3': 'm³', 'ft^3': 'ft³',
  s: 's', min: 'min', h: 'h', ms: 'ms', datetime: 'date/time',
  'L/min': 'L/min', 'L/s': 'L/s', 'L/h': 'L/h', gpm: 'US gpm', gph: 'US gph', 'm^3/h': 'm³/h', 'm^3/s': 'm³/s',
  'mL/s': 'mL/s', 'mL/min': 'mL/min',
  'W/m^2': 'W/m²', 'kW/m^2': 'kW/m²',
  'm/s': 'm/s', 'km/h': 'km/h', mph: 'mph',
};

// Spellings (lower case, spaces removed, superscripts folded) → canonical unit.
const ALIASES: Record<string, ColumnUnit> = {
  '°c': 'degC', 'ºc': 'degC', c: 'degC', degc: 'degC', 'deg.c': 'degC', celsius: 'degC', '℃': 'degC', grad: 'degC', gradc: 'degC', '°': 'degC',
  '°f': 'degF', 'ºf': 'degF', f: 'degF', degf: 'degF', 'deg.f': 'degF', fahrenheit: 'degF', '℉': 'degF',
  k: 'K', kelvin: 'K',
  l: 'L', liter: 'L', litre: 'L', liters: 'L', litres: 'L', ltr: 'L',
  ml: 'mL', milliliter: 'mL', millilitre: 'mL',
  gal: 'gal', gallon: 'gal', gallons: 'gal', usgal: 'gal', 'gal(us)': 'gal', usgallon: 'gal', usgallons: 'gal',
  m3: 'm^3', 'm^3': 'm^3', 'cbm': 'm^3',
  ft3: 'ft^3', 'ft^3': 'ft^3', cuft: 'ft^3', cf: 'ft^3',
  s: 's', sec: 's', secs: 's', second: 's', seconds: 's', sek: 's', sekunden: 's', 'sec.': 's',
  min: 'min', mins: 'min', minute: 'min', minutes: 'min', minuten: 'min',
  h: 'h', hr: 'h', hrs: 'h', hour: 'h', hours: 'h', std: 'h', stunden: 'h',
  ms: 'ms',
  datetime: 'datetime', date: 'datetime', 'hh:mm': 'datetime', 'hh:mm:ss': 'datetime', clock: 'datetime', iso: 'datetime',
  gpm: 'gpm', 'gal/min': 'gpm', usgpm: 'gpm', 'gal/m': 'gpm',
  gph: 'gph', 'gal/h': 'gph', 'gal/hr': 'gph',
  'l/min': 'L/min', lpm: 'L/min', 'l/m': 'L/min', lmin: 'L/min', 'l·min-1': 'L/min', 'lmin-1': 'L/min',
  'l/s': 'L/s', lps: 'L/s', 'l/sec': 'L/s', 'l·s-1': 'L/s',
  'l/h': 'L/h', 'l/hr': 'L/h', lph: 'L/h', 'l·h-1': 'L/h',
  'm3/h': 'm^3/h', 'm^3/h': 'm^3/h', 'm3/hr': 'm^3/h',
  'm3/s': 'm^3/s', 'm^3/s': 'm^3/s',
  'ml/s': 'mL/s', 'ml/min': 'mL/min',
  'w/m2': 'W/m^2', 'w/m^2': 'W/m^2', 'wm-2': 'W/m^2', 'w·m-2': 'W/m^2', 'kw/m2': 'kW/m^2', 'kw/m^2': 'kW/m^2',
  'm/s': 'm/s', mps: 'm/s', 'm·s-1': 'm/s', 'km/h': 'km/h', kmh: 'km/h', kph: 'km/h', mph: 'mph',
};

/** Lower case, no spaces, ³ → 3, ⁻¹ → -1, × / · kept. */
export function foldUnitText(text: string): string {
  return text
    .toLowerCase()
    .replace(/[\s_]+/g, '')
    .replace(/³/g, '3')
    .replace(/²/g, '2')
    .replace(/⁻¹/g, '-1')
    .replace(/[−–]/g, '-')
    .replace(/^in(?=[°º℃℉])/, '');
}

/**
 * Reads a unit spelling; null when it is not one the importer knows.
 * @example readUnit('°F') // 'degF'
 * @example readUnit('l/min') // 'L/min'
 */
export function readUnit(text: string): ColumnUnit | null {
  const f = foldUnitText(text);
  return ALIASES[f] ?? null;
}

/** The kind a canonical unit measures. */
export function kindOfUnit(unit: ColumnUnit): keyof typeof UNITS_BY_KIND {
  for (const k of Object.keys(UNITS_BY_KIND) as (keyof typeof UNITS_BY_KIND)[]) {
    if ((UNITS_BY_KIND[k] as readonly string[]).includes(unit)) return k;
  }
  /* c8 ignore next */
  throw new RangeError(`unknown unit ${unit}`);
}

/** `si = scale · x + offset` for a unit; the SI unit is m³, s, m³/s or °C. */
export interface AffineToSI {
  scale: number;
  offset: number;
}

const cache = new Map<string, AffineToSI>();

/**
 * The conversion of one unit to SI, resolved once through analysis/units `parseQuantity`.
 * Linear units take their scale from "1 unit"; temperatures take the offset from "0 unit" and
 * the scale from "1000 unit" (less rounding than from "1 unit").
 * @throws RangeError for `datetime` (not a number unit)
 * @example toSI('degF') // { scale: 0.5555…, offset: -17.777… }
 */
export function toSI(unit: ColumnUnit): AffineToSI {
  const hit = cache.get(unit);
  if (hit) return hit;
  if (unit === 'datetime') throw new RangeError('datetime is not a number unit');
  const kind = kindOfUnit(unit) as QuantityKind;
  let a: AffineToSI;
  if (kind === 'temperature') {
    const offset = parseQuantity(`0 ${unit}`, 'temperature', 'unit');
    a = { offset, scale: (parseQuantity(`1000 ${unit}`, 'temperature', 'unit') - offset) / 1000 };
  } else {
    a = { offset: 0, scale: parseQuantity(`1 ${unit}`, kind, 'unit') };
  }
  cache.set(unit, a);
  return a;
}

/** Default unit offered when neither header nor cells say (metric, as most logger exports). */
export const DEFAULT_UNIT: Record<Exclude<TrialField, 'notes'>, ColumnUnit> = {
  time: 's',
  bucketVolume: 'L',
  fillTime: 's',
  flow: 'L/min',
  inletTemp: 'degC',
  outletTemp: 'degC',
  ambientTemp: 'degC',
  irradiance: 'W/m^2',
  wind: 'm/s',
};

/** True when `unit` measures what `field` holds. */
export function unitFitsField(unit: ColumnUnit, field: TrialField): boolean {
  const kind = FIELD_KIND[field];
  if (kind === 'text') return false;
  return (UNITS_BY_KIND[kind] as readonly string[]).includes(unit);
}
