/**
 * The fast path of the sensor-log reader: the plain rows that make up almost every logger dump
 * (`2026-06-01 08:00:01,14.512,38.004,15.0213,19.12,…`) read straight from the text, without
 * splitting the row into strings, running the general cell readers or building objects per row.
 *
 * It accepts a strict subset of what the general path (papaparse's split, `createRowMapper`,
 * `readNumber`, `readDate`, `sensorSampleSchema`) accepts, and gives the very same numbers:
 * - numbers: `-?d+` or `-?d+<decimal>d+` with at most 15 digits in all, so the digits are an exact
 *   integer m < 2^53 and the value is m / 10^k with k ≤ 15 — one correctly rounded IEEE division
 *   of two exact doubles, which is the value `Number(text)` gives (Clinger's fast path: W. D.
 *   Clinger, "How to read floating point numbers accurately", PLDI 1990);
 * - date-times: `YYYY-MM-DD HH:MM:SS` (or `T`), an optional `.f` of 1–9 digits and an optional
 *   `Z`, with the same range checks and the same arithmetic as `readDate` (`Date.UTC` of the day
 *   plus the exact integer milliseconds of the time, which is how `Date.UTC` composes them).
 * Anything else — a space, a quote, a unit in the cell, an empty cell, a clock time, a dotted
 * date, a value out of range, a row with extra cells — makes `read` return false, and the caller
 * sends that row down the general path, which then decides and words the message. So the rows
 * the fast path takes are rows the general path takes with the same values, and every other row
 * gets exactly the general path's verdict (`test/unit/import/fast-row.test.ts` checks both ways).
 */
import type { ConfirmedMapping } from './apply-mapping';
import { toSI, type AffineToSI } from './column-units';
import type { Delimiter } from './detect-dialect';

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];
const MAX_DIGITS = 15;
const C0 = 48, C9 = 57, MINUS = 45;

/** Where the last `decimalAt` / `FastDateTime.at` stopped (the delimiter after the cell, or the row's end). */
let stop = 0;

/**
 * The number that starts at `a` and ends at the delimiter `del` (a char code) or at `b`, when it
 * is `-?d+(<decimal>d+)?` with at most 15 digits; NaN otherwise. Sets `stop`.
 */
function decimalAt(text: string, a: number, b: number, decimal: number, del: number): number {
  let i = a;
  let neg = false;
  let c = i < b ? text.charCodeAt(i) : -1;
  if (c === MINUS) { neg = true; i++; c = i < b ? text.charCodeAt(i) : -1; }
  let m = 0, k = 0;
  const intStart = i;
  while (c >= C0 && c <= C9) { m = m * 10 + (c - C0); i++; c = i < b ? text.charCodeAt(i) : -1; }
  let digits = i - intStart;
  if (digits === 0) return NaN;
  if (c === decimal) {
    i++;
    c = i < b ? text.charCodeAt(i) : -1;
    const fracStart = i;
    while (c >= C0 && c <= C9) { m = m * 10 + (c - C0); i++; c = i < b ? text.charCodeAt(i) : -1; }
    k = i - fracStart;
    if (k === 0) return NaN;
    digits += k;
  }
  if ((c !== del && c !== -1) || digits > MAX_DIGITS) return NaN;
  stop = i;
  const v = k === 0 ? m : m / POW10[k];
  return neg ? -v : v;
}

/**
 * `text[a, b)` as a number when the whole of it is `-?d+(<decimal>d+)?` with at most 15 digits,
 * else NaN.
 * @param decimal the decimal separator's char code (46 for `.`, 44 for `,`)
 * @example fastDecimal('x,-12.50,y', 2, 8, 46) // -12.5
 */
export function fastDecimal(text: string, a: number, b: number, decimal: number): number {
  return decimalAt(text, a, b, decimal, -2);
}

/** Two digits at `i` (below `b`), or -1. */
function two(text: string, i: number, b: number): number {
  if (i + 2 > b) return -1;
  const x = text.charCodeAt(i) - C0, y = text.charCodeAt(i + 1) - C0;
  return x >= 0 && x <= 9 && y >= 0 && y <= 9 ? x * 10 + y : -1;
}

function daysInMonth(y: number, mo: number): number {
  if (mo === 2) return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0 ? 29 : 28;
  return mo === 4 || mo === 6 || mo === 9 || mo === 11 ? 30 : 31;
}

/** Reads ISO date-times of the subset above; one day's `Date.UTC` is kept for the next rows. */
export class FastDateTime {
  private dayKey = -1;
  private dayMs = 0;
  /** @param utcOffsetMinutes the lab's zone for zone-less times, as in the mapping */
  constructor(private readonly utcOffsetMinutes: number) {}

  /**
   * Epoch seconds of the whole of `text[a, b)`, or NaN when it is outside the subset or not a
   * valid date-time.
   * @example new FastDateTime(0).read('2026-06-01 08:00:01', 0, 19) // 1780300801
   */
  read(text: string, a: number, b: number): number {
    return this.at(text, a, b, -2);
  }

  /** As `read`, for a cell that ends at the delimiter `del` or at `b`; sets `stop`. */
  at(text: string, a: number, b: number, del: number): number {
    const y1 = two(text, a, b), y2 = two(text, a + 2, b);
    if (y1 < 0 || y2 < 0 || a + 19 > b || text.charCodeAt(a + 4) !== MINUS || text.charCodeAt(a + 7) !== MINUS) return NaN;
    const mo = two(text, a + 5, b), d = two(text, a + 8, b);
    const sep = text.charCodeAt(a + 10);
    if (mo < 0 || d < 0 || (sep !== 32 && sep !== 84)) return NaN; // ' ' or 'T'
    if (text.charCodeAt(a + 13) !== 58 || text.charCodeAt(a + 16) !== 58) return NaN; // ':'
    const h = two(text, a + 11, b), mi = two(text, a + 14, b), s = two(text, a + 17, b);
    if (h < 0 || mi < 0 || s < 0) return NaN;
    let i = a + 19;
    let c = i < b ? text.charCodeAt(i) : -1;
    let ms = 0;
    if (c === 46) { // '.'
      i++;
      c = i < b ? text.charCodeAt(i) : -1;
      let f = 0, k = 0;
      while (c >= C0 && c <= C9) { f = f * 10 + (c - C0); i++; k++; c = i < b ? text.charCodeAt(i) : -1; }
      if (k === 0 || k > 9) return NaN;
      ms = Math.round((f / POW10[k]) * 1000);
    }
    let zoned = false;
    if (c === 90) { zoned = true; i++; c = i < b ? text.charCodeAt(i) : -1; } // 'Z'
    if (c !== del && c !== -1) return NaN;
    const y = y1 * 100 + y2;
    if (mo < 1 || mo > 12 || h > 23 || mi > 59 || s > 59 || d < 1 || d > daysInMonth(y, mo)) return NaN;
    stop = i;
    const key = (y * 100 + mo) * 100 + d;
    if (key !== this.dayKey) { this.dayKey = key; this.dayMs = Date.UTC(y, mo - 1, d); }
    const t = this.dayMs + (h * 3_600_000 + mi * 60_000 + s * 1000 + ms);
    const epochMs = t - (zoned ? 0 : this.utcOffsetMinutes) * 60_000;
    return epochMs / 1000;
  }
}

/** Where the fast path puts a row's values (SI). */
export interface FastSample {
  /** epoch s for date-time columns, elapsed s for number columns */
  time: number;
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
  /** NaN when no column is mapped to it */
  ambientTempC: number;
}

export interface FastRowReader {
  /** `datetime` when the time column holds dates, `elapsed` when it holds numbers of a time unit */
  timeKind: 'datetime' | 'elapsed';
  /**
   * Reads the row `text[a, b)` (no line break inside) into `out`.
   * @returns false when any mapped cell is outside the fast subset, or a temperature is below
   *   absolute zero: the row must then go down the general path
   */
  read(text: string, a: number, b: number, out: FastSample): boolean;
}

const FAST_FIELDS = new Set(['time', 'inletTemp', 'outletTemp', 'flow', 'ambientTemp']);
const ABSOLUTE_ZERO_C = -273.15;

/**
 * The fast reader for a checked sensor-log mapping, or null when the mapping maps anything the
 * fast path does not read (notes, bucket, fill times, a number column without a unit).
 */
export function createFastRowReader(m: ConfirmedMapping, headerLength: number, delimiter: Delimiter): FastRowReader | null {
  if (m.columns.some((c) => !FAST_FIELDS.has(c.field))) return null;
  const slot = new Int8Array(headerLength).fill(-1); // column → 0 time, 1 inlet, 2 outlet, 3 flow, 4 ambient
  const affine: (AffineToSI | null)[] = [null, null, null, null, null];
  let timeKind: 'datetime' | 'elapsed' = 'datetime';
  let timeScale = 1;
  for (const c of m.columns) {
    const k = c.field === 'time' ? 0 : c.field === 'inletTemp' ? 1 : c.field === 'outletTemp' ? 2 : c.field === 'flow' ? 3 : 4;
    slot[c.column] = k;
    if (k === 0) {
      if (c.unit && c.unit !== 'datetime') { timeKind = 'elapsed'; timeScale = toSI(c.unit).scale; }
    } else {
      if (!c.unit || c.unit === 'datetime') return null;
      affine[k] = toSI(c.unit);
    }
  }
  const hasAmbient = affine[4] !== null;
  const dec = m.decimal.charCodeAt(0);
  const dates = new FastDateTime(m.utcOffsetMinutes);
  const a1 = affine[1]!, a2 = affine[2]!, a3 = affine[3]!, a4 = affine[4];

  const del = delimiter.charCodeAt(0);
  return {
    timeKind,
    read(text, a, b, out) {
      let col = 0, i = a, seen = 0;
      for (;;) {
        if (col >= headerLength) return false; // a cell beyond the header: the general path decides
        const k = slot[col];
        if (k < 0) {
          while (i < b && text.charCodeAt(i) !== del) i++;
        } else {
          let v: number;
          if (k === 0) v = timeKind === 'datetime' ? dates.at(text, i, b, del) : decimalAt(text, i, b, dec, del) * timeScale;
          else v = decimalAt(text, i, b, dec, del);
          if (v !== v) return false; // NaN: not in the subset
          i = stop;
          switch (k) {
            case 0: out.time = v; break;
            case 1: out.inletTempC = v * a1.scale + a1.offset; break;
            case 2: out.outletTempC = v * a2.scale + a2.offset; break;
            case 3: out.flowM3PerS = v * a3.scale + a3.offset; break;
            default: out.ambientTempC = v * a4!.scale + a4!.offset;
          }
          seen++;
        }
        if (i >= b) break;
        i++; // the delimiter
        col++;
      }
      if (seen !== m.columns.length) return false; // a mapped cell is missing
      if (!(out.inletTempC >= ABSOLUTE_ZERO_C) || !(out.outletTempC >= ABSOLUTE_ZERO_C)) return false;
      if (hasAmbient) { if (!(out.ambientTempC >= ABSOLUTE_ZERO_C)) return false; } else out.ambientTempC = NaN;
      return true;
    },
  };
}
