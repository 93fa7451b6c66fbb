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
}

function csvCell(value: ReturnType<typeof neutraliseCell>): string | number | boolean | null {
  // ISO 8601 in UTC (common practice for data exchange; DOMAIN.md §7)
  return value instanceof Date ? value.toISOString() : value;
}

/**
 * A table as CSV through papaparse `unparse`: one header row with the units in the names
 * (`flow_L_per_min`, `outlet_degC`), '.' as the decimal separator (JavaScript number text),
 * ISO 8601 UTC timestamps, and every text cell neutralised against formula injection and quoted
 * (OWASP "CSV Injection"; see cells.ts). Numbers are never quoted, so they stay numbers.
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
  return options.bom ? `\uFEFF${csv}` : csv;
}
