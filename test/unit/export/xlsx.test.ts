import ExcelJS from 'exceljs';
import { describe, expect, test } from 'vitest';
import { buildWorkbook, DATE_NUM_FMT, type SheetSpec } from '../../../app/_lib/exports/xlsx';

async function readBack(buf: Buffer): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(buf as unknown as ArrayBuffer);
  return wb;
}

const trials: SheetSpec = {
  name: 'Trials',
  columns: [
    { key: 'id', header: 'Trial' },
    { key: 'time', header: 'Time (UTC)' },
    { key: 'flow', header: 'Flow', unit: 'L/min', numFmt: '0.00' },
    { key: 'outlet', header: 'Outlet', unit: '°C', numFmt: '0.0' },
    { key: 'notes', header: 'Notes' },
  ],
  rows: [
    { id: 'T1', time: new Date('2026-06-01T09:30:00Z'), flow: 12.5, outlet: 48.25, notes: 'windy' },
    { id: 'T2', time: new Date('2026-06-01T09:45:00Z'), flow: -0.25, outlet: 51, notes: '=HYPERLINK("http://127.0.0.1","x")' },
    { id: '@T3', time: null, flow: 8, outlet: null, notes: 'a much longer note about the fire being stoked again before this trial' },
  ],
  notes: ['Flows measured by bucket and stopwatch.', '-not a formula'],
};

describe('buildWorkbook', () => {
  test('writes a Summary sheet first, then the sheets, with values that read back (exceljs round trip)', async () => {
    const wb = await readBack(await buildWorkbook({
      summary: [{ section: 'Provenance', key: 'Lab', value: 'Demo lab' }, { section: 'Fit', key: 'Residual SD', value: 0.31, unit: 'K', numFmt: '0.000' }],
      sheets: [trials],
    }));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', 'Trials']);
    const s = wb.getWorksheet('Summary')!;
    expect(s.getRow(1).values).toEqual([undefined, 'Section', 'Item', 'Value', 'Unit']);
    expect(s.getCell('C2').value).toBe('Demo lab');
    expect(s.getCell('C3').value).toBe(0.31);
    expect(s.getCell('C3').numFmt).toBe('0.000');
    const t = wb.getWorksheet('Trials')!;
    expect(t.getCell('C2').value).toBe(12.5);
    expect(t.getCell('D2').value).toBe(48.25);
    expect((t.getCell('B2').value as Date).toISOString()).toBe('2026-06-01T09:30:00.000Z');
    expect(t.getCell('D4').value).toBeNull();
  });

  test('puts the units in the header row and freezes it (DOMAIN.md §7; issue 7)', async () => {
    const t = (await readBack(await buildWorkbook({ sheets: [trials] }))).getWorksheet('Trials')!;
    expect(t.getRow(1).values).toEqual([undefined, 'Trial', 'Time (UTC)', 'Flow (L/min)', 'Outlet (°C)', 'Notes']);
    expect(t.getRow(1).font?.bold).toBe(true);
    expect(t.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
  });

  test('applies the number formats and a date format to timestamps (exceljs numFmt)', async () => {
    const t = (await readBack(await buildWorkbook({ sheets: [trials] }))).getWorksheet('Trials')!;
    expect(t.getCell('C2').numFmt).toBe('0.00');
    expect(t.getCell('C3').numFmt).toBe('0.00');
    expect(t.getCell('D3').numFmt).toBe('0.0');
    expect(t.getCell('B2').numFmt).toBe(DATE_NUM_FMT);
  });

  test('keeps negative numbers numbers and neutralises formula text and notes (OWASP CSV Injection)', async () => {
    const t = (await readBack(await buildWorkbook({ sheets: [trials] }))).getWorksheet('Trials')!;
    expect(t.getCell('C3').value).toBe(-0.25);
    expect(t.getCell('C3').type).toBe(ExcelJS.ValueType.Number);
    expect(t.getCell('E3').value).toBe('\'=HYPERLINK("http://127.0.0.1","x")');
    expect(t.getCell('E3').type).toBe(ExcelJS.ValueType.String);
    expect(t.getCell('A4').value).toBe("'@T3");
    // notes under the table after one empty row
    expect(t.getCell('A5').value).toBeNull();
    expect(t.getCell('A6').value).toBe('Flows measured by bucket and stopwatch.');
    expect(t.getCell('A7').value).toBe("'-not a formula");
    // no cell anywhere holds a formula
    t.eachRow((row) => row.eachCell((cell) => expect(cell.type).not.toBe(ExcelJS.ValueType.Formula)));
  });

  test('sizes columns from their content within 6–60 characters, or as given (common practice)', async () => {
    const spec: SheetSpec = { ...trials, columns: trials.columns.map((c) => (c.key === 'id' ? { ...c, width: 20 } : c)) };
    const t = (await readBack(await buildWorkbook({ sheets: [spec] }))).getWorksheet('Trials')!;
    expect(t.getColumn(1).width).toBe(20);
    expect(t.getColumn(3).width).toBe('Flow (L/min)'.length + 2);
    expect(t.getColumn(2).width).toBe(DATE_NUM_FMT.length + 2);
    // the 70-character note is clamped to the 60-character maximum
    expect(t.getColumn(5).width).toBe(60);
  });

  test('makes sheet names valid and unique for Excel (31 characters, no []:*?/\\; from memory)', async () => {
    const wb = await readBack(await buildWorkbook({
      sheets: [
        { name: 'Fit: coil/exp?', columns: [{ key: 'a', header: 'A' }], rows: [] },
        { name: 'Fit- coil-exp-', columns: [{ key: 'a', header: 'A' }], rows: [] },
        { name: 'A very long sheet name that Excel would refuse', columns: [{ key: 'a', header: 'A' }], rows: [] },
      ],
    }));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Fit- coil-exp-', 'Fit- coil-exp- (2)', 'A very long sheet name that Exc']);
  });

  test('refuses NaN, naming sheet, row and column (STYLE.md §10)', async () => {
    await expect(buildWorkbook({ sheets: [{ ...trials, rows: [{ flow: Number.NaN }] }] })).rejects.toThrow(/Trials: row 1, column flow/);
  });

  test('prints one page wide with the header row on every page, landscape only when wide (ECMA-376 pageSetup; issue 17)', async () => {
    const wide: SheetSpec = {
      name: 'Wide',
      notice: ['Caution: hot water.'],
      columns: Array.from({ length: 14 }, (_, i) => ({ key: `c${i}`, header: `Column number ${i + 1}`, numFmt: '0.000' })),
      rows: Array.from({ length: 300 }, (_, r) => Object.fromEntries(Array.from({ length: 14 }, (_, i) => [`c${i}`, r + i / 10]))),
    };
    const wb = await readBack(await buildWorkbook({ sheets: [trials, wide] }));
    const t = wb.getWorksheet('Trials')!;
    // 5 columns (Trial 6, Time 21, Flow 14, Outlet 13, Notes 60 = 114 characters): wider than a portrait page
    expect(t.pageSetup).toMatchObject({ fitToPage: true, fitToWidth: 1, fitToHeight: 0, orientation: 'landscape' });
    expect(t.pageSetup.printArea).toBe('A1:E7'); // header, 3 rows, an empty row, 2 notes
    expect(t.pageSetup.printTitlesRow).toBe('1:1');
    const w = wb.getWorksheet('Wide')!;
    expect(w.pageSetup).toMatchObject({ fitToPage: true, fitToWidth: 1, fitToHeight: 0, orientation: 'landscape' });
    expect(w.pageSetup.printArea).toBe('A1:N302'); // notice row, header, 300 rows
    expect(w.pageSetup.printTitlesRow).toBe('2:2'); // the header under the notice row
    expect(w.views[0]).toMatchObject({ state: 'frozen', ySplit: 2 });
    expect(w.headerFooter.oddFooter).toBe('&L&A&RPage &P of &N');
    // a narrow table stays portrait
    const narrow = (await readBack(await buildWorkbook({ sheets: [{ name: 'N', columns: [{ key: 'a', header: 'A' }, { key: 'b', header: 'B' }], rows: [{ a: 1, b: 2 }] }] }))).getWorksheet('N')!;
    expect(narrow.pageSetup).toMatchObject({ fitToPage: true, fitToWidth: 1, fitToHeight: 0, orientation: 'portrait' });
    expect(narrow.pageSetup.printArea).toBe('A1:B2');
  });

  test('merges and wraps notes over the table so that they print inside its width', async () => {
    const t = (await readBack(await buildWorkbook({ sheets: [trials] }))).getWorksheet('Trials')!;
    expect(t.getCell('A6').isMerged).toBe(true);
    expect(t.getCell('E6').master.address).toBe('A6');
    expect(t.getCell('A6').alignment).toMatchObject({ wrapText: true });
  });
});
