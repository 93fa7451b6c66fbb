/**
 * The fast path of the sensor-log reader against the general path it stands in for: it must take
 * only rows the general path (papaparse's split, the row mapper, readNumber, readDate and the zod
 * sample schema) takes, with bit-identical numbers, and leave every other row to the general path
 * so that what is rejected, and the message, stay the same. Checked on seeded random logs full of
 * the cells people and loggers write (common practice: differential testing against the reference
 * implementation), plus the numeric fact behind it: m / 10^k is the correctly rounded value of a
 * decimal with at most 15 digits (W. D. Clinger, "How to read floating point numbers accurately",
 * PLDI 1990, the "fast path"), which is what `Number()` returns (ECMAScript, Number::toString /
 * StringToNumber, round to nearest).
 */
import { describe, expect, test } from 'vitest';
import { FastDateTime, fastDecimal } from '@/app/_lib/imports/fast-row';
import { openDelimited, type DataBlock } from '@/app/_lib/imports/read-delimited';
import { readDate } from '@/app/_lib/imports/read-date';
import { createSensorLogBuilder, type SensorLog } from '@/app/_lib/imports/sensor-log';
import { mulberry32 } from '@/analysis/segment/synthetic-log';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import { chunked } from './helpers';

const DOT = 46, COMMA = 44;

describe('fast numbers', () => {
  test('take exactly the plain decimals of at most 15 digits, and give what Number() gives, bit for bit', () => {
    const rnd = mulberry32(11);
    const digits = (n: number) => Array.from({ length: n }, () => String(Math.floor(rnd() * 10))).join('');
    let taken = 0;
    for (let k = 0; k < 20_000; k++) {
      const int = digits(1 + Math.floor(rnd() * 9)), frac = digits(Math.floor(rnd() * 9));
      const text = `${rnd() < 0.3 ? '-' : ''}${int}${frac ? `.${frac}` : ''}`;
      const v = fastDecimal(text, 0, text.length, DOT);
      if (int.length + frac.length > 15) { expect(v).toBeNaN(); continue; }
      taken++;
      expect(Object.is(v, Number(text)), text).toBe(true);
    }
    expect(taken).toBeGreaterThan(15_000);
  });

  test.each([
    ['0', 0], ['-0', -0], ['007', 7], ['12.50', 12.5], ['999999999999999', 999999999999999], ['0.00000000000001', 1e-14],
    ['0.1', 0.1], ['-273.15', -273.15],
  ])('%s reads as %d', (text, want) => {
    expect(Object.is(fastDecimal(text, 0, text.length, DOT), want)).toBe(true);
    expect(Object.is(fastDecimal(text, 0, text.length, DOT), Number(text))).toBe(true);
  });

  test.each(['', '-', '1.', '.5', '+5', '1e3', ' 1', '1 ', '1,5', '1.2.3', '9999999999999999', '0.1234567890123456', '12 °C', 'n/a'])(
    '"%s" is left to the general path', (text) => {
      expect(fastDecimal(text, 0, text.length, DOT)).toBeNaN();
    });

  test('a decimal comma is read as the decimal separator when the file uses it', () => {
    expect(fastDecimal('12,5', 0, 4, COMMA)).toBe(12.5);
    expect(fastDecimal('12.5', 0, 4, COMMA)).toBeNaN();
  });
});

describe('fast date-times', () => {
  test('agree with readDate on every ISO date-time they take, and take none it refuses', () => {
    const rnd = mulberry32(5);
    const two = (n: number) => String(n).padStart(2, '0');
    for (const offset of [0, 120, -300]) {
      const fast = new FastDateTime(offset);
      let taken = 0;
      for (let k = 0; k < 5000; k++) {
        const y = 1990 + Math.floor(rnd() * 60), mo = Math.floor(rnd() * 14), d = Math.floor(rnd() * 33);
        const h = Math.floor(rnd() * 26), mi = Math.floor(rnd() * 61), s = Math.floor(rnd() * 61);
        const frac = rnd() < 0.3 ? `.${String(Math.floor(rnd() * 1e6)).slice(0, 1 + Math.floor(rnd() * 6))}` : '';
        const text = `${y}-${two(mo)}-${two(d)}${rnd() < 0.5 ? ' ' : 'T'}${two(h)}:${two(mi)}:${two(s)}${frac}${rnd() < 0.3 ? 'Z' : ''}`;
        const general = readDate(text, { utcOffsetMinutes: offset });
        const v = fast.read(text, 0, text.length);
        if (Number.isNaN(v)) { expect(general.ok, text).toBe(false); continue; }
        taken++;
        expect(general.ok, text).toBe(true);
        if (general.ok) expect(Object.is(v, general.epochS), text).toBe(true);
      }
      expect(taken).toBeGreaterThan(1000);
    }
  });

  test.each(['2026-6-01 08:00:01', '2026-06-01 8:00:01', '2026-06-01', '08:00:01', '01.06.2026 08:00:01', '2026-06-01 08:00:01 ', '2026-06-01 08:00:01+02:00', '2026-06-01 08:00:01z', '2026-06-01 08:00:01.1234567891', '2026-02-29 08:00:00'])(
    '"%s" is left to the general path', (text) => {
      expect(new FastDateTime(0).read(text, 0, text.length)).toBeNaN();
    });

  test('2026-06-01 08:00:01 is 1780300801 s after the Unix epoch (from memory: 2026-06-01T00:00Z = 1780272000)', () => {
    expect(new FastDateTime(0).read('2026-06-01 08:00:01', 0, 19)).toBe(1780300801);
    expect(new FastDateTime(60).read('2026-06-01 08:00:01', 0, 19)).toBe(1780300801 - 3600);
  });
});

// ---------------------------------------------------------------------------------------------
// Whole logs through both paths

interface Dialect { delimiter: ',' | ';'; decimal: '.' | ','; eol: '\n' | '\r\n' }

/** A cell as loggers and people write it: mostly plain, often not. */
function numberCell(rnd: () => number, x: number, d: Dialect): string {
  const r = rnd();
  const plain = x.toFixed(Math.floor(rnd() * 5));
  const dec = (s: string) => (d.decimal === ',' ? s.replace('.', ',') : s);
  if (r < 0.9) return dec(plain);
  const odd = [
    '', ' ', 'n/a', '-', `${dec(plain)} `, ` ${dec(plain)}`, `+${dec(plain)}`, `${dec(plain)}.`, '1e3', '-0', '007',
    dec('12345678901234.56'), dec('0.12345678901234567'), '-300', dec('-273.15'), dec('-273.16'), `${dec(plain)} °F`, `${dec(plain)}°C`,
    `${dec(plain)} K`, `${dec(plain)} L/min`, `${dec(plain)} gpm`, d.decimal === ',' ? '1.234,5' : '1,234.5', d.decimal === ',' ? '12.5' : '12,5', '.5', '∞',
  ];
  return odd[Math.floor(rnd() * odd.length)];
}

/** `epochS` as the logger writes it; wall-clock times are in the zone `offsetMin` east of UTC. */
function timeCell(rnd: () => number, epochS: number, kind: 'datetime' | 'elapsed', d: Dialect, offsetMin: number): string {
  if (kind === 'elapsed') return rnd() < 0.9 ? (d.decimal === ',' ? String(epochS).replace('.', ',') : String(epochS)) : ['', 'x', '1e2', ` ${epochS}`][Math.floor(rnd() * 4)];
  const iso = new Date(Math.round(epochS * 1000)).toISOString(); // 2026-06-01T08:00:01.500Z
  const wall = new Date(Math.round((epochS + offsetMin * 60) * 1000)).toISOString().slice(0, 19).replace('T', ' ');
  const r = rnd();
  if (r < 0.9) return wall;
  const odd = [
    `${iso.slice(0, 19)}Z`, iso, `${wall}.25`, wall.replace(' ', 'T'), `${wall} `, '', `${wall}+05:00`,
    `${iso.slice(8, 10)}.${iso.slice(5, 7)}.${iso.slice(0, 4)} ${wall.slice(11)}`, '2026-02-30 10:00:00', '2026-06-01 24:00:00', wall.replace('-0', '-'),
    '2026-06-01 07:00:00', iso.slice(0, 10),
  ];
  return odd[Math.floor(rnd() * odd.length)];
}

function makeLog(seed: number, rows: number, d: Dialect, kind: 'datetime' | 'elapsed', ambient: boolean, offsetMin = 0): string {
  const rnd = mulberry32(seed);
  const header = ['time', 'in', 'out', 'flow', ...(ambient ? ['amb'] : []), 'status'];
  const lines = [header.join(d.delimiter)];
  let t = kind === 'datetime' ? Date.UTC(2026, 5, 1, 8) / 1000 : 0;
  for (let i = 0; i < rows; i++) {
    t += rnd() < 0.05 ? -1 : rnd() < 0.1 ? 0.5 : 1;
    // the first row's time is plain: it sets the log's time origin (a clock time there would refuse every dated row)
    const cells = [
      i === 0 ? timeCell(() => 0, t, kind, d, offsetMin) : timeCell(rnd, t, kind, d, offsetMin), numberCell(rnd, 14 + rnd(), d), numberCell(rnd, 38 + rnd(), d), numberCell(rnd, 9 + 6 * rnd(), d),
      ...(ambient ? [numberCell(rnd, 19 + rnd(), d)] : []), 'ok',
    ];
    const r = i === 0 ? 1 : rnd();
    if (r < 0.01) lines.push('');
    else if (r < 0.02) lines.push(d.delimiter.repeat(cells.length - 1));
    else if (r < 0.03) lines.push(cells.slice(0, 3).join(d.delimiter));
    else if (r < 0.04) lines.push([...cells, 'extra'].join(d.delimiter));
    else if (r < 0.05) lines.push([...cells, ' '].join(d.delimiter));
    else lines.push(cells.join(d.delimiter));
  }
  return lines.join(d.eol) + (rnd() < 0.5 ? d.eol : '');
}

function mappingFor(d: Dialect, kind: 'datetime' | 'elapsed', ambient: boolean, offset: number): ConfirmedMappingInput {
  return {
    shape: 'sensorLog',
    decimal: d.decimal,
    utcOffsetMinutes: offset,
    columns: [
      { column: 0, header: 'time', field: 'time', unit: kind === 'datetime' ? 'datetime' : 'min' },
      { column: 1, header: 'in', field: 'inletTemp', unit: 'degC' },
      { column: 2, header: 'out', field: 'outletTemp', unit: 'degF' },
      { column: 3, header: 'flow', field: 'flow', unit: 'L/min' },
      ...(ambient ? [{ column: 4, header: 'amb', field: 'ambientTemp' as const, unit: 'K' as const }] : []),
    ],
  };
}

async function readLog(text: string, mapping: ConfirmedMappingInput, opts: { fastPath: boolean; blocks: boolean; chunk: number; excluded?: number[] }): Promise<{ log: SensorLog; fastBlocks: number }> {
  const src = await openDelimited(chunked(new TextEncoder().encode(text), opts.chunk), { batchSize: 97 });
  const b = createSensorLogBuilder(mapping, src.header, { file: 'log.csv' }, {
    maxIssues: 100_000, text: src.dialect, fastPath: opts.fastPath, excludedLines: new Set(opts.excluded ?? []),
  });
  let fastBlocks = 0;
  const it: AsyncIterable<DataBlock> = opts.blocks ? src.blocks() : src.batches();
  for await (const block of it) { if ('texts' in block) fastBlocks++; b.add(block); }
  return { log: b.finish(), fastBlocks };
}

/** Equal, with NaN = NaN and −0 ≠ +0, arrays compared element by element. */
function sameLog(a: SensorLog, b: SensorLog) {
  const arr = (x: ArrayLike<number> | null) => (x ? Array.from(x, (v) => (Object.is(v, -0) ? '-0' : Number.isNaN(v) ? 'NaN' : v)) : null);
  const plain = (l: SensorLog) => ({
    ...l, timeS: arr(l.timeS), inletTempC: arr(l.inletTempC), outletTempC: arr(l.outletTempC), flowM3PerS: arr(l.flowM3PerS),
    ambientTempC: arr(l.ambientTempC), lines: arr(l.lines),
  });
  expect(plain(a)).toEqual(plain(b));
}

describe('a log read through the fast path is the log read through the general path', () => {
  const cases: [string, Dialect, 'datetime' | 'elapsed', boolean, number][] = [
    ['comma, point, LF, dates, ambient', { delimiter: ',', decimal: '.', eol: '\n' }, 'datetime', true, 0],
    ['semicolon, decimal comma, CRLF, dates in UTC+2', { delimiter: ';', decimal: ',', eol: '\r\n' }, 'datetime', false, 120],
    ['semicolon, point, LF, elapsed minutes', { delimiter: ';', decimal: '.', eol: '\n' }, 'elapsed', true, 0],
  ];
  test.each(cases)('%s', async (_name, d, kind, ambient, offset) => {
    for (let seed = 1; seed <= 4; seed++) {
      const text = makeLog(seed * 101, 1500, d, kind, ambient, offset);
      const mapping = mappingFor(d, kind, ambient, offset);
      const excluded = [7, 50, 51, 800];
      const general = await readLog(text, mapping, { fastPath: false, blocks: false, chunk: 65536, excluded });
      const fast = await readLog(text, mapping, { fastPath: true, blocks: true, chunk: 1000, excluded });
      const generalBlocks = await readLog(text, mapping, { fastPath: false, blocks: true, chunk: 4096, excluded });
      expect(fast.fastBlocks).toBeGreaterThan(0);
      // the logs are rough on purpose: plenty of rows on both sides of the line
      expect(general.log.n).toBeGreaterThan(300);
      expect(general.log.rejectedCount).toBeGreaterThan(100);
      sameLog(fast.log, general.log);
      sameLog(generalBlocks.log, general.log);
    }
  });

  test('quoted fields switch that stretch of the file to papaparse, and the result stays the same', async () => {
    const d: Dialect = { delimiter: ',', decimal: '.', eol: '\n' };
    const rows = makeLog(77, 3000, d, 'datetime', true).split('\n');
    rows[1500] = `${rows[1500]},"a note, with a comma"`.replace(',ok,', ',"ok\nstill the note",'); // a quoted line break too
    rows[1501] = rows[1501].replace(',ok', ',"ok"');
    const text = rows.join('\n');
    const mapping = mappingFor(d, 'datetime', true, 0);
    for (const chunk of [1, 777, 65536]) {
      const general = await readLog(text, mapping, { fastPath: false, blocks: false, chunk });
      const fast = await readLog(text, mapping, { fastPath: true, blocks: true, chunk });
      sameLog(fast.log, general.log);
    }
  });
});
