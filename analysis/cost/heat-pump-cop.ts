/**
 * Heat-pump COP as a function of air temperature from the user's table (the maker's data or
 * AHRI 1160 rating points; DOMAIN.md §4, §6 [2, 23]): linear interpolation between rows, held at
 * the end value outside the table with a note, since COP falls as the air cools and a table
 * says nothing beyond its rows.
 */
import { requireFinite, requirePositive } from '../units/guards';

/** One row: air temperature, °C, and the COP there (delivered heat / electric energy). */
export interface CopPoint {
  airTempC: number;
  cop: number;
}

/** COP at one air temperature. */
export interface CopAtAir {
  cop: number;
  airTempC: number;
  /** true when the air temperature lies outside the table and the end value was used */
  clamped: boolean;
  /** why the value is held, or null inside the table */
  note: string | null;
}

/**
 * @param table rows in any order, distinct air temperatures, COP > 0
 * @param airTempC air temperature, °C
 * @throws TypeError for a non-array or non-finite entry; RangeError for an empty table, COP ≤ 0
 *   or a repeated air temperature (each names the row).
 * @example copAtAirTemp([{ airTempC: 5, cop: 3 }, { airTempC: 25, cop: 5 }], 15).cop // 4
 */
export function copAtAirTemp(table: CopPoint[], airTempC: number): CopAtAir {
  if (!Array.isArray(table)) throw new TypeError('copTable must be an array of { airTempC, cop } rows');
  if (table.length === 0) throw new RangeError('copTable must have at least one row');
  const rows = table.map((r, i) => ({
    airTempC: requireFinite(r?.airTempC, `copTable[${i}].airTempC`), cop: requirePositive(r?.cop, `copTable[${i}].cop`),
  })).sort((a, b) => a.airTempC - b.airTempC);
  for (let i = 1; i < rows.length; i++) {
    if (rows[i].airTempC === rows[i - 1].airTempC) throw new RangeError(`copTable repeats the air temperature ${rows[i].airTempC} °C`);
  }
  const T = requireFinite(airTempC, 'airTempC');
  const lo = rows[0], hi = rows[rows.length - 1];
  const held = (r: CopPoint, side: string): CopAtAir => ({
    cop: r.cop, airTempC: T, clamped: true,
    note: `${Number(T.toFixed(1))} °C air is ${side} the COP table (${lo.airTempC}–${hi.airTempC} °C): the COP at ${r.airTempC} °C is used; measure or ask for the COP at this air temperature.`,
  });
  if (T < lo.airTempC) return held(lo, 'below');
  if (T > hi.airTempC) return held(hi, 'above');
  let i = 0;
  while (i < rows.length - 1 && rows[i + 1].airTempC < T) i++;
  if (i === rows.length - 1) return { cop: hi.cop, airTempC: T, clamped: false, note: null };
  const a = rows[i], b = rows[i + 1];
  const f = (T - a.airTempC) / (b.airTempC - a.airTempC);
  return { cop: a.cop + f * (b.cop - a.cop), airTempC: T, clamped: false, note: null };
}
