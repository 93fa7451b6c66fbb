import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { describe, expect, test } from 'vitest';
import { fitWorkbook, studyCsv, studyWorkbook, ANALYSIS_AID_NOTICE } from '../../../app/_lib/exports/study-workbook';
import { coil, expInlet, flowsLpm, forecast, LPM, outletTempC, perf, study, trials } from './support';

async function readBack(buf: Buffer): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(buf as unknown as ArrayBuffer);
  return wb;
}

/** The header row of a sheet: the frozen row, under the notice rows. */
const headerRow = (ws: ExcelJS.Worksheet) => (ws.views[0] as { ySplit?: number } | undefined)?.ySplit ?? 1;

/** Row objects of a sheet keyed by the header text (the frozen header row), up to the first empty row. */
function table(ws: ExcelJS.Worksheet): Record<string, ExcelJS.CellValue>[] {
  const h = headerRow(ws);
  const headers = (ws.getRow(h).values as ExcelJS.CellValue[]).slice(1).map(String);
  const out: Record<string, ExcelJS.CellValue>[] = [];
  for (let r = h + 1; r <= ws.rowCount; r++) {
    const row = ws.getRow(r);
    if (!row.hasValues) break;
    out.push(Object.fromEntries(headers.map((h, j) => [h, row.getCell(j + 1).value])));
  }
  return out;
}

/** Summary value by item, within a section. */
function summary(ws: ExcelJS.Worksheet, section: string, item: string): ExcelJS.CellValue {
  const row = table(ws).find((r) => r.Section === section && r.Item === item);
  if (!row) throw new Error(`no Summary line ${section} / ${item}`);
  return row.Value;
}

// NIST SP 811 (2008) App. B.8, as analysis/units defines them: °F = 1.8·°C + 32; 1 gal = 3.785411784 L;
// 1 Btu_IT = 1055.05585262 J, so 1 W = 3600/1055.05585262 Btu/h.
const F = (c: number) => 1.8 * c + 32;
const GPM_PER_LPM = 1 / 3.785411784;
const BTUH_PER_W = 3600 / 1055.05585262;

describe('studyWorkbook, SI', async () => {
  const wb = await readBack(await studyWorkbook(study('si')));

  test('holds the issue 7 sheets in order, each with a frozen header row', () => {
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', 'Trials', 'Fit', 'Residuals', 'Performance', 'Forecast', 'Costs']);
    for (const ws of wb.worksheets) {
      expect(ws.views[0], ws.name).toMatchObject({ state: 'frozen' });
      const h = headerRow(ws);
      expect(ws.getRow(h).font?.bold, ws.name).toBe(true);
      expect(String(ws.autoFilter), ws.name).toMatch(new RegExp(`^A${h}:`)); // exceljs reads the filter back as a range
    }
  });

  test('every sheet prints one page wide, with its header row repeated and all its rows in the print area', () => {
    for (const ws of wb.worksheets) {
      const h = headerRow(ws);
      expect(ws.pageSetup, ws.name).toMatchObject({ fitToPage: true, fitToWidth: 1, fitToHeight: 0 });
      expect(ws.pageSetup.printTitlesRow, ws.name).toBe(`${h}:${h}`);
      expect(ws.pageSetup.printArea, ws.name).toMatch(new RegExp(`^A1:[A-Z]+${ws.rowCount}$`));
      // every sheet of this study is wider than a portrait page (the narrow case is in xlsx.test.ts)
      expect(ws.pageSetup.orientation, ws.name).toBe('landscape');
    }
  });

  // Thresholds (DOMAIN.md §5, §3.7): 40 °C spa limit (CPSC 79-071 / UL 1563), 49 °C scald and 60 °C
  // burns in seconds (scald-time table [39]), 95 °C steam (common practice).
  test('every sheet that shows temperatures has the safety notice in its header rows, with one caution per hazard reached', () => {
    for (const name of ['Summary', 'Trials', 'Fit', 'Residuals', 'Performance', 'Forecast']) {
      const ws = wb.getWorksheet(name)!;
      const h = headerRow(ws);
      expect(h, name).toBeGreaterThan(1);
      const notice = Array.from({ length: h - 1 }, (_, i) => String(ws.getCell(i + 1, 1).value));
      expect(notice[0], name).toBe('Safety: temperatures at or above 40 °C (104 °F) spa limit / 49 °C (120 °F) scald risk / 60 °C (140 °F) burns in seconds / 95 °C (203 °F) steam risk are marked in the Caution column.');
      expect(notice.at(-1), name).toMatch(/local codes and licensed practice/);
    }
    // the trials reach 85.6 °C at 2 L/min (Ts 90 °C coil): burns in seconds, scald and spa limit, each once
    const trialsNotice = Array.from({ length: headerRow(wb.getWorksheet('Trials')!) - 1 }, (_, i) => String(wb.getWorksheet('Trials')!.getCell(i + 1, 1).value));
    expect(trialsNotice.filter((l) => /^Danger: The outlet water reaches .*burns skin in seconds/.test(l))).toHaveLength(1);
    expect(trialsNotice.filter((l) => /^Warning: The outlet water reaches .*can scald/.test(l))).toHaveLength(1);
    expect(trialsNotice.filter((l) => /spas and tubs/.test(l))).toHaveLength(1);
    expect(wb.getWorksheet('Costs')!.getCell(1, 1).value).toBe('Section');
  });

  test('each row says in words which limit its temperature reaches (Caution column)', () => {
    const rows = table(wb.getWorksheet('Trials')!);
    rows.forEach((r, i) => {
      const t = outletTempC[i];
      const want = t >= 95 ? /steam/ : t >= 60 ? /^outlet at or above 60 °C: burns in seconds$/ : t >= 49 ? /^outlet at or above 49 °C: can scald$/ : t >= 40 ? /^outlet at or above the 40 °C spa limit$/ : null;
      if (want) expect(r.Caution, `${t} °C`).toMatch(want);
      else expect(r.Caution, `${t} °C`).toBeNull();
    });
    expect(rows[0].Caution).toBe('outlet at or above 60 °C: burns in seconds'); // 85.6 °C
    const perfRows = table(wb.getWorksheet('Performance')!);
    expect(perfRows.some((r) => typeof r.Caution === 'string')).toBe(true);
  });

  test('the Summary states the limits with their meaning: 40, 49, 60 and 95 °C', () => {
    const rows = table(wb.getWorksheet('Summary')!).filter((r) => r.Section === 'Safety limits');
    expect(rows.map((r) => [r.Value, r.Unit])).toEqual([[40, '°C'], [49, '°C'], [60, '°C'], [95, '°C']]);
    expect(String(rows[0].Item)).toMatch(/spa.*CPSC.*UL 1563/);
    expect(String(rows[1].Item)).toMatch(/scald/);
    expect(String(rows[2].Item)).toMatch(/seconds/);
    expect(String(rows[3].Item)).toMatch(/steam.*common practice/);
  });

  test('states provenance on the Summary sheet, with the analysis-aid notice (DOMAIN.md §7 reproducibility; issue 7 §8)', () => {
    const s = wb.getWorksheet('Summary')!;
    expect(summary(s, 'Provenance', 'Lab')).toBe('Demo lab');
    expect(summary(s, 'Provenance', 'Software version')).toBe('0.1.0');
    expect(summary(s, 'Provenance', 'Data hash')).toBe('ab12cd34');
    expect((summary(s, 'Provenance', 'Fit time (UTC)') as Date).toISOString()).toBe('2026-06-01T12:00:00.000Z');
    expect(summary(s, 'Settings', 'Confidence level')).toBe(0.95);
    expect(summary(s, 'Fit: coil', 'Points (n)')).toBe(9);
    expect(summary(s, 'Fit: coil', 'Residual SD')).toBeCloseTo(coil.residualSD, 12);
    const texts: unknown[] = [];
    s.eachRow((row) => row.eachCell((c) => texts.push(c.value)));
    expect(texts).toContain(ANALYSIS_AID_NOTICE);
  });

  // NIST SP 811: 1 L = 10⁻³ m³ exactly, so L/min = m³/s × 60,000; 1 kW = 1000 W.
  test('writes the trials in lab SI units with units in the headers', () => {
    const rows = table(wb.getWorksheet('Trials')!);
    expect(rows).toHaveLength(9);
    expect(Object.keys(rows[0])).toEqual(expect.arrayContaining(['Flow (L/min)', 'Outlet temperature (°C)', 'Heat rate (kW)', 'UA (W/K)', 'Fill 1 (s)', 'Fill 2 (s)']));
    rows.forEach((r, i) => {
      expect(r['Flow (L/min)']).toBeCloseTo(flowsLpm[i], 10);
      expect(r['Outlet temperature (°C)']).toBeCloseTo(outletTempC[i], 12);
      expect(r['Heat rate (kW)']).toBeCloseTo((trials[i].heatW as number) / 1000, 12);
      expect(r['Ambient temperature (°C)']).toBe(-2.5);
    });
    const ws = wb.getWorksheet('Trials')!;
    expect(ws.getCell(headerRow(ws) + 1, 6).numFmt).toBe('0.00');
  });

  test('gives every parameter with its error, interval and covariance as fitted (coil: °C, W/K)', () => {
    const rows = table(wb.getWorksheet('Fit')!);
    expect(rows.map((r) => `${r.Model}/${r.Parameter}`)).toEqual(['coil/Ts', 'coil/UA', 'exp-inlet/A', 'exp-inlet/k']);
    const ua = rows[1];
    expect(ua.Unit).toBe('W/K');
    expect(ua.Estimate).toBeCloseTo(coil.params.UA.value, 10);
    expect(ua['Standard error']).toBeCloseTo(coil.params.UA.stdErr, 10);
    expect(ua['CI low']).toBeCloseTo(coil.params.UA.ciLow, 10);
    expect(ua['Covariance with Ts']).toBeCloseTo(coil.covariance[1][0], 12);
    expect(ua['Correlation with Ts']).toBeCloseTo(coil.correlation[1][0], 12);
    // exp-inlet has no Ts: its covariance cell with Ts is empty
    expect(rows[2]['Covariance with Ts']).toBeNull();
    // k is in s/m³ as fitted; per L/min it is k × (1/60,000 m³/s per L/min)
    expect(rows[3].Unit).toBe('1/(L/min)');
    expect(rows[3].Estimate).toBeCloseTo(expInlet.params.k.value * LPM, 10);
  });

  test('lists residuals and diagnostics per point, negative residuals as numbers (DOMAIN.md §7)', () => {
    const ws = wb.getWorksheet('Residuals')!;
    const rows = table(ws).filter((r) => r.Model === 'coil');
    expect(rows).toHaveLength(coil.n);
    rows.forEach((r, i) => {
      expect(r.Trial).toBe(`T${i + 1}`);
      expect(r['Residual (K)']).toBeCloseTo(coil.residuals[i], 12);
      expect(r.Leverage).toBeCloseTo(coil.leverage[i], 12);
      expect(r['High leverage']).toBe(coil.flags.highLeverage.includes(i));
    });
    const negative = coil.residuals.findIndex((e) => e < 0);
    expect(ws.getCell(headerRow(ws) + 1 + negative, 7).type).toBe(ExcelJS.ValueType.Number);
  });

  test('writes the performance table with intervals and the extrapolated flag', () => {
    const rows = table(wb.getWorksheet('Performance')!);
    expect(rows).toHaveLength(4);
    rows.forEach((r, i) => {
      expect(r['Outlet temperature (°C)']).toBeCloseTo(perf.rows[i].outletTempC, 12);
      expect(r['Heat PI high (kW)']).toBeCloseTo(perf.rows[i].heatPiW[1] / 1000, 12);
      expect(r.Extrapolated).toBe(perf.rows[i].extrapolated);
    });
    expect(rows[3].Extrapolated).toBe(true); // 24 L/min lies beyond the tested 2–18 L/min
  });

  test('writes the forecast series with timestamps and its energy budget on the Summary', () => {
    const rows = table(wb.getWorksheet('Forecast')!);
    expect(rows).toHaveLength(forecast.timeH.length);
    expect((rows[1]['Time (UTC)'] as Date).toISOString()).toBe('2026-06-03T09:00:00.000Z');
    expect(rows.at(-1)!['Pool temperature (°C)']).toBeCloseTo(forecast.finalTempC, 12);
    // 1 kWh = 3.6 MJ exactly (NIST SP 811)
    expect(summary(wb.getWorksheet('Summary')!, 'Forecast: 10 L/min', 'Heater energy')).toBeCloseTo(forecast.energy.heaterJ / 3.6e6, 9);
    expect(summary(wb.getWorksheet('Summary')!, 'Forecast: 10 L/min', 'Hours to target')).toBeCloseTo(forecast.hoursToTarget as number, 12);
  });

  test('totals the build cost (2 × 48.50 + 6 × 2.25 taxed at 8 %, labour 60 untaxed: worked by hand)', () => {
    const rows = table(wb.getWorksheet('Costs')!);
    const total = rows.find((r) => r.Section === 'Build' && r.Item === 'Total')!;
    expect(total.Amount).toBe(110.5 * 1.08 + 60);
    expect(rows.find((r) => r.Item === 'Simple payback')!.Amount).toBeGreaterThan(0);
  });

  test('neutralises formula-like text in every sheet (OWASP CSV Injection)', () => {
    const t = table(wb.getWorksheet('Trials')!);
    expect(t[0].Notes).toBe('\'=HYPERLINK("http://127.0.0.1/x","open")');
    expect(t[1].Notes).toBe("'@SUM(A1)");
    expect(t[2].Notes).toBe("'-fuel added");
    expect(summary(wb.getWorksheet('Summary')!, 'Provenance', 'Rig')).toBe("'+rig with a formula-looking name");
    for (const ws of wb.worksheets) {
      ws.eachRow((row) => row.eachCell((c) => {
        expect(c.type).not.toBe(ExcelJS.ValueType.Formula);
        if (typeof c.value === 'string') expect('=+-@\t\r').not.toContain(c.value[0]);
      }));
    }
  });
});

describe('studyWorkbook, US customary', async () => {
  const wb = await readBack(await studyWorkbook(study('us')));

  // NIST SP 811 factors through analysis/units (constants above).
  test('converts trial values and headers (°F, gpm, Btu/h)', () => {
    const rows = table(wb.getWorksheet('Trials')!);
    rows.forEach((r, i) => {
      expect(r['Flow (gpm)']).toBeCloseTo(flowsLpm[i] * GPM_PER_LPM, 10);
      expect(r['Outlet temperature (°F)']).toBeCloseTo(F(outletTempC[i]), 10);
      expect(r['Temperature rise (°F)']).toBeCloseTo(1.8 * (outletTempC[i] - 20), 10);
      expect(r['Heat rate (Btu/h)']).toBeCloseTo((trials[i].heatW as number) * BTUH_PER_W, 6);
    });
  });

  test('converts coil parameters affinely and their errors and covariance by the factor', () => {
    const rows = table(wb.getWorksheet('Fit')!);
    const ts = rows[0], ua = rows[1];
    expect(ts.Unit).toBe('°F');
    expect(ts.Estimate).toBeCloseTo(F(coil.params.Ts.value), 10);
    expect(ts['CI high']).toBeCloseTo(F(coil.params.Ts.ciHigh), 10);
    expect(ts['Standard error']).toBeCloseTo(1.8 * coil.params.Ts.stdErr, 10);
    expect(ua.Unit).toBe('Btu/(h·°F)');
    // W/K → Btu/(h·°F): × (3600/1055.05585262) / 1.8
    expect(ua.Estimate).toBeCloseTo((coil.params.UA.value * BTUH_PER_W) / 1.8, 8);
    expect(ua['Covariance with Ts']).toBeCloseTo(coil.covariance[1][0] * (BTUH_PER_W / 1.8) * 1.8, 8);
    expect(ua['Correlation with Ts']).toBeCloseTo(coil.correlation[1][0], 12);
  });

  test('labels cost per degree per °F in US units (analysis/cost costPerDegree)', () => {
    const row = table(wb.getWorksheet('Costs')!).find((r) => r.Item === 'Cost per degree of the pool')!;
    expect(row.Unit).toBe('USD/°F');
  });
});

describe('fitWorkbook and studyCsv', () => {
  test('a fit workbook holds Summary, Trials, Fit, Residuals and Performance only', async () => {
    const s = study('si');
    const wb = await readBack(await fitWorkbook({ unitSystem: 'si', provenance: s.provenance, trials: s.trials, fits: s.fits, performance: s.performance }));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', 'Trials', 'Fit', 'Residuals', 'Performance']);
  });

  test('writes any table as CSV with unit-suffixed headers that papaparse reads back (DOMAIN.md §7)', () => {
    const csv = studyCsv(study('us'), 'Trials')!;
    const back = Papa.parse<Record<string, unknown>>(csv, { header: true, dynamicTyping: true, skipEmptyLines: true, comments: '#' });
    expect(back.errors).toEqual([]);
    expect(back.meta.fields).toEqual(expect.arrayContaining(['flow_gpm', 'outlet_degF', 'heat_Btu_per_h', 'ua_Btu_per_h_degF', 'timestamp_utc', 'fill1_s']));
    expect(back.data[3].flow_gpm).toBeCloseTo(8 * GPM_PER_LPM, 10);
    expect(back.data[0].notes).toBe('\'=HYPERLINK("http://127.0.0.1/x","open")');
    expect(back.data[0].ambient_degF).toBeCloseTo(F(-2.5), 12);
    expect(studyCsv({ ...study('si'), costs: undefined }, 'Costs')).toBeNull();
    const summaryLines = studyCsv(study('si'), 'Summary')!.split('\r\n');
    expect(summaryLines.find((l) => !l.startsWith('#'))).toBe('"section","key","value","unit"');
  });

  test('refuses an unknown unit system (STYLE.md §10)', () => {
    expect(() => studyCsv({ ...study('si'), unitSystem: 'metric' as 'si' }, 'Trials')).toThrow(/unitSystem must be 'si' or 'us', got "metric"/);
  });
});
