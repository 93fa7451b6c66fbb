import Papa from 'papaparse';
import { neutraliseCell } from './cells';
import { csvHeader, type ExportColumn, type ExportRow } from './columns';

/** CSV options. */
export interface CsvOptions {
  /** field delimiter: ',' (default) or ';' for locales whose spreadsheets expect it */
  delimiter?: ',' | ';';
  /** line ending (default '\r\n', RFC 4180) */
  newline?: '\r\n' | '\n';
  /** put a UTF-8 byte-order mark first, so that spreadsheets read "°" correctly (default false) */
  bom?: boolean;
  /**
   * lines written before the header, each as a comment starting with "# " (the safety notice,
   * the cautions and notes of the table); line breaks inside a line become spaces
   */
  comments?: readonly string[];
}

function csvCell(value: ReturnType<typeof neutraliseCell>): string | number | boolean | null {
  // ISO 8601 in UTC (common practice for data exchange; DOMAIN.md §7)
  return value instanceof Date ? value.toISOString() : value;
}

/**
 * A table as CSV through papaparse `unparse`: one header row with the units in the names
 * (`flow_L_per_min`, `outlet_degC`), '.' as the decimal separator (JavaScript number text),
 * ISO 8601 UTC timestamps, and every text cell neutralised against formula injection and quoted
 * (OWASP "CSV Injection"; see cells.ts). Numbers are never quoted, so they stay numbers. Comment
 * lines ("# …", the safety notice) go first; a comment starts with "#", so no spreadsheet reads it
 * as a formula, and our trial-sheet import keeps such lines above the header as notes.
 * @param columns the columns, in order
 * @param rows the rows; missing keys give empty cells
 * @throws TypeError naming the row and column for NaN, Infinity, an invalid date or an object.
 * @example toCsv([{ key: 'flow', header: 'Flow', unit: 'L/min' }], [{ flow: 12.5 }]) // 'flow_L_per_min\r\n12.5'
 */
export function toCsv(columns: readonly ExportColumn[], rows: readonly ExportRow[], options: CsvOptions = {}): string {
  const fields = columns.map((c) => neutraliseCell(csvHeader(c), `header of ${c.key}`) as string);
  const data = rows.map((row, i) => columns.map((c) => csvCell(neutraliseCell(row[c.key], `row ${i + 1}, column ${c.key}`))));
  const csv = Papa.unparse(
    { fields, data },
    {
      delimiter: options.delimiter ?? ',',
      newline: options.newline ?? '\r\n',
      // OWASP: wrap text fields in double quotes (papaparse doubles any quote inside)
      quotes: (value: unknown) => typeof value === 'string',
      header: true,
    },
  );
  const nl = options.newline ?? '\r\n';
  // one cell per comment line in a spreadsheet: the delimiter inside the text is swapped for the
  // other one, so no part of a comment becomes a cell of its own (which could start with "=")
  const other = (options.delimiter ?? ',') === ',' ? ';' : ',';
  const head = (options.comments ?? []).map((c) => `# ${c.replace(/[\r\n\t]+/g, ' ').split(options.delimiter ?? ',').join(other)}${nl}`).join('');
  return options.bom ? `\uFEFF${head}${csv}` : head + csv;
}
