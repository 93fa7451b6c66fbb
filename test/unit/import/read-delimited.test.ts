import { describe, expect, test } from 'vitest';
import { openDelimited, readDelimited } from '@/app/_lib/imports/read-delimited';
import { chunked, fixture, importErrorOf } from './helpers';

const enc = (s: string) => new TextEncoder().encode(s);

describe('delimited text: dialect', () => {
  test.each([
    [',', 'time,inlet,outlet\n1,15.5,30.25\n2,15.6,31\n'],
    [';', 'time;inlet;outlet\n1;15,5;30,25\n2;15,6;31\n'],
    ['\t', 'time\tinlet\toutlet\n1\t15.5\t30.25\n2\t15.6\t31\n'],
    ['|', 'time|inlet|outlet\n1|15.5|30.25\n2|15.6|31\n'],
  ])('detects the delimiter %j', async (delimiter, text) => {
    const t = await readDelimited(text);
    expect(t.dialect.delimiter).toBe(delimiter);
    expect(t.header).toEqual(['time', 'inlet', 'outlet']);
    expect(t.rows).toHaveLength(2);
  });

  test('a semicolon file with 12,5-style cells has a decimal comma; a comma file never does', async () => {
    expect((await readDelimited('a;b\n12,5;3\n1,25;4\n')).dialect.decimal).toBe(',');
    expect((await readDelimited('a;b\n12.5;3\n1.25;4\n')).dialect.decimal).toBe('.');
    expect((await readDelimited('a,b\n"12,5",3\n')).dialect.decimal).toBe('.');
  });

  test('strips a UTF-8 BOM and reads CRLF line ends', async () => {
    const t = await readDelimited(enc('\uFEFFtime,inlet\r\n1,15\r\n2,16\r\n'));
    expect(t.dialect).toMatchObject({ bom: true, newline: '\r\n', encoding: 'utf-8' });
    expect(t.header).toEqual(['time', 'inlet']);
    expect(t.rows).toEqual([['1', '15'], ['2', '16']]);
    expect(t.lines).toEqual([2, 3]);
  });

  test('reads old-Mac CR-only line ends', async () => {
    const t = await readDelimited('a,b\r1,2\r3,4\r');
    expect(t.dialect.newline).toBe('\r');
    expect(t.rows).toEqual([['1', '2'], ['3', '4']]);
  });

  test('skips empty and blank trailing lines, keeping the line numbers of the rest', async () => {
    const t = await readDelimited('a;b\n1;2\n\n3;4\n;\n\n\n');
    expect(t.rows).toEqual([['1', '2'], ['3', '4']]);
    expect(t.lines).toEqual([2, 4]);
  });

  test('a quoted field with line breaks keeps later line numbers right', async () => {
    const t = await readDelimited('time,notes\n1,"two\nlines"\n2,x\n');
    expect(t.rows[0][1]).toBe('two\nlines');
    expect(t.lines).toEqual([2, 4]);
  });

  test('finds the header below metadata lines and keeps them (LibreOffice CSV, fixtures/import/trials-metadata.csv)', async () => {
    const t = await readDelimited(fixture('trials-metadata.csv'), { fileName: 'trials-metadata.csv' });
    expect(t.headerLine).toBe(5);
    expect(t.header).toEqual(['time', 'T_in [C]', 'T_out [C]', 'flow [l/min]', 'ambient [C]', 'notes']);
    expect(t.metadata.map((m) => m.text)).toEqual(['Trial sheet — propane coil, burner at half', 'Rig: coil C (invented)', 'Date: 2026-05-06']);
    expect(t.lines[0]).toBe(6);
    expect(t.rows).toHaveLength(4);
  });

  test('reads the LibreOffice semicolon CSV with decimal commas (fixtures/import/trials-de.csv)', async () => {
    const t = await readDelimited(fixture('trials-de.csv'));
    expect(t.dialect).toMatchObject({ delimiter: ';', decimal: ',', encoding: 'utf-8' });
    expect(t.header[4]).toBe('Füllzeit 1 (s)');
    expect(t.rows[0]).toEqual(['02.05.2026 10:15', '14,2', '38,6', '10', '42,3', '41,8', '17,5', 'Holz nachgelegt']);
  });

  test('an explicit header line wins over the guess', async () => {
    const t = await readDelimited('x,y\nname,value\n1,2\n', { headerLine: 2 });
    expect(t.header).toEqual(['name', 'value']);
    expect(t.rows).toEqual([['1', '2']]);
  });
});

describe('delimited text: streaming in batches', () => {
  const rows = 25_000;
  const text = `time;T_in [C];note\r\n${Array.from({ length: rows }, (_, i) => `${i};${(15 + i / 1e4).toFixed(4).replace('.', ',')};"ü ${i}"`).join('\r\n')}\r\n`;
  const bytes = enc(text);

  test.each([1, 7, 4096, 65536])('gives the same rows and lines whatever the chunk size (%i bytes)', async (size) => {
    const src = await openDelimited(chunked(bytes, size), { batchSize: 1000 });
    let n = 0, maxBatch = 0, lastLine = 0, lastRow: string[] = [];
    for await (const b of src.batches()) {
      n += b.rows.length;
      maxBatch = Math.max(maxBatch, b.rows.length);
      expect(b.lines[0]).toBe(lastLine === 0 ? 2 : lastLine + 1);
      lastRow = b.rows[b.rows.length - 1];
      lastLine = b.lines[b.lines.length - 1];
    }
    expect(n).toBe(rows);
    expect(maxBatch).toBeLessThanOrEqual(1000);
    expect(lastLine).toBe(rows + 1);
    expect(lastRow).toEqual([String(rows - 1), '17,4999', `ü ${rows - 1}`]);
    expect(src.dialect.decimal).toBe(',');
  });

  test('refuses a second pass over the batches', async () => {
    const src = await openDelimited('a,b\n1,2\n');
    for await (const _ of src.batches()) void _;
    await expect(async () => { for await (const _ of src.batches()) void _; }).rejects.toThrow(/only once/);
  });
});

describe('delimited text: blocks (quote-free text handed on, papaparse where quotes occur)', () => {
  // metadata above the header, blank and whitespace lines, a quoted stretch with a line break inside
  const rowsOf = (n: number, from: number) => Array.from({ length: n }, (_, i) => `${from + i};${(15 + i / 1e3).toFixed(3).replace('.', ',')};ok`);
  const text = ['Rig: tank loop', '', 'time;T_in [C];note', ...rowsOf(3000, 0), '', ' ; ;', ...rowsOf(10, 3000), '3010;15,5;"two', 'lines"', '3011;15,6;"a ""quote"""', ...rowsOf(3000, 3012)].join('\r\n');
  const bytes = enc(text);

  test.each([1, 7, 4096, 65536])('give the same rows and lines as batches() whatever the chunk size (%i bytes)', async (size) => {
    const want = await openDelimited(chunked(bytes, size), { batchSize: 500 });
    const rows: string[][] = [], lines: number[] = [];
    for await (const b of want.batches()) { rows.push(...b.rows); lines.push(...b.lines); }

    const src = await openDelimited(chunked(bytes, size), { batchSize: 500 });
    expect(src.headerLine).toBe(3);
    const got: string[][] = [], gotLines: number[] = [];
    let texts = 0;
    for await (const b of src.blocks()) {
      if ('texts' in b) {
        texts++;
        expect(b.rowCount).toBeLessThanOrEqual(500);
        // each line of a text block is a row: split it as papaparse would, leaving out blank rows
        const split = b.texts.join('').split('\r\n');
        if (split[split.length - 1] === '') split.pop();
        expect(split).toHaveLength(b.rowCount);
        split.forEach((line, i) => {
          const cells = line.split(';');
          if (cells.every((c) => c.trim() === '')) return;
          got.push(cells);
          gotLines.push(b.firstLine + i);
        });
      } else {
        expect(b.rows.length).toBeLessThanOrEqual(500);
        got.push(...b.rows); gotLines.push(...b.lines);
      }
    }
    expect(texts).toBeGreaterThan(0);
    expect(got).toEqual(rows);
    expect(gotLines).toEqual(lines);
    expect(rows).toHaveLength(6012);
    expect(rows[3010]).toEqual(['3010', '15,5', 'two\r\nlines']);
    expect(rows[3011]).toEqual(['3011', '15,6', 'a "quote"']);
    expect(lines.slice(3009, 3013)).toEqual([3015, 3016, 3018, 3019]);
  });
});

describe('delimited text: bad input gets a clear message, never a crash', () => {
  test('an empty file', async () => {
    const e = await importErrorOf(() => readDelimited(new Uint8Array(0), { fileName: 'empty.csv' }));
    expect(e.code).toBe('empty_file');
    expect(e.message).toBe('empty.csv: the file is empty (0 bytes)');
  });

  test('a file of blank lines only', async () => {
    expect((await importErrorOf(() => readDelimited('\n\r\n  \n', { fileName: 'blank.csv' }))).code).toBe('empty_file');
  });

  test('an XLSX workbook renamed .csv', async () => {
    const e = await importErrorOf(() => readDelimited(fixture('trials-workbook.xlsx'), { fileName: 'trials.csv' }));
    expect(e.code).toBe('binary_file');
    expect(e.message).toMatch(/^trials\.csv: this is a zip archive \(perhaps an XLSX workbook\)/);
  });

  test('a binary file with NUL bytes names the byte', async () => {
    const bin = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]);
    const e = await importErrorOf(() => readDelimited(bin, { fileName: 'photo.csv' }));
    expect(e.code).toBe('binary_file');
    expect(e.message).toMatch(/photo\.csv: .*NUL bytes \(first at byte 9\)/);
  });

  test('a NUL byte after the first chunk is refused with its offset', async () => {
    const big = enc(`a,b\n${'1,2\n'.repeat(30_000)}`);
    const withNul = new Uint8Array(big.length + 1);
    withNul.set(big);
    withNul[big.length - 2] = 0;
    const src = await openDelimited(chunked(withNul, 65536), { fileName: 'log.csv' });
    const e = await importErrorOf(async () => { for await (const _ of src.batches()) void _; });
    expect(e.code).toBe('binary_file');
    expect(e.message).toContain(`NUL byte at byte ${big.length - 1}`);
  });

  test('invalid UTF-8 when UTF-8 is required', async () => {
    const bytes = new Uint8Array([...enc('a,b\n1,'), 0xb0, 0x43, 0x0a]);
    const e = await importErrorOf(() => readDelimited(bytes, { fileName: 'x.csv', encoding: 'utf-8' }));
    expect(e.code).toBe('invalid_encoding');
    expect(e.message).toMatch(/x\.csv: the file is not valid utf-8 text/);
  });

  test('Windows-1252 text (0xB0 = °) is read as such, with a warning (WHATWG Encoding: windows-1252 table)', async () => {
    const bytes = new Uint8Array([...enc('outlet ('), 0xb0, ...enc('C),x\n35,1\n')]);
    const t = await readDelimited(bytes);
    expect(t.dialect.encoding).toBe('windows-1252');
    expect(t.header[0]).toBe('outlet (°C)');
    expect(t.warnings[0]).toMatch(/Windows-1252/);
  });

  test('UTF-16LE with a BOM (the "Unicode text" export of spreadsheet programs, common practice)', async () => {
    const s = 'time\tinlet\r\n1\t15\r\n';
    const u16 = new Uint8Array(2 + s.length * 2);
    u16[0] = 0xff; u16[1] = 0xfe;
    for (let i = 0; i < s.length; i++) { u16[2 + 2 * i] = s.charCodeAt(i); u16[3 + 2 * i] = 0; }
    const t = await readDelimited(u16);
    expect(t.dialect).toMatchObject({ encoding: 'utf-16le', delimiter: '\t' });
    expect(t.rows).toEqual([['1', '15']]);
  });

  test('a file over the size limit stops reading at the limit', async () => {
    let pulled = 0;
    async function* source() {
      yield enc('a,b,c\n');
      for (let i = 0; i < 1000; i++) { pulled++; yield enc('1,2,3\n'.repeat(1000)); }
    }
    const e = await importErrorOf(async () => {
      const src = await openDelimited(source(), { fileName: 'big.csv', maxBytes: 100_000 });
      for await (const _ of src.batches()) void _;
    });
    expect(e.code).toBe('too_large');
    expect(e.message).toBe('big.csv: the file is larger than the limit of 100 kB; reading stopped there');
    expect(pulled).toBeLessThan(30);
  });

  test('duplicate column names, with both positions', async () => {
    const e = await importErrorOf(() => readDelimited('time;inlet;Inlet\n1;2;3\n', { fileName: 'd.csv' }));
    expect(e.code).toBe('duplicate_column');
    expect(e.message).toBe('d.csv, line 1, column "Inlet": the column name "Inlet" appears twice (columns B and C); rename one so each column can be mapped');
  });

  test('no header row at all', async () => {
    const e = await importErrorOf(() => readDelimited('1,2,3\n4,5,6\n', { fileName: 'n.csv' }));
    expect(e.code).toBe('no_header');
    expect(e.message).toMatch(/^n\.csv: no header row found/);
  });

  test('an empty header cell inside the header is named by its column letter', async () => {
    const t = await readDelimited('time,,outlet,notes\n1,2,3,x\n');
    expect(t.header).toEqual(['time', 'column B', 'outlet', 'notes']);
  });
});
