/**
 * (Server-side: Node APIs. The 'server-only' marker sits in ./index.ts, the entry the app imports;
 * vitest cannot resolve it in leaf files until its alias in vitest.config.mts points at a file path.)
 *
 * XLSX workbooks through exceljs: list the sheets, pick one, read its rows as cells (numbers,
 * text, dates as ISO text), find the header row below any metadata lines. Formula cells give
 * their saved result, with a warning naming the cell. The zip guard runs first (see zip-guard.ts).
 */
import ExcelJS from 'exceljs';
import { checkHeader, columnLetter } from './check-header';
import { findHeaderRow } from './detect-dialect';
import { ImportError } from './import-error';
import { formatBytes } from './decode-text';
import { checkZip, DEFAULT_ZIP_LIMITS, type ZipLimits } from './zip-guard';
import type { CellValue } from './apply-mapping';
import type { MetadataLine } from './read-delimited';

export interface SheetInfo {
  name: string;
  /** 1-based position in the workbook */
  index: number;
  rowCount: number;
  columnCount: number;
  hidden: boolean;
}

/** A note about one cell (formulas, errors). */
export interface CellWarning {
  sheet: string;
  cell: string;
  line: number;
  message: string;
}

export interface XlsxTable {
  fileName?: string;
  sheet: string;
  header: string[];
  /** sheet row number of the header */
  headerLine: number;
  metadata: MetadataLine[];
  rows: CellValue[][];
  /** sheet row number of each row */
  lines: number[];
  cellWarnings: CellWarning[];
}

export interface XlsxOptions {
  fileName?: string;
  zipLimits?: ZipLimits;
  /** refuse sheets with more rows (default 200,000; bigger logs should come as CSV) */
  maxRows?: number;
  /** sheet row number of the header, when the guess is wrong */
  headerLine?: number;
  /** refuse files larger than this many bytes (default: no limit; the upload route enforces its own while streaming) */
  maxBytes?: number;
}

async function load(buf: Uint8Array, opt: XlsxOptions): Promise<ExcelJS.Workbook> {
  const file = opt.fileName;
  if (buf.length === 0) throw new ImportError('empty_file', 'the file is empty (0 bytes)', { file });
  if (opt.maxBytes !== undefined && buf.length > opt.maxBytes) {
    throw new ImportError('too_large', `the file is larger than the limit of ${formatBytes(opt.maxBytes)}`, { file });
  }
  const entries = checkZip(buf, opt.zipLimits ?? DEFAULT_ZIP_LIMITS, file);
  if (!entries.some((e) => e.name === 'xl/workbook.xml')) {
    throw new ImportError('not_xlsx', 'this zip archive holds no workbook (xl/workbook.xml is missing); save the file again as .xlsx', { file });
  }
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(Buffer.from(buf.buffer, buf.byteOffset, buf.byteLength) as unknown as ArrayBuffer);
  } catch (e) {
    throw new ImportError('not_xlsx', `this workbook could not be read (${(e as Error).message}); save it again as .xlsx`, { file });
  }
  return wb;
}

/**
 * @throws ImportError `empty_file`, `not_xlsx`, `zip_bomb`
 * @example (await listSheets(buf)).map((s) => s.name) // ['Trials', 'Notes']
 */
export async function listSheets(buf: Uint8Array, opt: XlsxOptions = {}): Promise<SheetInfo[]> {
  const wb = await load(buf, opt);
  return wb.worksheets.map((ws, i) => ({ name: ws.name, index: i + 1, rowCount: ws.actualRowCount, columnCount: ws.actualColumnCount, hidden: ws.state !== 'visible' }));
}

const pad = (n: number) => String(n).padStart(2, '0');

/** A date cell → ISO wall-clock text; a time-only cell (day 0 of the 1900 system) → HH:MM:SS. */
export function dateCellText(d: Date): string {
  const y = d.getUTCFullYear();
  const hms = `${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}`;
  if (y < 1900) return hms;
  const ms = d.getUTCMilliseconds();
  return `${y}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${hms}${ms ? `.${String(ms).padStart(3, '0')}` : ''}`;
}

function plain(v: ExcelJS.CellValue, at: () => { cell: string }, warn: (m: string) => void): CellValue {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return v;
  if (typeof v === 'string') return v;
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
  if (v instanceof Date) return dateCellText(v);
  if (typeof v === 'object') {
    if ('formula' in v || 'sharedFormula' in v) {
      const f = v as ExcelJS.CellFormulaValue | ExcelJS.CellSharedFormulaValue;
      const text = 'formula' in f ? f.formula : `(shared) ${(f as ExcelJS.CellSharedFormulaValue).sharedFormula}`;
      const result = f.result;
      if (result === undefined || result === null) {
        warn(`cell ${at().cell} holds the formula =${text} with no saved result; it is read as empty (open and save the file in a spreadsheet program to store results)`);
        return null;
      }
      const r = plain(result as ExcelJS.CellValue, at, warn);
      warn(`cell ${at().cell} holds the formula =${text}; its saved result ${JSON.stringify(r)} was used`);
      return r;
    }
    if ('error' in v) { warn(`cell ${at().cell} holds the error ${(v as ExcelJS.CellErrorValue).error}; it is read as empty`); return null; }
    if ('richText' in v) return (v as ExcelJS.CellRichTextValue).richText.map((t) => t.text).join('');
    if ('text' in v) return String((v as ExcelJS.CellHyperlinkValue).text);
  }
  return String(v);
}

/**
 * Reads one sheet (by name, or the first visible one) into header + rows.
 * @throws ImportError `no_such_sheet`, `empty_file` (empty sheet), `no_header`, `duplicate_column`,
 *   `too_large`, and those of listSheets — each naming file and sheet.
 */
export async function readXlsxSheet(buf: Uint8Array, sheetName?: string, opt: XlsxOptions = {}): Promise<XlsxTable> {
  const file = opt.fileName;
  const wb = await load(buf, opt);
  const ws = sheetName === undefined ? wb.worksheets.find((w) => w.state === 'visible') ?? wb.worksheets[0] : wb.getWorksheet(sheetName);
  if (!ws) {
    throw new ImportError('no_such_sheet', `the workbook has no sheet "${sheetName}" (it has ${wb.worksheets.map((w) => `"${w.name}"`).join(', ') || 'none'})`, { file });
  }
  const sheet = ws.name;
  const maxRows = opt.maxRows ?? 200_000;
  if (ws.actualRowCount > maxRows) throw new ImportError('too_large', `the sheet has ${ws.actualRowCount} rows, over the limit of ${maxRows}; export it as CSV instead`, { file, sheet });
  const all: CellValue[][] = [];
  const rowNumbers: number[] = [];
  const cellWarnings: CellWarning[] = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    const cells: CellValue[] = [];
    const width = row.cellCount;
    for (let c = 1; c <= width; c++) {
      const cell = row.getCell(c);
      cells.push(plain(cell.value, () => ({ cell: `${columnLetter(c - 1)}${rowNumber}` }), (message) => cellWarnings.push({ sheet, cell: `${columnLetter(c - 1)}${rowNumber}`, line: rowNumber, message })));
    }
    all.push(cells);
    rowNumbers.push(rowNumber);
  });
  const asText = all.map((r) => r.map((c) => (c === null ? '' : String(c))));
  if (asText.every((r) => r.every((c) => c.trim() === ''))) throw new ImportError('empty_file', 'the sheet is empty', { file, sheet });
  let h: number;
  if (opt.headerLine !== undefined) {
    h = rowNumbers.indexOf(opt.headerLine);
    if (h < 0) throw new ImportError('no_header', `row ${opt.headerLine} is empty`, { file, sheet });
  } else {
    h = findHeaderRow(asText);
    if (h < 0) throw new ImportError('no_header', 'no header row found: the first rows hold no row of column names above the data', { file, sheet });
  }
  const header = checkHeader(asText[h], { file, sheet, line: rowNumbers[h] });
  const metadata: MetadataLine[] = [];
  for (let i = 0; i < h; i++) {
    const t = asText[i].filter((c) => c.trim() !== '').join(' ');
    if (t) metadata.push({ line: rowNumbers[i], text: t });
  }
  return {
    fileName: file, sheet, header, headerLine: rowNumbers[h], metadata,
    rows: all.slice(h + 1), lines: rowNumbers.slice(h + 1),
    cellWarnings: cellWarnings.filter((w) => w.line > rowNumbers[h]),
  };
}
