import ExcelJS from 'exceljs';
import { neutraliseCell, type CellValue, type SafeCell } from './cells';
import { xlsxHeader, type ExportColumn, type ExportRow } from './columns';

/** One sheet: notice rows, then a single table with a frozen header row; notes go below the table. */
export interface SheetSpec {
  name: string;
  /** plain-text lines written above the table, one row each (the safety notice of a sheet that shows temperatures) */
  notice?: string[];
  columns: ExportColumn[];
  rows: ExportRow[];
  /** plain-text lines written under the table after one empty row */
  notes?: string[];
}

/** One key/value line of the Summary sheet (provenance, settings, scalar results). */
export interface SummaryItem {
  /** a heading the line belongs to, e.g. "Provenance", "Fit statistics" */
  section?: string;
  key: string;
  value: CellValue;
  unit?: string;
  numFmt?: string;
}

/** A whole workbook: the Summary sheet first (when given), then the sheets in order. */
export interface WorkbookSpec {
  summary?: SummaryItem[];
  /** notes under the Summary table (the analysis-aid notice, cautions…) */
  summaryNotes?: string[];
  /** notice rows above the Summary table (the safety notice) */
  summaryNotice?: string[];
  sheets: SheetSpec[];
  /** workbook creation time written to the file's properties (default now) */
  created?: Date;
}

/** Excel's limits: 31 characters, none of [ ] : * ? / \, not starting or ending with an apostrophe. */
const SHEET_NAME_MAX = 31;
/** Date format of timestamp cells without their own (ISO 8601 order; values are UTC). */
export const DATE_NUM_FMT = 'yyyy-mm-dd hh:mm:ss';
const WIDTH_MIN = 6, WIDTH_MAX = 60, WIDTH_SAMPLE_ROWS = 2000;

function sheetName(name: string, taken: Set<string>): string {
  let base = name.replace(/[[\]:*?/\\]/g, '-').replace(/^'+|'+$/g, '').trim().slice(0, SHEET_NAME_MAX) || 'Sheet';
  let candidate = base, k = 2;
  while (taken.has(candidate.toLowerCase())) {
    const suffix = ` (${k++})`;
    candidate = base.slice(0, SHEET_NAME_MAX - suffix.length) + suffix;
  }
  taken.add(candidate.toLowerCase());
  base = candidate;
  return base;
}

/** Characters the value takes on screen under a number format, roughly (for the column width). */
function shownLength(value: SafeCell, numFmt: string | undefined): number {
  if (value === null) return 0;
  if (typeof value === 'string') return Math.max(...value.split('\n').map((l) => l.length));
  if (typeof value === 'boolean') return 5;
  if (value instanceof Date) return (numFmt ?? DATE_NUM_FMT).replace(/"/g, '').length;
  if (numFmt && /E\+0/i.test(numFmt)) return (numFmt.match(/0\.(0*)/)?.[1].length ?? 0) + 7;
  const decimals = numFmt?.match(/\.(0+)/)?.[1].length;
  const text = decimals !== undefined ? value.toFixed(decimals) : String(value);
  return numFmt?.includes(',') ? text.length + Math.floor(Math.abs(value)).toString().length / 3 : text.length;
}

/** Writes the notice rows: bold caution-coloured text over the width of the table, one line each. */
function addNotice(ws: ExcelJS.Worksheet, sheet: SheetSpec): number {
  const lines = sheet.notice ?? [];
  const span = Math.max(1, Math.min(sheet.columns.length, 12));
  lines.forEach((line, i) => {
    const r = ws.addRow([neutraliseCell(line, `${sheet.name}: notice`)]);
    if (span > 1) ws.mergeCells(r.number, 1, r.number, span);
    const cell = r.getCell(1);
    cell.font = { bold: i === 0, color: { argb: 'FF7A4B00' } };
    cell.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFFFF6DB' } };
    cell.alignment = { vertical: 'top', wrapText: true };
    // a merged, wrapped cell does not grow by itself: about 110 characters a line over 12 columns
    r.height = 15 * Math.max(1, Math.ceil(line.length / (span >= 8 ? 110 : 14 * span)));
  });
  return lines.length;
}

function addTable(ws: ExcelJS.Worksheet, sheet: SheetSpec): void {
  const { columns, rows } = sheet;
  const top = addNotice(ws, sheet);
  const headerRow = top + 1;
  const headers = columns.map((c) => neutraliseCell(xlsxHeader(c), `${sheet.name}: header of ${c.key}`));
  const header = ws.addRow(headers);
  header.font = { bold: true };
  header.alignment = { vertical: 'middle', wrapText: false };
  header.eachCell((cell) => {
    cell.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE8EEF4' } };
    cell.border = { bottom: { style: 'thin', color: { argb: 'FF7A8A99' } } };
  });
  const widths = headers.map((h) => String(h ?? '').length);
  rows.forEach((row, i) => {
    const values = columns.map((c) => neutraliseCell(row[c.key], `${sheet.name}: row ${i + 1}, column ${c.key}`));
    const r = ws.addRow(values);
    values.forEach((v, j) => {
      const fmt = columns[j].numFmt ?? (v instanceof Date ? DATE_NUM_FMT : undefined);
      if (fmt && v !== null && typeof v !== 'string') r.getCell(j + 1).numFmt = fmt;
      if (i < WIDTH_SAMPLE_ROWS) widths[j] = Math.max(widths[j], shownLength(v, fmt));
    });
  });
  columns.forEach((c, j) => {
    ws.getColumn(j + 1).width = c.width ?? Math.min(WIDTH_MAX, Math.max(WIDTH_MIN, Math.ceil(widths[j]) + 2));
  });
  if (columns.length > 0) {
    ws.views = [{ state: 'frozen', xSplit: 0, ySplit: headerRow, topLeftCell: `A${headerRow + 1}`, activeCell: `A${headerRow + 1}` }];
    ws.autoFilter = { from: { row: headerRow, column: 1 }, to: { row: headerRow + rows.length, column: columns.length } };
  }
  if (sheet.notes?.length) {
    ws.addRow([]);
    const span = Math.max(1, columns.length);
    const chars = columns.reduce((sum, _c, j) => sum + (ws.getColumn(j + 1).width ?? WIDTH_MIN), 0);
    for (const note of sheet.notes) {
      const r = ws.addRow([neutraliseCell(note, `${sheet.name}: note`)]);
      r.font = { italic: true };
      // over the table's width and wrapped, so that a long note prints inside the print area
      if (span > 1) ws.mergeCells(r.number, 1, r.number, span);
      r.getCell(1).alignment = { vertical: 'top', wrapText: true };
      r.height = 15 * Math.max(1, Math.ceil(note.length / Math.max(chars, 1)));
    }
  }
  setPrintLayout(ws, headerRow, Math.max(1, columns.length));
}

/**
 * Above this sum of column widths (characters of the default font) a sheet prints in landscape:
 * a portrait A4 or Letter page holds about 95 at 100 % (common practice: ~7 in of printable width
 * at 7 px per character and 96 px per inch).
 */
export const PORTRAIT_MAX_CHARS = 95;

/**
 * How a sheet prints: everything written (notice, table, notes) as the print area, scaled to one
 * page wide and as many pages long as it needs, the header row repeated on every page,
 * landscape when the columns are wider than a portrait page, and the sheet name and page
 * number in the footer.
 */
function setPrintLayout(ws: ExcelJS.Worksheet, headerRow: number, lastColumn: number): void {
  const chars = Array.from({ length: lastColumn }, (_, j) => ws.getColumn(j + 1).width ?? WIDTH_MIN).reduce((a, b) => a + b, 0);
  ws.pageSetup = {
    ...ws.pageSetup,
    orientation: chars > PORTRAIT_MAX_CHARS ? 'landscape' : 'portrait',
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: 0,
    printArea: `A1:${ws.getColumn(lastColumn).letter}${Math.max(ws.rowCount, headerRow)}`,
    printTitlesRow: `${headerRow}:${headerRow}`,
    margins: { left: 0.5, right: 0.5, top: 0.6, bottom: 0.6, header: 0.3, footer: 0.3 },
  };
  ws.headerFooter = { ...ws.headerFooter, oddFooter: '&L&A&RPage &P of &N' };
}

/** The columns of the Summary sheet. */
export const SUMMARY_COLUMNS: ExportColumn[] = [
  { key: 'section', header: 'Section' },
  { key: 'key', header: 'Item' },
  { key: 'value', header: 'Value' },
  { key: 'unit', header: 'Unit' },
];

/** The Summary items as a sheet (also usable for CSV). */
export function summarySheet(items: readonly SummaryItem[], notes?: string[], notice?: string[]): SheetSpec {
  return {
    name: 'Summary',
    ...(notice?.length ? { notice } : {}),
    columns: SUMMARY_COLUMNS,
    rows: items.map((it) => ({ section: it.section ?? '', key: it.key, value: it.value, unit: it.unit ?? '' })),
    notes,
  };
}

/**
 * Builds the exceljs workbook (for callers that stream it or add to it).
 * @throws TypeError naming sheet, row and column for NaN, Infinity, an invalid date or an object.
 */
export function workbookDocument(spec: WorkbookSpec): ExcelJS.Workbook {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Emberline';
  wb.created = spec.created ?? new Date();
  wb.modified = wb.created;
  const taken = new Set<string>();
  const sheets = spec.summary ? [summarySheet(spec.summary, spec.summaryNotes, spec.summaryNotice), ...spec.sheets] : spec.sheets;
  for (const sheet of sheets) {
    const ws = wb.addWorksheet(sheetName(sheet.name, taken));
    addTable(ws, sheet);
    if (sheet === sheets[0] && spec.summary) {
      // per-line number formats of the Value column
      const first = (spec.summaryNotice?.length ?? 0) + 2;
      spec.summary.forEach((it, i) => { if (it.numFmt && typeof it.value === 'number') ws.getCell(first + i, 3).numFmt = it.numFmt; });
    }
  }
  return wb;
}

/**
 * An XLSX file through exceljs: a Summary sheet of key/value provenance first, then one sheet per
 * table, each with a bold frozen header row carrying the units ("Flow (L/min)"), the columns'
 * number formats, widths from the content (6–60 characters), an auto-filter, a print layout (one
 * page wide, the header row on every page, landscape when wide), and every text cell neutralised
 * against formula injection (OWASP "CSV Injection"; see cells.ts).
 * @returns the .xlsx bytes
 * @throws TypeError naming sheet, row and column for NaN, Infinity, an invalid date or an object.
 * @example await buildWorkbook({ summary: [{ key: 'Lab', value: 'Demo lab' }], sheets: [trialsSheet] })
 */
export async function buildWorkbook(spec: WorkbookSpec): Promise<Buffer> {
  const bytes = await workbookDocument(spec).xlsx.writeBuffer();
  return Buffer.from(bytes as ArrayBuffer);
}
