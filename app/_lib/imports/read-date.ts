/**
 * Dates and clock times in the shapes trial sheets and logger dumps use: ISO 8601
 * (`2026-05-02T14:05:30Z`, `2026-05-02 14:05`), day-first dotted (`02.05.2026 14:05`),
 * slashed (`05/02/2026` — day-first or month-first, which must be chosen when both parts are
 * ≤ 12), clock times (`14:05`, `2:05 PM`) and spreadsheet serial numbers (1900 date system).
 *
 * Times without a zone are wall-clock times of the lab; `epochS` reads them as UTC plus the
 * `utcOffsetMinutes` the caller passes (the lab's zone), so they sort and subtract correctly.
 */

/** How a slashed date is read: day/month/year or month/day/year. */
export type DateOrder = 'dmy' | 'mdy';

export type DateReading =
  | {
      ok: true;
      /** `datetime` has a date; `clock` is a time of day only (epochS = seconds since midnight) */
      kind: 'datetime' | 'clock';
      /** `YYYY-MM-DDTHH:MM:SS[.sss]` (with `Z` when the text had a zone), or `HH:MM:SS` for a clock time */
      iso: string;
      /** seconds since 1970-01-01T00:00Z, or since midnight for a clock time */
      epochS: number;
    }
  | { ok: false; reason: string; ambiguous?: boolean };

export interface DateOptions {
  /** required to read `05/02/2026`; not needed when a part is > 12 or for dotted/ISO dates */
  order?: DateOrder;
  /** the zone of zone-less times, minutes east of UTC (default 0) */
  utcOffsetMinutes?: number;
}

const ISO = /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const YMD_SLASH = /^(\d{4})\/(\d{1,2})\/(\d{1,2})(?:[T ,]+(\d{1,2}):(\d{2})(?::(\d{2}))?)?$/;
const DOTTED = /^(\d{1,2})\.(\d{1,2})\.(\d{4}|\d{2})(?:,?\s+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?$/;
const SLASHED = /^(\d{1,2})\/(\d{1,2})\/(\d{4}|\d{2})(?:,?\s+(\d{1,2}):(\d{2})(?::(\d{2}))?\s*([AaPp][Mm])?)?$/;
const CLOCK = /^(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?\s*([AaPp][Mm])?$/;

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** Two-digit years: 00–68 → 20xx, 69–99 → 19xx (the POSIX strptime %y rule, from memory). */
function fullYear(y: string): number {
  const n = Number(y);
  if (y.length === 4) return n;
  return n <= 68 ? 2000 + n : 1900 + n;
}

function hour12(h: number, ampm: string | undefined): number {
  if (!ampm) return h;
  const pm = ampm.toLowerCase() === 'pm';
  if (h === 12) return pm ? 12 : 0;
  return pm ? h + 12 : h;
}

function daysInMonth(y: number, mo: number): number {
  if (mo === 2) return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0 ? 29 : 28;
  return mo === 4 || mo === 6 || mo === 9 || mo === 11 ? 30 : 31;
}

function build(y: number, mo: number, d: number, h: number, mi: number, s: number, frac: string | undefined, zone: string | undefined, opt: DateOptions): DateReading {
  if (mo < 1 || mo > 12) return { ok: false, reason: `month ${mo} is not 1–12` };
  if (h > 23 || mi > 59 || s > 59) return { ok: false, reason: `time ${pad(h)}:${pad(mi)}:${pad(s)} is not a time of day` };
  if (d < 1 || d > daysInMonth(y, mo)) return { ok: false, reason: `day ${d} does not exist in ${y}-${pad(mo)}` };
  const ms = frac ? Math.round(Number(`0.${frac}`) * 1000) : 0;
  const t = Date.UTC(y, mo - 1, d, h, mi, s, ms);
  let offsetMin: number;
  if (zone === undefined) offsetMin = opt.utcOffsetMinutes ?? 0;
  else if (zone === 'Z' || zone === 'z') offsetMin = 0;
  else {
    const m = /^([+-])(\d{2}):?(\d{2})?$/.exec(zone)!;
    offsetMin = (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3] ?? 0));
  }
  const epochMs = t - offsetMin * 60_000;
  let iso: string;
  if (zone === undefined) {
    // the wall-clock text as written, without a zone
    iso = `${String(y).padStart(4, '0')}-${pad(mo)}-${pad(d)}T${pad(h)}:${pad(mi)}:${pad(s)}${ms ? `.${String(ms).padStart(3, '0')}` : ''}`;
  } else {
    // the instant, in UTC
    iso = new Date(epochMs).toISOString();
    if (ms === 0) iso = iso.replace('.000Z', 'Z');
  }
  return { ok: true, kind: 'datetime', iso, epochS: epochMs / 1000 };
}

/**
 * Reads a date, date-time or clock time.
 * @example readDate('02.05.2026 14:05') // { ok: true, kind: 'datetime', iso: '2026-05-02T14:05:00', epochS: 1777730700 }
 * @example readDate('05/02/2026') // { ok: false, ambiguous: true, … } — pass { order: 'mdy' } or 'dmy'
 */
export function readDate(text: string, opt: DateOptions = {}): DateReading {
  const t = text.trim();
  let m = ISO.exec(t);
  if (m) return build(+m[1], +m[2], +m[3], +(m[4] ?? 0), +(m[5] ?? 0), +(m[6] ?? 0), m[7], m[8], opt);
  m = YMD_SLASH.exec(t);
  if (m) return build(+m[1], +m[2], +m[3], +(m[4] ?? 0), +(m[5] ?? 0), +(m[6] ?? 0), undefined, undefined, opt);
  m = DOTTED.exec(t);
  if (m) return build(fullYear(m[3]), +m[2], +m[1], +(m[4] ?? 0), +(m[5] ?? 0), +(m[6] ?? 0), m[7], undefined, opt);
  m = SLASHED.exec(t);
  if (m) {
    const a = +m[1], b = +m[2];
    let order = opt.order;
    if (a > 12 && b <= 12) order = 'dmy';
    else if (b > 12 && a <= 12) order = 'mdy';
    else if (!order && a !== b) {
      return { ok: false, ambiguous: true, reason: `"${t}" could be day/month or month/day; choose the date order` };
    }
    const [d, mo] = (order ?? 'dmy') === 'dmy' ? [a, b] : [b, a];
    return build(fullYear(m[3]), mo, d, hour12(+(m[4] ?? 0), m[7]), +(m[5] ?? 0), +(m[6] ?? 0), undefined, undefined, opt);
  }
  m = CLOCK.exec(t);
  if (m) {
    const h = hour12(+m[1], m[5]), mi = +m[2], s = +(m[3] ?? 0);
    if (h > 23 || mi > 59 || s > 59) return { ok: false, reason: `"${t}" is not a time of day` };
    const frac = m[4] ? Number(`0.${m[4]}`) : 0;
    return { ok: true, kind: 'clock', iso: `${pad(h)}:${pad(mi)}:${pad(s)}`, epochS: h * 3600 + mi * 60 + s + frac };
  }
  return { ok: false, reason: `"${t}" is not a date or time this importer reads (ISO 2026-05-02 14:05, 02.05.2026 14:05, 05/02/2026, 14:05)` };
}

/** Serial 25569 is 1970-01-01 in the 1900 date system of spreadsheet programs. */
const SERIAL_UNIX_EPOCH = 25569;

/**
 * Spreadsheet serial date (1900 system, days since 1899-12-30 for serials ≥ 61, the fraction is
 * the time of day) → a reading. Serials below 1 are clock times. Serial 60 is the non-existent
 * 1900-02-29 that the 1900 system counts (ECMA-376 Part 1 §18.17.4.1) and is refused.
 * @example readSerialDate(46144.5) // 2026-05-02T12:00:00
 */
export function readSerialDate(serial: number, opt: DateOptions = {}): DateReading {
  if (!Number.isFinite(serial) || serial < 0 || serial > 2958465) return { ok: false, reason: `${serial} is not a spreadsheet date serial` };
  if (serial < 1) {
    const s = Math.round(serial * 86400 * 1000) / 1000;
    const h = Math.floor(s / 3600), mi = Math.floor((s % 3600) / 60), sec = Math.floor(s % 60);
    return { ok: true, kind: 'clock', iso: `${pad(h)}:${pad(mi)}:${pad(sec)}`, epochS: s };
  }
  if (Math.floor(serial) === 60) return { ok: false, reason: 'serial 60 is 1900-02-29, a day that did not exist' };
  const days = serial < 60 ? serial + 1 : serial; // before the fictitious leap day the count is one short
  const ms = Math.round((days - SERIAL_UNIX_EPOCH) * 86400 * 1000);
  const d = new Date(ms);
  return build(d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds(),
    d.getUTCMilliseconds() ? String(d.getUTCMilliseconds()).padStart(3, '0') : undefined, undefined, opt);
}

/**
 * Decides the order of slashed dates in a column from the values that settle it (a part > 12).
 * @returns 'dmy' / 'mdy' when the column says, 'ambiguous' when no value settles it and some
 *   need it, 'conflict' when values point both ways, null when the column has no slashed dates.
 * @example detectDateOrder(['03/04/2026', '25/04/2026']) // 'dmy'
 */
export function detectDateOrder(values: Iterable<string>): DateOrder | 'ambiguous' | 'conflict' | null {
  let dmy = false, mdy = false, any = false;
  for (const v of values) {
    const m = SLASHED.exec(v.trim());
    if (!m) continue;
    any = true;
    const a = +m[1], b = +m[2];
    if (a > 12 && b <= 12) dmy = true;
    else if (b > 12 && a <= 12) mdy = true;
  }
  if (dmy && mdy) return 'conflict';
  if (dmy) return 'dmy';
  if (mdy) return 'mdy';
  return any ? 'ambiguous' : null;
}
