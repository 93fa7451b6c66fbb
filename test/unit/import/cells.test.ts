import { describe, expect, test } from 'vitest';
import { readNumber, readNumberWithUnit } from '@/app/_lib/imports/read-number';
import { detectDateOrder, readDate, readSerialDate } from '@/app/_lib/imports/read-date';
import { readUnit, toSI, type ColumnUnit } from '@/app/_lib/imports/column-units';
import { convert } from '@/analysis/units/parse-quantity';

describe('numbers in cells', () => {
  test.each([
    ['12.5', '.', 12.5], ['-0.25', '.', -0.25], ['.5', '.', 0.5], ['1.2e-3', '.', 0.0012], ['1,234.5', '.', 1234.5],
    ['12,5', ',', 12.5], ['-0,25', ',', -0.25], ['1.234,5', ',', 1234.5], ['1 234,5', ',', 1234.5], ['12.5', ',', 12.5],
  ] as const)('%j with decimal %j reads %d', (text, dec, want) => {
    expect(readNumber(text, dec)).toBe(want);
  });

  test.each([[''], ['  '], ['n/a'], ['12,5'], ['0x10'], ['1..2'], ['--3']])('%j is not a number with a decimal point (NaN, never 0)', (text) => {
    expect(readNumber(text, '.')).toBeNaN();
  });

  test('a grouping-like "1.234" in a decimal-comma file is not read as 1.234', () => {
    expect(readNumber('1.234', ',')).toBe(1234);
  });

  test.each([
    ['54 °F', '.', 54, '°F'], ['12,5 °C', ',', 12.5, '°C'], ['4.2gpm', '.', 4.2, 'gpm'], ['15 l/min', '.', 15, 'l/min'], ['30', '.', 30, null],
  ] as const)('%j splits into a number and its unit', (text, dec, value, unit) => {
    expect(readNumberWithUnit(text, dec)).toEqual({ value, unit });
  });
});

describe('units of columns → SI through analysis/units', () => {
  test.each([
    ['°F', 'degF'], ['F', 'degF'], ['C', 'degC'], ['℃', 'degC'], ['Celsius', 'degC'], ['K', 'K'],
    ['gal', 'gal'], ['US gal', 'gal'], ['l', 'L'], ['Liter', 'L'], ['m³', 'm^3'],
    ['gpm', 'gpm'], ['l/min', 'L/min'], ['L·min⁻¹', 'L/min'], ['lpm', 'L/min'], ['m3/h', 'm^3/h'],
    ['s', 's'], ['sec', 's'], ['Sekunden', 's'], ['min', 'min'],
  ])('%j is read as %s', (text, unit) => {
    expect(readUnit(text)).toBe(unit);
  });

  test.each([['kg'], ['bar'], ['psi'], ['m'], ['']])('%j is not a unit a trial column takes', (text) => {
    expect(readUnit(text)).toBeNull();
  });

  // NIST SP 811 (2008) Appendix B.8 and B.9: gallon (US) = 3.785 411 784 E−03 m³ exactly (231 in³);
  // t/°C = (t/°F − 32)/1.8 exactly (SP 811 §B.9 temperature conversions); foot = 0.3048 m exactly.
  test.each([
    ['gal', 1, 3.785411784e-3],
    ['L', 1, 1e-3],
    ['ft^3', 1, 0.028316846592],
    ['gpm', 1, 3.785411784e-3 / 60],
    ['L/min', 15.14, 15.14e-3 / 60],
    ['m^3/h', 1, 1 / 3600],
    ['min', 1.5, 90],
    ['h', 1, 3600],
    ['degF', 212, 100],
    ['degF', 32, 0],
    ['degF', 98.6, 37],
    ['degF', -40, -40],
    ['K', 273.15, 0],
  ] as [ColumnUnit, number, number][])('%s: %d → %d in SI (NIST SP 811 B.8/B.9)', (unit, x, si) => {
    const a = toSI(unit);
    expect(x * a.scale + a.offset).toBeCloseTo(si, 12);
  });

  test.each(['degF', 'degC', 'K', 'gal', 'ft^3', 'gpm', 'gph', 'L/h', 'mL/min'] as ColumnUnit[])(
    'the affine %s conversion agrees with the units module convert() to 1e-12 over a range of values',
    (unit) => {
      const target = ['degF', 'degC', 'K'].includes(unit) ? 'degC' : ['gal', 'ft^3'].includes(unit) ? 'm^3' : 'm^3/s';
      const a = toSI(unit);
      for (const x of [-40, 0, 0.5, 12.25, 77, 212, 1234.5]) {
        const want = convert(x, unit, target);
        expect(Math.abs(x * a.scale + a.offset - want)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want)));
      }
    },
  );
});

describe('dates and times', () => {
  test.each([
    ['2026-05-02T14:05:30Z', '2026-05-02T14:05:30Z', 1777730730],
    ['2026-05-02 14:05', '2026-05-02T14:05:00', 1777730700],
    ['2026-05-02T16:05:30+02:00', '2026-05-02T14:05:30Z', 1777730730],
    ['02.05.2026 14:05', '2026-05-02T14:05:00', 1777730700],
    ['2.5.26 14:05:30', '2026-05-02T14:05:30', 1777730730],
    ['2026/05/02', '2026-05-02T00:00:00', 1777680000],
    ['25/02/2026 2:05 PM', '2026-02-25T14:05:00', 1772028300],
    ['02/25/2026 2:05 pm', '2026-02-25T14:05:00', 1772028300],
  ])('%j → %s (epoch seconds checked with GNU `date -u -d … +%s` on this machine)', (text, iso, epochS) => {
    const r = readDate(text);
    expect(r).toEqual({ ok: true, kind: 'datetime', iso, epochS });
  });

  test('a slashed date with both parts ≤ 12 needs the order, and then obeys it', () => {
    const r = readDate('05/02/2026');
    expect(r.ok).toBe(false);
    expect(r.ok === false && r.ambiguous).toBe(true);
    expect(readDate('05/02/2026', { order: 'dmy' })).toMatchObject({ iso: '2026-02-05T00:00:00' });
    expect(readDate('05/02/2026', { order: 'mdy' })).toMatchObject({ iso: '2026-05-02T00:00:00' });
  });

  test('the column decides the order from values that settle it', () => {
    expect(detectDateOrder(['03/04/2026', '25/04/2026'])).toBe('dmy');
    expect(detectDateOrder(['05/14/2026 9:40 AM', '05/02/2026'])).toBe('mdy');
    expect(detectDateOrder(['03/04/2026'])).toBe('ambiguous');
    expect(detectDateOrder(['13/04/2026', '04/13/2026'])).toBe('conflict');
    expect(detectDateOrder(['2026-05-02'])).toBeNull();
  });

  test('clock times are seconds since midnight', () => {
    expect(readDate('14:05')).toEqual({ ok: true, kind: 'clock', iso: '14:05:00', epochS: 50700 });
    expect(readDate('12:30 AM')).toMatchObject({ epochS: 1800 });
  });

  test('a zone-less time is shifted by the lab zone', () => {
    expect(readDate('2026-05-02 14:05', { utcOffsetMinutes: 120 })).toMatchObject({ iso: '2026-05-02T14:05:00', epochS: 1777730700 - 7200 });
  });

  test.each([
    ['31.02.2026', /day 31 does not exist in 2026-02/],
    ['29.02.2026', /day 29 does not exist/],
    ['2026-13-01', /month 13/],
    ['25:00', /not a time of day/],
    ['yesterday', /not a date or time this importer reads/],
  ])('%j is refused with a reason', (text, why) => {
    const r = readDate(text);
    expect(r.ok).toBe(false);
    expect(r.ok === false && r.reason).toMatch(why);
  });

  test('29 February exists in leap years (Gregorian rule: divisible by 4, not by 100 unless by 400)', () => {
    expect(readDate('29.02.2028').ok).toBe(true);
    expect(readDate('29.02.2000').ok).toBe(true);
    expect(readDate('29.02.1900').ok).toBe(false);
  });

  // ECMA-376 Part 1 §18.17.4.1 (1900 date system): serial 1 = 1900-01-01, the system counts a
  // fictitious 1900-02-29 as serial 60; serial 25569 = 1970-01-01 (common practice).
  test.each([
    [1, '1900-01-01T00:00:00'],
    [59, '1900-02-28T00:00:00'],
    [61, '1900-03-01T00:00:00'],
    [25569, '1970-01-01T00:00:00'],
    [46144.5, '2026-05-02T12:00:00'],
  ])('spreadsheet serial %d is %s', (serial, iso) => {
    expect(readSerialDate(serial)).toMatchObject({ ok: true, kind: 'datetime', iso });
  });

  test('serial 60 (the day 1900-02-29 that never was) and out-of-range serials are refused; fractions are clock times', () => {
    expect(readSerialDate(60).ok).toBe(false);
    expect(readSerialDate(-1).ok).toBe(false);
    expect(readSerialDate(0.75)).toEqual({ ok: true, kind: 'clock', iso: '18:00:00', epochS: 64800 });
  });
});
