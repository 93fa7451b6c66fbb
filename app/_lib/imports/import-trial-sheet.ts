/**
 * A trial sheet from table to checked rows: apply the confirmed mapping, check every row with the
 * row schema, collect errors and warnings with line numbers. Nothing is stored here; the caller
 * shows the table, lets the engineer exclude rows, and saves on confirmation.
 */
import { checkMapping, createRowMapper, describeMixedUnits, type CellValue, type ColumnUnitReport } from './apply-mapping';
import type { SourceLocation } from './import-error';
import { checkTrialRow, DEFAULT_PLAUSIBILITY, type PlausibilityLimits, type RowIssue, type TrialRowResult } from '../rigs/trial-rule';

/** What a reader returns (delimited text or a sheet). */
export interface CellTable {
  header: string[];
  rows: CellValue[][];
  /** 1-based source line (or sheet row) of each row */
  lines: number[];
}

export interface TrialSheetResult {
  rows: TrialRowResult[];
  /** rows without errors */
  okCount: number;
  errorCount: number;
  warningCount: number;
  /** columns whose cells came in several units */
  mixedUnits: ColumnUnitReport[];
  /** sentences for the file as a whole (mixed units, …) */
  notices: string[];
}

/**
 * @param mapping the confirmed mapping (checked here against `table.header`)
 * @throws ImportError `bad_mapping` / `missing_column` from checkMapping
 * @example const r = importTrialSheet(await readDelimited(buf), mapping, { file: 'trials.csv' })
 */
export function importTrialSheet(table: CellTable, mapping: unknown, where: SourceLocation = {}, limits: PlausibilityLimits = DEFAULT_PLAUSIBILITY): TrialSheetResult {
  const m = checkMapping(mapping, table.header, where);
  const mapper = createRowMapper(m, table.header.length);
  const rows: TrialRowResult[] = [];
  let okCount = 0, errorCount = 0, warningCount = 0;
  for (let i = 0; i < table.rows.length; i++) {
    const line = table.lines[i];
    const { row, issues } = mapper.map(table.rows[i], line);
    let result: TrialRowResult;
    if (issues.length) {
      // unreadable cells: report them, plus what the schema says about the rest
      const schema = checkTrialRow(row, line, mapper.columnOf, limits);
      const more = schema.issues.filter((s) => s.severity === 'error' && !issues.some((x) => x.field === s.field));
      result = { line, ok: false, issues: [...issues, ...more] };
    } else {
      result = checkTrialRow(row, line, mapper.columnOf, limits);
    }
    if (result.ok) okCount++; else errorCount++;
    if (result.issues.some((x: RowIssue) => x.severity === 'warning')) warningCount++;
    rows.push(result);
  }
  const mixedUnits = mapper.mixedUnits();
  return { rows, okCount, errorCount, warningCount, mixedUnits, notices: mixedUnits.map(describeMixedUnits) };
}
