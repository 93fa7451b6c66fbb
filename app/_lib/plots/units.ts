/**
 * Display units for the plots. Values arrive in SI (°C, m³/s, W, J, K for differences) and are
 * converted once, here, through analysis/units (NIST SP 811 factors; °F = °C × 1.8 + 32 exactly).
 */
import { convert, fromSI } from '../../../analysis/units/parse-quantity';

/** The user's unit system: SI (°C, L/min, kW, kWh) or US customary (°F, gpm, Btu/h, therm). */
export type UnitSystem = 'si' | 'us';

/** One display unit: its label and the conversion from the SI value. */
export interface DisplayUnit {
  /** as printed on an axis, e.g. `°F` */
  label: string;
  /** SI value → display value */
  from(si: number): number;
}

/** The display units of one system. */
export interface DisplayUnits {
  system: UnitSystem;
  /** absolute temperature, from °C */
  temp: DisplayUnit;
  /** temperature difference (residuals, SD), from K */
  tempDiff: DisplayUnit;
  /** volume flow, from m³/s */
  flow: DisplayUnit;
  /** heat rate, from W */
  power: DisplayUnit;
  /** energy, from J */
  energy: DisplayUnit;
}

const SPEC = {
  si: { temp: ['degC', '°C'], tempDiff: ['K', 'K'], flow: ['L/min', 'L/min'], power: ['kW', 'kW'], energy: ['kWh', 'kWh'] },
  us: { temp: ['degF', '°F'], tempDiff: ['degFdiff', '°F'], flow: ['gpm', 'gpm'], power: ['Btu/h', 'Btu/h'], energy: ['therm', 'therm'] },
} as const;

const cache = new Map<UnitSystem, DisplayUnits>();

/**
 * The display units of a system.
 * @throws RangeError for a system other than 'si' or 'us'
 * @example displayUnits('us').temp.from(20) // 68
 */
export function displayUnits(system: UnitSystem): DisplayUnits {
  const hit = cache.get(system);
  if (hit) return hit;
  if (system !== 'si' && system !== 'us') throw new RangeError(`unit system must be 'si' or 'us', got ${JSON.stringify(system)}`);
  const s = SPEC[system];
  const units: DisplayUnits = {
    system,
    temp: { label: s.temp[1], from: (v) => fromSI(v, 'temperature', s.temp[0]) },
    tempDiff: { label: s.tempDiff[1], from: (v) => convert(v, 'K', s.tempDiff[0]) },
    flow: { label: s.flow[1], from: (v) => fromSI(v, 'volumeFlow', s.flow[0]) },
    power: { label: s.power[1], from: (v) => fromSI(v, 'power', s.power[0]) },
    energy: { label: s.energy[1], from: (v) => fromSI(v, 'energy', s.energy[0]) },
  };
  cache.set(system, units);
  return units;
}

/**
 * A number for labels and summaries: 3 significant figures, no exponent below 10⁶, grouping for
 * thousands (e.g. `68.0`, `29,400`).
 */
export function fmt(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return '–';
  if (v === 0) return '0';
  const mag = Math.floor(Math.log10(Math.abs(v)));
  const decimals = Math.max(0, Math.min(6, digits - 1 - mag));
  return v.toLocaleString('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
}

/** `68.0 °F` */
export function withUnit(v: number, unit: DisplayUnit, digits = 3): string {
  return `${fmt(unit.from(v), digits)} ${unit.label}`;
}

/** Joins clauses into sentences, each capitalised and ending with a full stop. */
export function sentences(parts: string[]): string {
  return parts.filter((p) => p.length > 0).map((p) => `${p[0].toUpperCase()}${p.slice(1)}${/[.!?]$/.test(p) ? '' : '.'}`).join(' ');
}
