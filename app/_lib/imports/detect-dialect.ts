/**
 * Delimiter, line ending, decimal separator and header row of a delimited text, guessed from its
 * first lines. Papaparse does the splitting (its own delimiter guess looks at the first rows only
 * and is thrown off by metadata lines above the header, so the candidates are scored here on the
 * rows below them instead).
 */
import Papa from 'papaparse';
import { looksNumeric } from './read-number';

export type Delimiter = ',' | ';' | '\t' | '|';
export type Newline = '\r\n' | '\n' | '\r';
export type DecimalSeparator = '.' | ',';

export const DELIMITERS: readonly Delimiter[] = [',', ';', '\t', '|'];

/** The line ending used first in `text` (LF when there is none). */
export function detectNewline(text: string): Newline {
  const lf = text.indexOf('\n');
  const cr = text.indexOf('\r');
  if (lf < 0 && cr < 0) return '\n';
  if (lf < 0) return '\r';
  if (cr >= 0 && cr === lf - 1) return '\r\n';
  if (cr >= 0 && cr < lf) return '\r';
  return '\n';
}

/** Rows of `sample` split by papaparse with one delimiter (the sample's last, maybe cut, line dropped unless complete). */
export function splitSample(sample: string, delimiter: Delimiter, newline: Newline, complete: boolean): string[][] {
  const parser = new Papa.Parser({ delimiter, newline, quoteChar: '"' });
  const res = parser.parse(sample, 0, !complete) as { data: string[][] };
  return res.data;
}

function nonEmpty(row: string[]): number {
  let n = 0;
  for (const c of row) if (c.trim() !== '') n++;
  return n;
}

/**
 * Scores each delimiter by how consistently the lower half of the sample splits into the same
 * number (> 1) of fields, and returns the best.
 * @example detectDelimiter('a;b\n1;2\n3;4\n', '\n', true) // ';'
 */
export function detectDelimiter(sample: string, newline: Newline, complete: boolean): Delimiter {
  let best: Delimiter = ',';
  let bestScore = -1;
  for (const d of DELIMITERS) {
    const rows = splitSample(sample, d, newline, complete).filter((r) => nonEmpty(r) > 0);
    if (rows.length === 0) continue;
    const tail = rows.slice(Math.floor(rows.length / 2));
    const counts = new Map<number, number>();
    for (const r of tail) counts.set(r.length, (counts.get(r.length) ?? 0) + 1);
    let mode = 1, modeN = 0;
    for (const [k, n] of counts) if (n > modeN || (n === modeN && k > mode)) { mode = k; modeN = n; }
    if (mode < 2) continue;
    // consistency of the lower half first (metadata lines sit above), then of all rows, then width
    const all = rows.filter((r) => r.length === mode).length / rows.length;
    const score = (modeN / tail.length) * 1000 + all * 100 + Math.min(mode, 50);
    if (score > bestScore) { bestScore = score; best = d; }
  }
  return best;
}

/**
 * Finds the header row: the first row with at least two non-empty cells, mostly non-numeric,
 * that names every column the rows below it fill. Metadata lines above it ("Rig: coil A",
 * "Date;2026-05-02;;") do not cover the data columns and are passed over.
 * @returns the 0-based index into `rows`, or -1 when no row qualifies
 */
export function findHeaderRow(rows: string[][], maxScan = 60): number {
  const n = Math.min(rows.length, maxScan);
  for (let r = 0; r < n; r++) {
    const row = rows[r];
    const filled = nonEmpty(row);
    if (filled < 2) continue;
    let numeric = 0;
    for (const c of row) if (c.trim() !== '' && looksNumeric(c.trim())) numeric++;
    if (numeric * 2 > filled) continue;
    // columns that most of the following rows fill must all be named
    const below = rows.slice(r + 1, r + 11).filter((x) => nonEmpty(x) > 0);
    if (below.length === 0) return r;
    const width = Math.max(...below.map((x) => x.length));
    // a metadata line ("Date;2026-05-02;;") leaves data columns unnamed; a header may miss one
    // name if it names at least three quarters of the columns
    let unnamed = 0;
    for (let c = 0; c < width; c++) {
      let used = 0;
      for (const b of below) if ((b[c] ?? '').trim() !== '') used++;
      if (used * 2 > below.length && (row[c] ?? '').trim() === '') unnamed++;
    }
    if (unnamed === 0 || (unnamed === 1 && filled >= 3 && filled >= 0.75 * width)) return r;
  }
  return -1;
}

/**
 * Decimal comma or point, from the numeric-looking cells of data rows: a comma is chosen when
 * cells like `12,5` outnumber cells like `12.5` (never when the comma is the delimiter).
 */
export function detectDecimal(rows: string[][], delimiter: Delimiter): DecimalSeparator {
  if (delimiter === ',') return '.';
  let comma = 0, point = 0;
  for (const r of rows) {
    for (const raw of r) {
      const c = raw.trim();
      if (/^[+-]?\d{1,3}(\.\d{3})+,\d+$/.test(c) || /^[+-]?\d*,\d+$/.test(c)) comma++;
      else if (/^[+-]?\d*\.\d+$/.test(c) && !/^[+-]?\d{1,3}\.\d{3}$/.test(c)) point++;
      else if (/^[+-]?\d*,\d+\s*\S+$/.test(c)) comma++; // "12,5 °C"
    }
  }
  return comma > point ? ',' : '.';
}
