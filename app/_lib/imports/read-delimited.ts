/**
 * CSV / TSV / TXT through papaparse, as a stream of row batches with the 1-based source line of
 * each row. `openDelimited` reads only a sample to find the dialect and header, then `batches()`
 * walks the rest in bounded memory (one text chunk and one batch at a time), so a 1,000,000-row
 * logger dump never sits in memory as a whole. `readDelimited` collects everything for small files.
 *
 * Papaparse's low-level `Papa.Parser` is driven chunk by chunk here (its own Node stream wrapper
 * has no pull-based back-pressure and loses line numbers once quoted fields hold line breaks).
 */
import Papa from 'papaparse';
import { decodeText, type DecodeOptions, type TextEncoding } from './decode-text';
import {
  detectDecimal, detectDelimiter, detectNewline, findHeaderRow, splitSample,
  type DecimalSeparator, type Delimiter, type Newline,
} from './detect-dialect';
import { ImportError } from './import-error';
import { checkHeader } from './check-header';

/** How the text is laid out; each part may be forced through the options. */
export interface Dialect {
  delimiter: Delimiter;
  newline: Newline;
  decimal: DecimalSeparator;
  encoding: TextEncoding;
  bom: boolean;
}

export interface ReadDelimitedOptions extends DecodeOptions {
  delimiter?: Delimiter;
  decimal?: DecimalSeparator;
  /** 1-based line of the header row, when the guess is wrong */
  headerLine?: number;
  /** rows per yielded batch (default 8192) */
  batchSize?: number;
}

/** Rows in source order; `lines[i]` is the 1-based line where `rows[i]` starts. */
export interface RowBatch {
  rows: string[][];
  lines: number[];
}

/** A line above the header, kept for the record (operator, rig, date …). */
export interface MetadataLine {
  line: number;
  text: string;
}

/**
 * Complete rows of text in which no quote occurs, so each line is one row and its cells are the
 * line split at the delimiter (exactly what papaparse does with such text). Blank lines are left
 * in (they count as lines); every row ends with the newline except perhaps the file's last.
 */
export interface TextBlock {
  /** the rows, in pieces as they came in (each piece ends at a line break, but for the file's last row) */
  texts: string[];
  /** 1-based line of the first row */
  firstLine: number;
  /** rows in the pieces, blank ones included */
  rowCount: number;
}

/** What `blocks()` yields: rows parsed by papaparse where quoting occurs, text elsewhere. */
export type DataBlock = RowBatch | TextBlock;

export interface DelimitedSource {
  fileName?: string;
  dialect: Dialect;
  header: string[];
  headerLine: number;
  metadata: MetadataLine[];
  warnings: string[];
  /** The data rows below the header, empty lines skipped; call once (this or `blocks`). */
  batches(): AsyncGenerator<RowBatch, void, undefined>;
  /**
   * The data below the header in blocks of at most `batchSize` rows, in order: text where no
   * quote occurs (for readers that split rows themselves, much faster than a string per cell),
   * parsed rows elsewhere; call once (this or `batches`).
   */
  blocks(): AsyncGenerator<DataBlock, void, undefined>;
}

export interface DelimitedTable {
  fileName?: string;
  dialect: Dialect;
  header: string[];
  headerLine: number;
  metadata: MetadataLine[];
  warnings: string[];
  rows: string[][];
  lines: number[];
}

const SAMPLE_CHARS = 64 * 1024;

function isBlank(row: string[]): boolean {
  for (const c of row) if (c.trim() !== '') return false;
  return true;
}

/**
 * Opens delimited text: decodes, detects the dialect and the header row, and returns the header
 * with a generator of row batches.
 * @param input bytes, a string, or any async iterable of chunks (a Node Readable, a Web stream)
 * @throws ImportError `empty_file`, `binary_file`, `invalid_encoding`, `too_large`, `no_header`,
 *   `duplicate_column` — each naming the file (and line / column where there is one).
 * @example
 *   const src = await openDelimited(fs.createReadStream(p), { fileName: 'log.csv', maxBytes: 100e6 });
 *   for await (const { rows, lines } of src.batches()) { ... }
 */
export async function openDelimited(
  input: AsyncIterable<Uint8Array | string> | Uint8Array | string,
  options: ReadDelimitedOptions = {},
): Promise<DelimitedSource> {
  const file = options.fileName;
  const decoded = await decodeText(input, options);
  const textChunks = decoded.chunks;

  // Sample: at least SAMPLE_CHARS characters, or the whole text.
  let sample = '';
  let complete = false;
  while (sample.length < SAMPLE_CHARS) {
    const r = await textChunks.next();
    if (r.done) { complete = true; break; }
    sample += r.value;
  }
  if (sample.trim() === '') throw new ImportError('empty_file', 'the file holds no text (only blank lines)', { file });

  const newline = detectNewline(sample);
  const delimiter = options.delimiter ?? detectDelimiter(sample, newline, complete);
  const sampleRows = splitSample(sample, delimiter, newline, complete);
  const sampleLines = lineNumbers(sampleRows, newline);

  let headerIndex: number;
  if (options.headerLine !== undefined) {
    headerIndex = sampleLines.findIndex((l) => l === options.headerLine);
    if (headerIndex < 0) throw new ImportError('no_header', `line ${options.headerLine} is not the start of a row in the first part of the file`, { file });
  } else {
    headerIndex = findHeaderRow(sampleRows);
    if (headerIndex < 0) {
      throw new ImportError('no_header', 'no header row found: the first lines hold no row of column names above the data; add one (e.g. "time;inlet °C;outlet °C;flow L/min")', { file });
    }
  }
  const headerLine = sampleLines[headerIndex];
  const header = checkHeader(sampleRows[headerIndex], { file, line: headerLine });
  const metadata: MetadataLine[] = [];
  for (let i = 0; i < headerIndex; i++) {
    if (!isBlank(sampleRows[i])) metadata.push({ line: sampleLines[i], text: sampleRows[i].filter((c) => c.trim() !== '').join(' ') });
  }
  const decimal = options.decimal ?? detectDecimal(sampleRows.slice(headerIndex + 1, headerIndex + 201), delimiter);
  const dialect: Dialect = { delimiter, newline, decimal, encoding: decoded.encoding, bom: decoded.bom };
  const batchSize = options.batchSize ?? 8192;
  let used = false;

  async function* batches(): AsyncGenerator<RowBatch, void, undefined> {
    if (used) throw new Error('batches() of a delimited source can be read only once');
    used = true;
    for await (const b of produce(false)) yield b as RowBatch;
  }

  async function* blocks(): AsyncGenerator<DataBlock, void, undefined> {
    if (used) throw new Error('blocks() of a delimited source can be read only once');
    used = true;
    yield* produce(true);
  }

  /** With `asText`, quote-free stretches become TextBlocks; otherwise everything goes through papaparse. */
  async function* produce(asText: boolean): AsyncGenerator<DataBlock, void, undefined> {
    const parser = new Papa.Parser({ delimiter, newline, quoteChar: '"' });
    const nlChar = newline === '\r' ? '\r' : '\n';
    let line = 1; // line where the next row starts
    let rowIndex = 0; // rows seen so far (header and metadata included)
    let partial = '';
    let base = 0;
    let rows: string[][] = [];
    let lines: number[] = [];

    const take = (data: string[][], hasQuotes: boolean) => {
      for (const row of data) {
        const start = line;
        let span = 1;
        if (hasQuotes) for (const f of row) { let i = f.indexOf(nlChar); while (i >= 0) { span++; i = f.indexOf(nlChar, i + 1); } }
        line += span;
        if (rowIndex++ <= headerIndex) continue;
        if (row.length === 1 && row[0] === '') continue;
        if (isBlank(row)) continue;
        rows.push(row);
        lines.push(start);
      }
    };
    // text blocks: pieces of the block being filled, finished blocks waiting to be yielded
    const nl: string = newline;
    let acc: string[] = [];
    let accRows = 0;
    let accLine = 0;
    const ready: DataBlock[] = [];
    const flushText = () => {
      if (accRows === 0 && acc.length === 0) return;
      ready.push({ texts: acc, firstLine: accLine, rowCount: accRows });
      acc = []; accRows = 0;
    };
    /** Rows text[0, end) (complete, quote-free) as text blocks of at most batchSize rows. */
    const takeText = (text: string, end: number) => {
      let pos = 0;
      while (pos < end && rowIndex <= headerIndex) { // the header and the lines above it
        const q = text.indexOf(nl, pos);
        pos = q < 0 || q >= end ? end : q + nl.length;
        rowIndex++; line++;
      }
      if (pos < end && rows.length) while (rows.length) ready.push(cut());
      while (pos < end) {
        if (accRows === 0) accLine = line;
        const need = batchSize - accRows;
        let p = pos, count = 0;
        while (count < need) {
          const q = text.indexOf(nl, p);
          if (q < 0 || q >= end) break;
          p = q + nl.length; count++;
        }
        if (count < need && p < end) { p = end; count++; } // the file's last row, without a line break
        acc.push(text.substring(pos, p));
        accRows += count; rowIndex += count; line += count;
        pos = p;
        if (accRows >= batchSize) flushText();
      }
    };

    const feed = (text: string, last: boolean) => {
      const aggregate = partial + text;
      if (asText && aggregate.indexOf('"') < 0) {
        // no quote: papaparse would split at newlines and delimiters; hand the text on instead
        let end = aggregate.length;
        if (!last) { const q = aggregate.lastIndexOf(nl); end = q < 0 ? 0 : q + nl.length; }
        partial = aggregate.substring(end);
        base += end;
        takeText(aggregate, end);
        return;
      }
      flushText();
      const res = parser.parse(aggregate, base, !last) as { data: string[][]; meta: { cursor: number } };
      if (!last) {
        partial = aggregate.substring(res.meta.cursor - base);
        base = res.meta.cursor;
      }
      take(res.data, aggregate.indexOf('"') >= 0);
    };
    function* drain(final: boolean): Generator<DataBlock> {
      while (rows.length >= batchSize) ready.push(cut());
      if (final) { flushText(); while (rows.length > 0) ready.push(cut()); }
      while (ready.length) yield ready.shift()!;
    }

    feed(sample, complete);
    yield* drain(false);
    if (!complete) {
      for (;;) {
        const r = await textChunks.next();
        if (r.done) break;
        feed(r.value, false);
        yield* drain(false);
      }
      feed('', true);
    }
    yield* drain(true);

    function cut(): RowBatch {
      if (rows.length <= batchSize) {
        const b = { rows, lines };
        rows = []; lines = [];
        return b;
      }
      const b = { rows: rows.slice(0, batchSize), lines: lines.slice(0, batchSize) };
      rows = rows.slice(batchSize); lines = lines.slice(batchSize);
      return b;
    }
  }

  return { fileName: file, dialect, header, headerLine, metadata, warnings: [...decoded.warnings], batches, blocks };
}

/** 1-based start line of each row (quoted fields may span lines). */
function lineNumbers(rows: string[][], newline: Newline): number[] {
  const nl = newline === '\r' ? '\r' : '\n';
  const out: number[] = [];
  let line = 1;
  for (const row of rows) {
    out.push(line);
    let span = 1;
    for (const f of row) { let i = f.indexOf(nl); while (i >= 0) { span++; i = f.indexOf(nl, i + 1); } }
    line += span;
  }
  return out;
}

/**
 * Reads a whole (small) delimited file into memory: header, rows and line numbers.
 * @throws ImportError as openDelimited
 * @example const t = await readDelimited(buffer, { fileName: 'trials.csv' }); t.rows[0]
 */
export async function readDelimited(
  input: AsyncIterable<Uint8Array | string> | Uint8Array | string,
  options: ReadDelimitedOptions = {},
): Promise<DelimitedTable> {
  const src = await openDelimited(input, options);
  const rows: string[][] = [];
  const lines: number[] = [];
  for await (const b of src.batches()) {
    for (let i = 0; i < b.rows.length; i++) { rows.push(b.rows[i]); lines.push(b.lines[i]); }
  }
  const { batches: _unused, blocks: _unusedToo, ...rest } = src;
  void _unused; void _unusedToo;
  return { ...rest, rows, lines };
}
