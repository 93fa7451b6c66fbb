/**
 * Column auto-mapping: header names and unit hints (`Outlet (°F)`, `T_out [C]`, `flow_gpm`,
 * `Durchfluss l/min`, `Zeit`, `fill 1 (s)`, `bucket (gal)`) → a suggested field, unit and
 * confidence per column. English and German spellings; the engineer confirms or changes every
 * suggestion before anything is converted.
 */
import {
  DEFAULT_UNIT, FIELD_KIND, kindOfUnit, readUnit, unitFitsField,
  type ColumnUnit, type TrialField,
} from './column-units';
import { detectDateOrder, readDate, type DateOrder } from './read-date';
import { readNumberWithUnit } from './read-number';
import type { DecimalSeparator } from './detect-dialect';

/** A header split into its name and the unit text it carries. */
export interface HeaderParts {
  name: string;
  unitText: string | null;
  unit: ColumnUnit | null;
}

/**
 * Splits `Outlet (°F)`, `T_out [C]`, `flow_gpm`, `Durchfluss l/min`, `Tout°C`, `outlet in °C`.
 * @example splitHeader('T_out [C]') // { name: 'T_out', unitText: 'C', unit: 'degC' }
 */
export function splitHeader(header: string): HeaderParts {
  const h = header.trim();
  const br = /^(.*?)\s*[([{]\s*([^)\]}]*?)\s*[)\]}]\s*(.*)$/.exec(h);
  if (br) {
    const unit = readUnit(br[2]);
    if (unit) return { name: `${br[1]} ${br[3]}`.trim(), unitText: br[2], unit };
  }
  const inUnit = /^(.*\S)\s+(?:in|en|per)\s+(\S+)$/i.exec(h);
  if (inUnit && readUnit(inUnit[2])) return { name: inUnit[1], unitText: inUnit[2], unit: readUnit(inUnit[2]) };
  const glued = /^(.*?[A-Za-z])\s*([°º℃℉].*)$/.exec(h);
  if (glued && readUnit(glued[2])) return { name: glued[1], unitText: glued[2], unit: readUnit(glued[2]) };
  const sp = /^(.*\S)[\s_]+(\S+)$/.exec(h);
  if (sp && readUnit(sp[2])) return { name: sp[1], unitText: sp[2], unit: readUnit(sp[2]) };
  // a header that is only a flow or temperature unit ("gpm", "°C"); "date" or "min" stay names
  const whole = readUnit(h);
  if (whole && h.length > 1 && (kindOfUnit(whole) === 'volumeFlow' || kindOfUnit(whole) === 'temperature')) return { name: '', unitText: h, unit: whole };
  return { name: h, unitText: null, unit: null };
}

/** Lower-case words of a name: `T_outlet2` → ['t', 'outlet', '2'], `TOut` → ['t', 'out'], umlauts folded. */
export function nameTokens(name: string): string[] {
  const folded = name
    .replace(/ß/g, 'ss')
    .replace(/ä/gi, 'ae').replace(/ö/gi, 'oe').replace(/ü/gi, 'ue')
    .normalize('NFD').replace(/[\u0300-\u036f]/g, '')
    .replace(/([a-z])([A-Z])/g, '$1 $2');
  return folded.toLowerCase().split(/[^a-z0-9]+|(?<=[a-z])(?=[0-9])|(?<=[0-9])(?=[a-z])/).filter(Boolean);
}

interface Rule {
  field: TrialField;
  /** a token equal to one of these */
  words: string[];
  /** or the joined name matching this */
  pattern?: RegExp;
  strength: number;
}

// Order matters: fill times before time, flow before volume.
const RULES: Rule[] = [
  { field: 'notes', words: ['notes', 'note', 'comment', 'comments', 'remark', 'remarks', 'bemerkung', 'bemerkungen', 'notiz', 'notizen', 'kommentar', 'memo', 'observations', 'observation'], strength: 0.95 },
  { field: 'fillTime', words: ['fill', 'fills', 'filling', 'fuellzeit', 'fuelldauer', 'fuellen', 'stopwatch', 'stoppuhr'], pattern: /bucket ?time|time ?to ?fill|fuell ?zeit/, strength: 0.9 },
  { field: 'flow', words: ['flow', 'flowrate', 'durchfluss', 'volumenstrom', 'debit', 'caudal', 'q', 'gpm', 'lpm', 'discharge'], strength: 0.9 },
  { field: 'bucketVolume', words: ['bucket', 'container', 'eimer', 'gefaess', 'behaelter', 'vessel', 'jug', 'volume', 'vol', 'volumen', 'messbecher'], strength: 0.85 },
  { field: 'irradiance', words: ['irradiance', 'irradiation', 'radiation', 'solar', 'sun', 'pyranometer', 'insolation', 'poa', 'ghi', 'strahlung', 'einstrahlung', 'globalstrahlung'], strength: 0.9 },
  { field: 'wind', words: ['wind', 'windspeed', 'anemometer', 'windgeschwindigkeit'], strength: 0.9 },
  { field: 'ambientTemp', words: ['ambient', 'amb', 'tamb', 'air', 'outside', 'outdoor', 'umgebung', 'aussen', 'luft', 'room', 'environment', 'tair', 'tu'], strength: 0.9 },
  { field: 'inletTemp', words: ['inlet', 'tin', 'supply', 'cold', 'entering', 'entry', 'eintritt', 'eingang', 'zulauf', 'ein', 'tein', 'intake'], strength: 0.9 },
  { field: 'outletTemp', words: ['outlet', 'tout', 'hot', 'leaving', 'exit', 'austritt', 'ausgang', 'ablauf', 'aus', 'taus'], strength: 0.9 },
  { field: 'inletTemp', words: ['in'], strength: 0.7 },
  { field: 'outletTemp', words: ['out'], strength: 0.7 },
  { field: 'time', words: ['time', 'zeit', 'timestamp', 'date', 'datum', 'clock', 'uhrzeit', 'elapsed', 'datetime', 'heure', 'uhr', 'zeitstempel'], strength: 0.9 },
  { field: 'time', words: ['t'], strength: 0.5 },
];

/** One column's suggestion. */
export interface ColumnSuggestion {
  /** 0-based column index */
  column: number;
  header: string;
  field: TrialField | null;
  unit: ColumnUnit | null;
  /** where the unit came from */
  unitSource: 'header' | 'cells' | 'default' | null;
  /** 0–1; below 0.6 the page should ask for a look */
  confidence: number;
  note?: string;
}

export interface MappingSuggestion {
  columns: ColumnSuggestion[];
  /** fields a trial sheet still lacks, in words ("inlet temperature", "flow or bucket volume and fill time") */
  missing: string[];
  /**
   * How the time column's slashed dates read: settled by the sample ('dmy' / 'mdy'), 'ambiguous'
   * (every date has both parts ≤ 12: the engineer must choose), 'conflict' (values point both
   * ways), or null (no slashed dates). Pass the choice as `dateOrder` in the mapping.
   */
  dateOrder: DateOrder | 'ambiguous' | 'conflict' | null;
}

function byName(tokens: string[], joined: string): { field: TrialField; strength: number } | null {
  for (const r of RULES) {
    if (tokens.some((t) => r.words.includes(t)) || (r.pattern && r.pattern.test(joined))) return { field: r.field, strength: r.strength };
  }
  return null;
}

function unitFromCells(values: (string | number | null)[], decimal: DecimalSeparator): { unit: ColumnUnit | null; dates: boolean } {
  let dates = 0, seen = 0;
  const units = new Map<ColumnUnit, number>();
  for (const v of values) {
    if (v === null || v === '') continue;
    seen++;
    if (typeof v === 'number') continue;
    if (readDate(v, { order: 'dmy' }).ok) { dates++; continue; }
    const r = readNumberWithUnit(v, decimal);
    if (!Number.isNaN(r.value) && r.unit) {
      const u = readUnit(r.unit);
      if (u) units.set(u, (units.get(u) ?? 0) + 1);
    }
  }
  let best: ColumnUnit | null = null, n = 0;
  for (const [u, c] of units) if (c > n) { best = u; n = c; }
  return { unit: best, dates: seen > 0 && dates * 2 > seen };
}

/**
 * Suggests a field and unit for every column.
 * @param header column names as read
 * @param sample the first data rows (cells as read), used for units written in cells and for dates
 * @example suggestMapping(['Zeit', 'T_in [C]', 'Outlet (°F)', 'flow_gpm']).columns[2] // { field: 'outletTemp', unit: 'degF', confidence: 0.95, … }
 */
export function suggestMapping(header: string[], sample: (string | number | null)[][] = [], decimal: DecimalSeparator = '.'): MappingSuggestion {
  const cols: ColumnSuggestion[] = header.map((h, column) => {
    const parts = splitHeader(h);
    const tokens = nameTokens(parts.name);
    const hit = byName(tokens, tokens.join(' '));
    const cells = unitFromCells(sample.map((r) => r[column] ?? null), decimal);
    let field: TrialField | null = hit?.field ?? null;
    let confidence = hit?.strength ?? 0;
    let unit: ColumnUnit | null = null;
    let unitSource: ColumnSuggestion['unitSource'] = null;
    let note: string | undefined;
    const stated = parts.unit ?? cells.unit;
    const statedSource = parts.unit ? 'header' : cells.unit ? 'cells' : null;
    if (field === null && stated) {
      const kind = kindOfUnit(stated);
      if (kind === 'volumeFlow') { field = 'flow'; confidence = 0.6; }
      else if (kind === 'volume') { field = 'bucketVolume'; confidence = 0.5; }
      else if (kind === 'temperature') note = `a temperature in ${stated}, but the name does not say inlet, outlet or ambient`;
    }
    if (field === 'time' && cells.dates) { unit = 'datetime'; unitSource = 'cells'; }
    else if (field && field !== 'notes') {
      if (stated && unitFitsField(stated, field)) { unit = stated; unitSource = statedSource; confidence = Math.min(0.98, confidence + 0.05); }
      else if (stated) {
        note = `the unit "${parts.unitText ?? stated}" does not fit a ${FIELD_KIND[field]} column; check the mapping`;
        confidence = Math.min(confidence, 0.4);
        unit = DEFAULT_UNIT[field]; unitSource = 'default';
      } else {
        unit = DEFAULT_UNIT[field]; unitSource = 'default';
        confidence = Math.min(confidence, 0.75);
        note = `no unit in the header; ${unit === 'degC' ? '°C' : unit} assumed`;
      }
    }
    return { column, header: h, field, unit, unitSource, confidence: Math.round(confidence * 100) / 100, ...(note ? { note } : {}) };
  });
  // one column per field, except fill times: keep the most confident
  const best = new Map<TrialField, ColumnSuggestion>();
  for (const c of cols) {
    if (!c.field || c.field === 'fillTime') continue;
    const b = best.get(c.field);
    if (!b || c.confidence > b.confidence) best.set(c.field, c);
  }
  for (const c of cols) {
    if (c.field && c.field !== 'fillTime' && best.get(c.field) !== c) {
      c.note = `also looks like ${c.field}, which column "${best.get(c.field)!.header}" already takes`;
      c.field = null; c.unit = null; c.unitSource = null; c.confidence = 0;
    }
  }
  const timeCol = cols.find((c) => c.field === 'time');
  const dateOrder = timeCol ? detectDateOrder(sample.map((r) => r[timeCol.column]).filter((v): v is string => typeof v === 'string')) : null;
  return { columns: cols, missing: missingTrialFields(cols.filter((c) => c.field).map((c) => c.field!)), dateOrder };
}

/** What a trial sheet lacks, in words, given the mapped fields. */
export function missingTrialFields(fields: TrialField[]): string[] {
  const has = new Set(fields);
  const out: string[] = [];
  if (!has.has('inletTemp')) out.push('inlet temperature');
  if (!has.has('outletTemp')) out.push('outlet temperature');
  if (!has.has('flow') && !(has.has('bucketVolume') && has.has('fillTime'))) out.push('flow, or bucket volume and at least one fill time');
  return out;
}
