import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { toCsv } from '../../../app/_lib/exports/csv';
import { csvHeader, unitToken, xlsxHeader } from '../../../app/_lib/exports/columns';
import type { ExportColumn } from '../../../app/_lib/exports/columns';

const columns: ExportColumn[] = [
  { key: 'timestamp', header: 'Time' },
  { key: 'flow', header: 'Flow', unit: 'L/min' },
  { key: 'outlet', header: 'Outlet temperature', unit: '°C' },
  { key: 'steady', header: 'Steady' },
  { key: 'notes', header: 'Notes' },
];
const rows = [
  { timestamp: new Date('2026-06-01T09:30:00Z'), flow: 12.5, outlet: 48.25, steady: true, notes: 'fuel added, "dry" wood' },
  { timestamp: new Date('2026-06-01T09:45:00Z'), flow: -0.5, outlet: 51, steady: false, notes: '=cmd|\' /C calc\'!A0' },
  { timestamp: null, flow: 3e-7, outlet: undefined, steady: null, notes: 'two\nlines; and a, comma' },
];

describe('unit tokens in headers (DOMAIN.md §7: unit-suffixed headers such as flow_L_per_min)', () => {
  test.each([
    ['L/min', 'L_per_min'], ['°C', 'degC'], ['°F', 'degF'], ['W/K', 'W_per_K'], ['m³/s', 'm3_per_s'],
    ['Btu/(h·°F)', 'Btu_per_h_degF'], ['W/m²', 'W_per_m2'], ['%', 'pct'], ['gpm', 'gpm'], ['Btu/(h·ft²)', 'Btu_per_h_ft2'],
  ])('%s → %s', (unit, token) => { expect(unitToken(unit)).toBe(token); });

  test('joins the base name and the unit, snake-casing keys', () => {
    expect(csvHeader({ key: 'flow', header: 'Flow', unit: 'L/min' })).toBe('flow_L_per_min');
    expect(csvHeader({ key: 'outlet', header: 'Outlet', unit: '°C' })).toBe('outlet_degC');
    expect(csvHeader({ key: 'heatCiLow', header: 'q low', unit: 'kW' })).toBe('heat_ci_low_kW');
    expect(xlsxHeader({ key: 'flow', header: 'Flow', unit: 'L/min' })).toBe('Flow (L/min)');
  });
});

describe('toCsv', () => {
  test('writes a header row with units, ISO 8601 UTC times and "." decimals (DOMAIN.md §7)', () => {
    const csv = toCsv(columns, rows);
    const lines = csv.split('\r\n');
    expect(lines[0]).toBe('"timestamp","flow_L_per_min","outlet_degC","steady","notes"');
    expect(lines[1]).toBe('"2026-06-01T09:30:00.000Z",12.5,48.25,true,"fuel added, ""dry"" wood"');
  });

  // OWASP CSV Injection: text cells neutralised and quoted; numbers, negative ones too, unquoted numbers.
  test('neutralises formula text and keeps negative numbers as numbers (OWASP CSV Injection)', () => {
    const line = toCsv(columns, rows).split('\r\n')[2];
    expect(line).toBe('"2026-06-01T09:45:00.000Z",-0.5,51,false,"\'=cmd|\' /C calc\'!A0"');
  });

  test('round-trips through papaparse, dynamic typing giving back numbers and ISO dates (papaparse docs)', () => {
    const back = Papa.parse<Record<string, unknown>>(toCsv(columns, rows), { header: true, dynamicTyping: true, skipEmptyLines: true });
    expect(back.errors).toEqual([]);
    expect(back.data).toHaveLength(3);
    expect(back.data[0]).toEqual({ timestamp: new Date('2026-06-01T09:30:00Z'), flow_L_per_min: 12.5, outlet_degC: 48.25, steady: true, notes: 'fuel added, "dry" wood' });
    expect(back.data[1].flow_L_per_min).toBe(-0.5);
    expect(back.data[1].notes).toBe("'=cmd|' /C calc'!A0");
    expect(back.data[2]).toEqual({ timestamp: null, flow_L_per_min: 3e-7, outlet_degC: null, steady: null, notes: 'two\nlines; and a, comma' });
  });

  test('writes ";" as the delimiter when asked, still with "." decimals (common practice in comma-decimal locales)', () => {
    const csv = toCsv(columns.slice(1, 3), [{ flow: 12.5, outlet: 48.25 }], { delimiter: ';' });
    expect(csv).toBe('"flow_L_per_min";"outlet_degC"\r\n12.5;48.25');
    const back = Papa.parse<string[]>(csv, { delimiter: ';' });
    expect(back.data[1]).toEqual(['12.5', '48.25']);
  });

  test('adds a UTF-8 byte-order mark when asked (common practice for spreadsheets reading "°")', () => {
    expect(toCsv([{ key: 'a', header: 'A' }], [], { bom: true })).toBe('\uFEFF"a"\r\n');
  });

  test('neutralises headers too (OWASP CSV Injection: every cell)', () => {
    expect(toCsv([{ key: 'x', header: 'x', csvName: '=evil' }], [{ x: 1 }])).toBe('"\'=evil"\r\n1');
  });

  test('refuses NaN, naming the row and column (STYLE.md §10)', () => {
    expect(() => toCsv(columns, [{ flow: Number.NaN }])).toThrow(/row 1, column flow/);
  });
});
