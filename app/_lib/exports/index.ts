import 'server-only';
/**
 * Spreadsheet, CSV and picture exports (issue 7 §7). Import from here in routes and server code;
 * the files behind it are pure and are tested directly.
 */
export { neutraliseCell, neutraliseText, FORMULA_TRIGGERS, type CellValue, type SafeCell } from './cells';
export { csvHeader, xlsxHeader, unitToken, snakeName, type ExportColumn, type ExportRow } from './columns';
export { toCsv, type CsvOptions } from './csv';
export { buildWorkbook, workbookDocument, summarySheet, DATE_NUM_FMT, SUMMARY_COLUMNS, type SheetSpec, type SummaryItem, type WorkbookSpec } from './xlsx';
export { quantityColumn } from './quantity-columns';
export { trialsSheet, trialExportRow } from './trial-sheet';
export { fitSheet, residualsSheet, fitSummaryItems, parameterUnits } from './fit-sheets';
export { performanceSheet, forecastSheet, forecastSummaryItems, costsSheet } from './result-sheets';
export { collectorSheet, collectorSummaryItems } from './collector-sheet';
export { comparisonSheet } from './comparison-sheet';
export { planSheet, type PlanExport } from './plan-sheet';
export { tubFillSheet } from './tub-fill-sheet';
export {
  studyWorkbook, fitWorkbook, studyWorkbookSpec, studyCsv, sheetCsv, provenanceItems, ANALYSIS_AID_NOTICE, STUDY_SHEETS,
  type StudySheetName,
} from './study-workbook';
export type * from './types';
