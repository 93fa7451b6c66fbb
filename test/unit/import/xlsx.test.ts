import ExcelJS from 'exceljs';
import { deflateRawSync } from 'node:zlib';
import { describe, expect, test } from 'vitest';
import { listSheets, readXlsxSheet } from '@/app/_lib/imports/read-xlsx';
import { checkZip, listZipEntries } from '@/app/_lib/imports/zip-guard';
import { importTrialSheet } from '@/app/_lib/imports/import-trial-sheet';
import { fixture, importErrorOf } from './helpers';

interface FakeEntry { name: string; data: Buffer; declaredSize?: number }

/**
 * A minimal zip archive (PKWARE APPNOTE 6.3.x §4.3: local headers, central directory, end record),
 * deflated with zlib; CRCs are left 0 because the guard does not read them. `declaredSize` lets
 * an entry lie about its uncompressed size.
 */
function makeZip(entries: FakeEntry[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const e of entries) {
    const comp = deflateRawSync(e.data);
    const name = Buffer.from(e.name, 'utf8');
    const size = e.declaredSize ?? e.data.length;
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0); local.writeUInt16LE(20, 4); local.writeUInt16LE(8, 8);
    local.writeUInt32LE(comp.length, 18); local.writeUInt32LE(size, 22); local.writeUInt16LE(name.length, 26);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0); central.writeUInt16LE(20, 4); central.writeUInt16LE(20, 6); central.writeUInt16LE(8, 10);
    central.writeUInt32LE(comp.length, 20); central.writeUInt32LE(size, 24); central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    locals.push(local, name, comp);
    centrals.push(central, name);
    offset += 30 + name.length + comp.length;
  }
  const cd = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0); end.writeUInt16LE(entries.length, 8); end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(cd.length, 12); end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, cd, end]);
}

async function workbook(build: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  build(wb);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

describe('XLSX saved by LibreOffice (fixtures/import/trials-workbook.xlsx)', () => {
  const buf = fixture('trials-workbook.xlsx');

  test('lists its three sheets', async () => {
    expect((await listSheets(buf)).map((s) => [s.name, s.index, s.rowCount, s.hidden])).toEqual([
      ['Rig', 1, 3, false], ['Trials', 2, 6, false], ['Ambient', 3, 4, false],
    ]);
  });

  test('reads the picked sheet: date cells as ISO text, numbers as numbers', async () => {
    const t = await readXlsxSheet(buf, 'Trials', { fileName: 'trials-workbook.xlsx' });
    expect(t.header).toEqual(['time', 'inlet (°C)', 'outlet (°C)', 'bucket (L)', 'fill 1 (s)', 'fill 2 (s)', 'fill 3 (s)', 'flow (L/min)', 'notes']);
    expect(t.lines).toEqual([2, 3, 4, 5, 6]);
    expect(t.rows[0].slice(0, 7)).toEqual(['2026-05-04T09:30:00', 16.1, 41.2, 18.93, 74.6, 75.3, 75.1]);
  });

  test('formula cells give their saved result, with a warning naming each cell', async () => {
    const t = await readXlsxSheet(buf, 'Trials');
    // the formula is V / mean(t) · 60: 18.93 L / 75.0 s · 60 = 15.144 L/min (DOMAIN.md §2.5 worked example)
    expect(t.rows[0][7]).toBeCloseTo(15.144, 10);
    expect(t.cellWarnings.map((w) => w.cell)).toEqual(['H2', 'H3', 'H4', 'H5', 'H6']);
    expect(t.cellWarnings[0]).toEqual({ sheet: 'Trials', cell: 'H2', line: 2, message: 'cell H2 holds the formula =D2/AVERAGE(E2:G2)*60; its saved result 15.144 was used' });
  });

  test('mapped, the flow readings from the formula agree with the bucket flow (no warning)', async () => {
    const t = await readXlsxSheet(buf, 'Trials');
    const r = importTrialSheet(t, {
      shape: 'trialSheet',
      columns: [
        { column: 0, header: 'time', field: 'time', unit: 'datetime' },
        { column: 1, header: 'inlet (°C)', field: 'inletTemp', unit: 'degC' },
        { column: 2, header: 'outlet (°C)', field: 'outletTemp', unit: 'degC' },
        { column: 3, header: 'bucket (L)', field: 'bucketVolume', unit: 'L' },
        { column: 4, header: 'fill 1 (s)', field: 'fillTime', unit: 's' },
        { column: 5, header: 'fill 2 (s)', field: 'fillTime', unit: 's' },
        { column: 6, header: 'fill 3 (s)', field: 'fillTime', unit: 's' },
        { column: 7, header: 'flow (L/min)', field: 'flow', unit: 'L/min' },
        { column: 8, header: 'notes', field: 'notes' },
      ],
    });
    expect(r).toMatchObject({ okCount: 5, errorCount: 0, warningCount: 0 });
    const first = r.rows[0];
    expect(first.ok && first.row.time).toEqual({ kind: 'datetime', iso: '2026-05-04T09:30:00', epochS: Date.UTC(2026, 4, 4, 9, 30) / 1000 });
  });

  test('without a sheet name the first visible sheet is read', async () => {
    expect((await readXlsxSheet(buf)).sheet).toBe('Rig');
  });

  test('an unknown sheet is refused with the names there are', async () => {
    const e = await importErrorOf(() => readXlsxSheet(buf, 'Trails', { fileName: 'w.xlsx' }));
    expect(e.code).toBe('no_such_sheet');
    expect(e.message).toBe('w.xlsx: the workbook has no sheet "Trails" (it has "Rig", "Trials", "Ambient")');
  });
});

describe('XLSX: bad input', () => {
  test('an empty file', async () => {
    expect((await importErrorOf(() => listSheets(new Uint8Array(0), { fileName: 'e.xlsx' }))).message).toBe('e.xlsx: the file is empty (0 bytes)');
  });

  test('a file over the byte limit is refused before it is unpacked', async () => {
    const e = await importErrorOf(() => listSheets(fixture('trials-workbook.xlsx'), { fileName: 'w.xlsx', maxBytes: 1000 }));
    expect(e.code).toBe('too_large');
    expect(e.message).toBe('w.xlsx: the file is larger than the limit of 1 kB');
  });

  test('a CSV named .xlsx', async () => {
    const e = await importErrorOf(() => listSheets(fixture('trials-de.csv'), { fileName: 'trials.xlsx' }));
    expect(e.code).toBe('not_xlsx');
    expect(e.message).toMatch(/^trials\.xlsx: this is not an XLSX workbook/);
  });

  test('a zip that is not a workbook', async () => {
    const e = await importErrorOf(() => listSheets(makeZip([{ name: 'readme.txt', data: Buffer.from('hello') }]), { fileName: 'z.xlsx' }));
    expect(e.code).toBe('not_xlsx');
    expect(e.message).toBe('z.xlsx: this zip archive holds no workbook (xl/workbook.xml is missing); save the file again as .xlsx');
  });

  test('a zip bomb by total size is refused before anything is inflated', async () => {
    const zeros = Buffer.alloc(3_000_000);
    const bomb = makeZip([{ name: '[Content_Types].xml', data: Buffer.from('<Types/>') }, { name: 'xl/worksheets/sheet1.xml', data: zeros }]);
    expect(bomb.length).toBeLessThan(10_000);
    const e = await importErrorOf(() => listSheets(bomb, { fileName: 'bomb.xlsx', zipLimits: { maxUncompressedBytes: 1e6, maxRatio: 1e9, maxEntries: 100 } }));
    expect(e.code).toBe('zip_bomb');
    expect(e.message).toBe('bomb.xlsx: refused as a possible zip bomb: it unpacks to more than 1 MB (at part "xl/worksheets/sheet1.xml")');
  });

  test('a zip bomb by ratio is refused with the default limits', async () => {
    const bomb = makeZip([{ name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(20_000_000) }]);
    const e = await importErrorOf(() => listSheets(bomb, { fileName: 'bomb.xlsx' }));
    expect(e.code).toBe('zip_bomb');
    expect(e.message).toMatch(/part "xl\/worksheets\/sheet1\.xml" unpacks \d+× \(limit 200×\)/);
  });

  test('an entry that lies about its size is caught while inflating, capped at what it declares', () => {
    const liar = makeZip([{ name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(5_000_000), declaredSize: 1000 }]);
    expect(listZipEntries(liar)[0]).toMatchObject({ name: 'xl/worksheets/sheet1.xml', uncompressedSize: 1000 });
    const run = () => checkZip(liar, undefined, 'liar.xlsx');
    expect(run).toThrow('liar.xlsx: refused as a possible zip bomb: part "xl/worksheets/sheet1.xml" unpacks to more than the 1000 bytes it declares');
  });

  test('too many parts', () => {
    const many = makeZip(Array.from({ length: 30 }, (_, i) => ({ name: `p${i}`, data: Buffer.from('x') })));
    expect(() => checkZip(many, { maxUncompressedBytes: 1e6, maxRatio: 200, maxEntries: 20 })).toThrow(/30 parts \(limit 20\)/);
  });

  test('duplicate and missing column names in a sheet name the sheet', async () => {
    const buf = await workbook((wb) => {
      const ws = wb.addWorksheet('Log');
      ws.addRow(['time', 'outlet', 'Outlet']);
      ws.addRow([1, 30, 31]);
    });
    const e = await importErrorOf(() => readXlsxSheet(buf, 'Log', { fileName: 'd.xlsx' }));
    expect(e.code).toBe('duplicate_column');
    expect(e.message).toBe('d.xlsx, sheet "Log", line 1, column "Outlet": the column name "Outlet" appears twice (columns B and C); rename one so each column can be mapped');
  });

  test('an empty sheet', async () => {
    const buf = await workbook((wb) => { wb.addWorksheet('Blank'); wb.addWorksheet('Data').addRow(['a', 'b']); });
    const e = await importErrorOf(() => readXlsxSheet(buf, 'Blank', { fileName: 'b.xlsx' }));
    expect(e.code).toBe('empty_file');
    expect(e.message).toBe('b.xlsx, sheet "Blank": the sheet is empty');
  });

  test('a formula without a saved result is read as empty, with a warning', async () => {
    const buf = await workbook((wb) => {
      const ws = wb.addWorksheet('S');
      ws.addRow(['inlet', 'outlet']);
      ws.addRow([15, { formula: 'A2+20' }]);
    });
    const t = await readXlsxSheet(buf, 'S');
    expect(t.rows[0]).toEqual([15, null]);
    expect(t.cellWarnings[0].message).toMatch(/^cell B2 holds the formula =A2\+20 with no saved result/);
  });

  test('a sheet over the row limit is refused, pointing to CSV', async () => {
    const buf = await workbook((wb) => {
      const ws = wb.addWorksheet('Big');
      ws.addRow(['t', 'x']);
      for (let i = 0; i < 50; i++) ws.addRow([i, i]);
    });
    const e = await importErrorOf(() => readXlsxSheet(buf, 'Big', { maxRows: 10 }));
    expect(e.code).toBe('too_large');
    expect(e.message).toMatch(/51 rows, over the limit of 10; export it as CSV instead/);
  });
});
