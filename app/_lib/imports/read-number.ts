/**
 * Numbers as people and spreadsheet programs write them in cells: `12.5`, `12,5` (decimal
 * comma), `1,234.5` / `1.234,5` (grouping), `1.2e-3`, with an optional unit after the number
 * (`12,5 °C`, `4.2gpm`). Plain functions, fast enough for a million rows.
 */
import type { DecimalSeparator } from './detect-dialect';

const PLAIN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const PLAIN_COMMA = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const GROUPED_POINT = /^[+-]?\d{1,3}(?:,\d{3})+(?:\.\d+)?$/;
const GROUPED_COMMA = /^[+-]?\d{1,3}(?:[.\u00a0\u202f ]\d{3})+(?:,\d+)?$/;
const WITH_UNIT = /^([+-]?(?:\d[\d.,\u00a0\u202f ]*|[.,]\d+)(?:[eE][+-]?\d+)?)\s*([^\d\s+-].*)$/;

/** True when `text` (trimmed) is a number with either decimal separator, without a unit. */
export function looksNumeric(text: string): boolean {
  return PLAIN.test(text) || PLAIN_COMMA.test(text) || GROUPED_POINT.test(text) || GROUPED_COMMA.test(text);
}

/**
 * Reads a bare number. Returns NaN when `text` is not one (never a silent 0 for "").
 * @param decimal the file's decimal separator
 * @example readNumber('12,5', ',') // 12.5
 * @example readNumber('1.234,5', ',') // 1234.5
 */
export function readNumber(text: string, decimal: DecimalSeparator): number {
  const t = text.trim();
  if (t === '') return NaN;
  if (decimal === '.') {
    if (PLAIN.test(t)) return Number(t);
    if (GROUPED_POINT.test(t)) return Number(t.replace(/,/g, ''));
    return NaN;
  }
  if (PLAIN_COMMA.test(t)) return Number(t.replace(',', '.'));
  if (GROUPED_COMMA.test(t)) return Number(t.replace(/[.\u00a0\u202f ]/g, '').replace(',', '.'));
  // a point in a decimal-comma file: accept a plain "12.5" (typed by hand) unless it reads as grouping
  if (PLAIN.test(t) && !/^[+-]?\d{1,3}\.\d{3}$/.test(t)) return Number(t);
  return NaN;
}

/** A number followed by unit text, split; `unit` is null for a bare number. */
export interface NumberWithUnit {
  value: number;
  unit: string | null;
}

/**
 * Reads a number that may carry a unit after it.
 * @example readNumberWithUnit('54 °F', '.') // { value: 54, unit: '°F' }
 * @example readNumberWithUnit('12,5', ',') // { value: 12.5, unit: null }
 */
export function readNumberWithUnit(text: string, decimal: DecimalSeparator): NumberWithUnit {
  const value = readNumber(text, decimal);
  if (!Number.isNaN(value)) return { value, unit: null };
  const m = WITH_UNIT.exec(text.trim());
  if (!m) return { value: NaN, unit: null };
  return { value: readNumber(m[1], decimal), unit: m[2].trim() };
}
