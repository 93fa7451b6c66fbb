/**
 * An hourly weather table for the forecast, read in the browser from a CSV that the user exported
 * from a weather service or typed in a spreadsheet: one row per hour from the start of the
 * forecast (a table shorter than the forecast repeats, so 24 rows make a typical day).
 *
 * Columns are found by their names and units in the header — air temperature (required), relative
 * humidity in % or a dew point (one required), wind, sun (global irradiance) and cloud cover
 * (optional). Temperatures without a unit in the header are taken in the user's units. Every row
 * is checked; a bad cell is reported with its line and column, and the table is refused.
 */
import Papa from 'papaparse';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit } from '@/app/_contracts/units';

/** One hour as the forecast API takes it (quantities as unit strings). */
export interface WeatherRow {
  airTemp: string;
  relativeHumidity?: number;
  dewPoint?: string;
  wind?: string;
  solar?: string;
  cloudCover?: number;
}

export interface WeatherTable {
  rows: WeatherRow[];
  /** problems, each with its 1-based line; the table is usable only when there are none */
  issues: { line: number; message: string }[];
  /** which column was read as what, for the page */
  columns: { header: string; meaning: string }[];
}

type Kind = 'air' | 'rh' | 'dew' | 'wind' | 'solar' | 'cloud';
const MAX_ROWS = 8784; // a leap year of hours

function kindOf(h: string): Kind | null {
  const s = h.toLowerCase();
  if (/dew/.test(s)) return 'dew';
  if (/humid|\brh\b|r\.h\./.test(s)) return 'rh';
  if (/wind|air ?speed/.test(s)) return 'wind';
  if (/solar|sun|irradian|ghi|radiation/.test(s)) return 'solar';
  if (/cloud/.test(s)) return 'cloud';
  if (/air|temp|ambient|\bt\b|dry ?bulb/.test(s)) return 'air';
  return null;
}

function tempUnit(h: string, fallback: 'degC' | 'degF'): 'degC' | 'degF' {
  if (/°\s*f|\bdeg ?f\b|\[f\]|\(f\)|fahrenheit/i.test(h)) return 'degF';
  if (/°\s*c|\bdeg ?c\b|\[c\]|\(c\)|celsius/i.test(h)) return 'degC';
  return fallback;
}

function windUnit(h: string, fallback: 'm/s' | 'mph'): string {
  if (/mph|mi\/h/i.test(h)) return 'mph';
  if (/km\/h|kph|kmh/i.test(h)) return 'km/h';
  if (/m\/s|ms-1/i.test(h)) return 'm/s';
  if (/knot|\bkn\b|\bkt\b/i.test(h)) return 'knot';
  return fallback;
}

/**
 * @param text the CSV (comma, semicolon or tab separated; decimal commas with semicolons)
 * @param units the user's units, for temperature and wind columns whose header names none
 * @example parseWeatherCsv('hour,air (°C),RH (%)\n0,18,70\n1,17.5,72', 'si').rows[1] // { airTemp: '17.5 degC', relativeHumidity: 0.72 }
 */
export function parseWeatherCsv(text: string, units: UnitSystem): WeatherTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const data = parsed.data;
  const issues: WeatherTable['issues'] = [];
  if (!data.length) return { rows: [], issues: [{ line: 1, message: 'the file is empty' }], columns: [] };
  const header = data[0].map((h) => h.trim());
  const decimalComma = parsed.meta.delimiter === ';' || parsed.meta.delimiter === '\t';
  const cols = new Map<Kind, number>();
  header.forEach((h, i) => {
    const k = kindOf(h);
    if (k && !cols.has(k)) cols.set(k, i);
  });
  if (!cols.has('air')) issues.push({ line: 1, message: `no air temperature column: name one "air temperature (°C)" (columns: ${header.join(', ')})` });
  if (!cols.has('rh') && !cols.has('dew')) issues.push({ line: 1, message: 'no humidity: add a "relative humidity (%)" or a "dew point" column' });
  if (data.length - 1 > MAX_ROWS) issues.push({ line: MAX_ROWS + 2, message: `more than ${MAX_ROWS} hourly rows (a year); shorten the table` });
  if (issues.length) return { rows: [], issues, columns: [] };

  const fallbackT = displayUnit('temperature', units).mathUnit as 'degC' | 'degF';
  const tUnit = (k: Kind) => tempUnit(header[cols.get(k)!], fallbackT);
  const wUnit = cols.has('wind') ? windUnit(header[cols.get('wind')!], displayUnit('speed', units).mathUnit as 'm/s' | 'mph') : 'm/s';
  const rhPercent = cols.has('rh') && !/0\s*[-–]\s*1\b|fraction/i.test(header[cols.get('rh')!]);
  const cloudPercent = cols.has('cloud') && /%|percent|okta/i.test(header[cols.get('cloud')!]);
  const oktas = cols.has('cloud') && /okta/i.test(header[cols.get('cloud')!]);
  const columns = [...cols].map(([k, i]) => ({
    header: header[i],
    meaning: {
      air: `air temperature, ${tUnit('air') === 'degF' ? '°F' : '°C'}`,
      dew: `dew point, ${tUnit('dew') === 'degF' ? '°F' : '°C'}`,
      rh: rhPercent ? 'relative humidity, %' : 'relative humidity, 0–1',
      wind: `wind, ${wUnit}`,
      solar: 'sun (global irradiance), W/m²',
      cloud: oktas ? 'cloud cover, oktas' : cloudPercent ? 'cloud cover, %' : 'cloud cover, 0–1',
    }[k],
  }));

  const rows: WeatherRow[] = [];
  for (let r = 1; r < data.length; r++) {
    const line = r + 1;
    const cell = (k: Kind): number | null => {
      const i = cols.get(k);
      if (i === undefined) return null;
      const raw = (data[r][i] ?? '').trim();
      if (raw === '') return NaN;
      const v = Number(decimalComma ? raw.replace(',', '.') : raw);
      return Number.isFinite(v) ? v : Number.NaN;
    };
    const bad = (k: Kind, why: string) => issues.push({ line, message: `${header[cols.get(k)!]}: ${why} ("${(data[r][cols.get(k)!] ?? '').trim()}")` });
    const air = cell('air')!;
    if (Number.isNaN(air)) { bad('air', 'not a number'); continue; }
    const row: WeatherRow = { airTemp: `${air} ${tUnit('air')}` };
    if (cols.has('rh')) {
      const v = cell('rh')!;
      const f = rhPercent ? v / 100 : v;
      if (Number.isNaN(v) || f < 0 || f > 1) { bad('rh', rhPercent ? 'a relative humidity must be 0–100 %' : 'a relative humidity must be 0–1'); continue; }
      row.relativeHumidity = f;
    } else {
      const v = cell('dew')!;
      if (Number.isNaN(v)) { bad('dew', 'not a number'); continue; }
      row.dewPoint = `${v} ${tUnit('dew')}`;
    }
    for (const k of ['wind', 'solar'] as const) {
      const v = cell(k);
      if (v === null) continue;
      if (Number.isNaN(v) || v < 0) { bad(k, 'must be a number of 0 or more'); continue; }
      // the knot is 1852 m/h exactly (NIST SP 811 B.8); the units module has no knot, so it is converted here
      if (k === 'wind') row.wind = wUnit === 'knot' ? `${(v * 1852) / 3600} m/s` : `${v} ${wUnit}`;
      else row.solar = `${v} W/m^2`;
    }
    const c = cell('cloud');
    if (c !== null) {
      const f = oktas ? c / 8 : cloudPercent ? c / 100 : c;
      if (Number.isNaN(c) || f < 0 || f > 1) bad('cloud', oktas ? 'oktas run from 0 to 8' : cloudPercent ? 'cloud cover must be 0–100 %' : 'cloud cover must be 0–1');
      else row.cloudCover = f;
    }
    rows.push(row);
  }
  if (!rows.length && !issues.length) issues.push({ line: 2, message: 'no rows under the header' });
  return { rows: issues.length ? [] : rows, issues: issues.slice(0, 50), columns };
}
