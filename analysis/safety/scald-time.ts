/**
 * Time to a serious scald as a function of water temperature, from the published table of a
 * children's hospital burn-prevention page (DOMAIN.md §5 [39]): 120 °F > 5 min; 125 °F 1.5–2 min;
 * 130 °F 30 s; 135 °F 10 s; 140 °F < 5 s; 145 °F < 3 s; 150 °F 1.5 s; 155 °F 1 s. Between rows the
 * time is interpolated log-linearly (ln t linear in temperature), each end of a range separately;
 * a "longer than" / "shorter than" qualifier carries over only between two rows that share it.
 * Below 120 °F the answer is "longer than 5 min", above 155 °F "shorter than 1 s". Children,
 * older people and thin skin burn faster than the table says.
 */
import { requireFinite } from '../units/guards';
import { fahrenheitToCelsius } from '../units/exact-factors';

/** One row of the table: temperature, °F, and the shortest and longest time stated, s (null = open). */
interface ScaldRow { tempF: number; lowS: number | null; highS: number | null }

/** The published rows, °F and s, as printed in [39]. */
export const SCALD_TIME_TABLE: readonly Readonly<ScaldRow>[] = [
  { tempF: 120, lowS: 300, highS: null },
  { tempF: 125, lowS: 90, highS: 120 },
  { tempF: 130, lowS: 30, highS: 30 },
  { tempF: 135, lowS: 10, highS: 10 },
  { tempF: 140, lowS: null, highS: 5 },
  { tempF: 145, lowS: null, highS: 3 },
  { tempF: 150, lowS: 1.5, highS: 1.5 },
  { tempF: 155, lowS: 1, highS: 1 },
];

/** Time to a serious scald at one temperature. */
export interface ScaldTime {
  tempC: number;
  /** 'longer-than' / 'shorter-than' when only a bound is known, 'range' or 'about' otherwise */
  qualifier: 'longer-than' | 'shorter-than' | 'range' | 'about';
  /** shortest time the table supports, s (null when only an upper bound is known) */
  lowS: number | null;
  /** longest time the table supports, s (null when only a lower bound is known) */
  highS: number | null;
  /** the figure to show, s: the lower end of a range, or the bound itself */
  seconds: number;
  /** true when interpolated between rows rather than read from one */
  interpolated: boolean;
  /** outside 120–155 °F: only a bound is known */
  outsideTable: boolean;
  /** e.g. 'longer than 5 min', '1.5–2 min', '30 s', 'about 17 s', 'shorter than 5 s' */
  text: string;
}

const fToC = fahrenheitToCelsius;

function dur(s: number): string {
  const trim = (x: number) => String(Number(x.toFixed(1)));
  return s >= 60 ? `${trim(s / 60)} min` : s >= 10 ? `${Math.round(s)} s` : `${trim(s)} s`;
}

function phrase(lo: number | null, hi: number | null, interpolated: boolean): Pick<ScaldTime, 'qualifier' | 'text'> {
  if (hi === null) return { qualifier: 'longer-than', text: `longer than ${dur(lo as number)}` };
  if (lo === null) return { qualifier: 'shorter-than', text: `shorter than ${dur(hi)}` };
  const a = dur(lo), b = dur(hi);
  if (a === b) return { qualifier: 'about', text: interpolated ? `about ${a}` : a };
  const unit = (x: string) => x.replace(/^[\d.]+ /, '');
  const range = unit(a) === unit(b) ? `${a.replace(/ \w+$/, '')}–${b}` : `${a}–${b}`;
  return { qualifier: 'range', text: interpolated ? `about ${range}` : range };
}

/**
 * Time to a serious scald for skin in contact with water at `tempC`.
 * @param tempC water temperature, °C
 * @returns the time with its qualifier and a display text; times in s
 * @throws TypeError when `tempC` is not a finite number.
 * @example scaldTime(57).text // 'about 11 s'
 */
export function scaldTime(tempC: number): ScaldTime {
  const T = requireFinite(tempC, 'tempC');
  const rows = SCALD_TIME_TABLE;
  const first = rows[0], last = rows[rows.length - 1];
  const build = (lo: number | null, hi: number | null, interpolated: boolean, outsideTable: boolean): ScaldTime => ({
    tempC: T, lowS: lo, highS: hi, seconds: (lo ?? hi) as number, interpolated, outsideTable, ...phrase(lo, hi, interpolated),
  });
  const exact = rows.find((r) => Math.abs(fToC(r.tempF) - T) < 1e-9);
  if (exact) return build(exact.lowS, exact.highS, false, false);
  if (T < fToC(first.tempF)) return build(first.lowS, null, false, true);
  if (T > fToC(last.tempF)) return build(null, last.lowS, false, true);
  let i = 1;
  while (fToC(rows[i].tempF) < T) i++;
  const a = rows[i - 1], b = rows[i];
  const f = (T - fToC(a.tempF)) / (fToC(b.tempF) - fToC(a.tempF));
  // a bound stated as a single figure stands for that figure at its own row
  const logInterp = (x: number, y: number) => Math.exp((1 - f) * Math.log(x) + f * Math.log(y));
  const lo = a.lowS === null && b.lowS === null ? null : logInterp((a.lowS ?? a.highS) as number, (b.lowS ?? b.highS) as number);
  const hi = a.highS === null && b.highS === null ? null : logInterp((a.highS ?? a.lowS) as number, (b.highS ?? b.lowS) as number);
  return build(lo, hi, true, false);
}
