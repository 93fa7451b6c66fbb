/**
 * Safety in the exports: the notice rows and caution cells (app/_lib/exports/safety.ts), the CSV
 * comment lines, and our own trial-sheet import reading such a CSV back.
 * Thresholds and their basis (DOMAIN.md §5, §3.7): 40 °C spa limit (CPSC advisory 79-071, UL 1563
 * [38]); 49 °C scald and 60 °C burns in seconds (the scald-time table [39]); 95 °C near boiling,
 * flashing to steam when released (common practice). Each is reached at or above it.
 */
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { toCsv } from '../../../app/_lib/exports/csv';
import { cautionCell, limitItems, sheetNotice } from '../../../app/_lib/exports/safety';
import { studyCsv } from '../../../app/_lib/exports/study-workbook';
import { readDelimited } from '../../../app/_lib/imports/read-delimited';
import { suggestMapping } from '../../../app/_lib/imports/auto-map';
import { importTrialSheet } from '../../../app/_lib/imports/import-trial-sheet';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';
import { coilHeater } from '../../../analysis/performance/heater-model';
import { CAUTION_DEFER } from '../../../analysis/safety/cautions';
import { LPM, outletTempC, study } from './support';

describe('caution cells and notice rows', () => {
  test.each([
    [39.9, null],
    [40, 'outlet at or above the 40 °C spa limit'], // CPSC / UL 1563: at the limit is marked
    [49, 'outlet at or above 49 °C: can scald'], // [39]
    [60, 'outlet at or above 60 °C: burns in seconds'], // [39] 140 °F < 5 s
    [95, 'outlet at or above 95 °C: near boiling, flashes to steam when released'], // common practice
  ])('an outlet of %s °C gives the cell %j', (c, want) => {
    expect(cautionCell([['inlet', 15], ['outlet', c]], 'si')).toBe(want);
  });
  test('the cell names the hottest place and speaks the reader’s units (°F = 1.8·°C + 32, NIST SP 811)', () => {
    expect(cautionCell([['pool', 41], ['heater outlet', 62]], 'us')).toBe('heater outlet at or above 140 °F: burns in seconds');
    expect(cautionCell([['pool', null], ['heater outlet', undefined]], 'si')).toBeNull();
  });
  test('the notice gives the limits, one caution per hazard reached and the analysis-aid sentence once', () => {
    const n = sheetNotice('si', [{ where: 'outlet', valuesC: [30, 52, 51] }]);
    expect(n[0]).toMatch(/^Safety: temperatures at or above 40 °C \(104 °F\) spa limit/);
    expect(n.slice(1, -1)).toEqual([expect.stringMatching(/^Warning: The outlet water reaches 52\.0 °C .*can scald/), expect.stringMatching(/^Warning: The outlet water reaches 52\.0 °C.*spas and tubs/)]);
    expect(n.at(-1)).toBe(CAUTION_DEFER);
    expect(n.filter((l) => l.includes(CAUTION_DEFER))).toHaveLength(1);
  });
  test('the Summary limits in US units: 104, 120, 140 and 203 °F', () => {
    expect(limitItems('us').map((i) => [i.value, i.unit])).toEqual([[104, '°F'], [120, '°F'], [140, '°F'], [203, '°F']]);
  });
});

describe('CSV comment lines', () => {
  test('come first, one "# " line each, with the BOM before them', () => {
    const csv = toCsv([{ key: 'a', header: 'A' }], [{ a: 1 }], { comments: ['Safety: hot', 'two'], bom: true });
    expect(csv).toBe('\uFEFF# Safety: hot\r\n# two\r\n"a"\r\n1');
  });
  test('stay one cell in a spreadsheet: the delimiter inside them is swapped and line breaks are spaces (OWASP CSV Injection)', () => {
    const csv = toCsv([{ key: 'a', header: 'A' }], [], { comments: ['x, =HYPERLINK("http://127.0.0.1")\nnext'] });
    const first = csv.split('\r\n')[0];
    expect(first).toBe('# x; =HYPERLINK("http://127.0.0.1") next');
    expect(Papa.parse<string[]>(first, { delimiter: ',' }).data[0]).toHaveLength(1);
    const semi = toCsv([{ key: 'a', header: 'A' }], [], { delimiter: ';', comments: ['a; =1'] });
    expect(semi.split('\r\n')[0]).toBe('# a, =1');
  });
  test('every table of a study CSV starts with the notice; text cells stay neutralised', () => {
    for (const table of ['Summary', 'Trials', 'Fit', 'Residuals', 'Performance', 'Forecast', 'Costs'] as const) {
      const csv = studyCsv(study('si'), table)!;
      const lines = csv.split('\r\n');
      expect(lines[0], table).toMatch(/^# /);
      expect(lines.filter((l) => l.startsWith('#')).some((l) => /local codes and licensed practice/.test(l)), table).toBe(true);
    }
    const back = Papa.parse<Record<string, unknown>>(studyCsv(study('si'), 'Trials')!, { header: true, comments: '#', skipEmptyLines: true });
    expect(back.data[0].notes).toBe('\'=HYPERLINK("http://127.0.0.1/x","open")');
    expect(back.data[0].caution).toBe('outlet at or above 60 °C: burns in seconds');
  });
  test('the forecast CSV keeps the forecast’s own cautions', () => {
    // a 1 m³ tub heated by a 90 °C coil (UA 500 W/K) at 5 L/min for 10 h: the outlet and the tub pass 40 and 49 °C
    const result = recirculatingForecast({ poolVolumeM3: 1, startTempC: 30, hours: 10, flowM3PerS: 5 * LPM, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }), losses: false });
    expect(result.cautions.length).toBeGreaterThan(1);
    const csv = studyCsv({ ...study('si'), forecasts: [{ label: 'tub', result }] }, 'Forecast')!;
    const comments = csv.split('\r\n').filter((l) => l.startsWith('# '));
    for (const c of result.cautions) {
      const text = c.message.replace(CAUTION_DEFER, '').trim().split(',').join(';');
      expect(comments.some((l) => l.includes(text)), c.code).toBe(true);
    }
  });
});

describe('our trial-sheet import reads an exported Trials CSV back', () => {
  test('the comment lines are kept as notes above the header, and the trials read as they were written', async () => {
    const csv = studyCsv(study('si'), 'Trials')!;
    const t = await readDelimited(Buffer.from(csv, 'utf8'), { fileName: 'trials.csv' });
    expect(t.header).toEqual(expect.arrayContaining(['flow_L_per_min', 'inlet_degC', 'outlet_degC']));
    expect(t.metadata.length).toBe(csv.split('\r\n').filter((l) => l.startsWith('#')).length);
    expect(t.metadata[0].text).toMatch(/^# Safety: temperatures at or above 40 °C/);
    const s = suggestMapping(t.header, t.rows.slice(0, 20), t.dialect.decimal);
    const mapping = {
      shape: 'trialSheet' as const,
      decimal: t.dialect.decimal,
      columns: s.columns.filter((c) => c.field).map((c) => ({ column: c.column, header: c.header, field: c.field!, unit: c.unit ?? undefined })),
    };
    const r = importTrialSheet(t, mapping, { file: 'trials.csv' });
    expect(r.errorCount).toBe(0);
    expect(r.okCount).toBe(outletTempC.length);
    r.rows.forEach((row, i) => {
      if (!row.ok) throw new Error(`line ${row.line}`);
      expect(row.row.outletTempC).toBeCloseTo(outletTempC[i], 9);
      expect(row.row.inletTempC).toBe(20);
    });
  });
});
