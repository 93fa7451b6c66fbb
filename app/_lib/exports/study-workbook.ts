/**
 * The study and fit workbooks of issue 7: Summary (provenance, settings, fit statistics, forecast
 * results), Trials, Fit, Residuals, Performance, Forecast, Costs and Comparison — each sheet present when its
 * data is — and CSV of any of those tables.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';
import { toCsv, type CsvOptions } from './csv';
import { fitSheet, fitSummaryItems, residualsSheet } from './fit-sheets';
import { costsSheet, forecastSheet, forecastSummaryItems, performanceSheet } from './result-sheets';
import { trialsSheet } from './trial-sheet';
import { collectorSheet, collectorSummaryItems } from './collector-sheet';
import { comparisonSheet } from './comparison-sheet';
import { planSheet } from './plan-sheet';
import { tubFillSheet } from './tub-fill-sheet';
import type { ExportProvenance, FitWorkbookInput, StudyExport } from './types';
import { buildWorkbook, summarySheet, type SheetSpec, type SummaryItem, type WorkbookSpec } from './xlsx';
import { limitItems, sheetNotice, STANDING_NOTES } from './safety';

/** The standing notice under every Summary (issue 7 §8). */
export const ANALYSIS_AID_NOTICE =
  'Emberline is an analysis aid: its results defer to local codes and licensed practice.';

/** Sheet names of a full study workbook, in order. */
export const STUDY_SHEETS = ['Summary', 'Trials', 'Fit', 'Residuals', 'Performance', 'Forecast', 'Costs', 'Collector', 'Comparison', 'Plans', 'Tub fill'] as const;
export type StudySheetName = (typeof STUDY_SHEETS)[number];

/** Provenance lines of the Summary sheet. */
export function provenanceItems(p: ExportProvenance, unitSystem: UnitSystem): SummaryItem[] {
  const section = 'Provenance';
  const items: SummaryItem[] = [
    { section, key: 'Lab', value: p.lab },
    { section, key: 'Rig', value: p.rig ?? null },
  ];
  if (p.study != null) items.push({ section, key: 'Study', value: p.study });
  if (p.fitId != null) items.push({ section, key: 'Saved fit', value: p.fitId });
  if (p.fitVersion != null) items.push({ section, key: 'Fit version', value: p.fitVersion });
  items.push(
    { section, key: 'Model', value: p.model ?? null },
    { section, key: 'Fit time (UTC)', value: p.fitTime ?? null },
    { section, key: 'Software version', value: p.softwareVersion },
    { section, key: 'Data hash', value: p.dataHash ?? null },
    { section, key: 'Exported (UTC)', value: p.exportedAt ?? new Date() },
    { section, key: 'Units', value: unitSystem === 'us' ? 'US customary' : 'SI (°C, L/min, kW)' },
  );
  for (const [key, value] of Object.entries(p.settings ?? {})) items.push({ section: 'Settings', key, value });
  return items;
}

/**
 * The workbook description of a study: plain data, for XLSX ({@link studyWorkbook}) or CSV
 * ({@link studyCsv}). Sheets without data are left out.
 * @throws RangeError for an unknown unit system.
 */
export function studyWorkbookSpec(s: StudyExport): WorkbookSpec {
  const sys = s.unitSystem;
  if (sys !== 'si' && sys !== 'us') throw new RangeError(`unitSystem must be 'si' or 'us', got ${JSON.stringify(sys)}`);
  const fits = s.fits ?? [];
  const forecasts = s.forecasts ?? [];
  const sheets: SheetSpec[] = [];
  if (s.trials?.length) sheets.push(trialsSheet(s.trials, sys));
  if (fits.length) sheets.push(fitSheet(fits, sys), residualsSheet(fits, sys));
  if (s.performance?.length) sheets.push(performanceSheet(s.performance, sys));
  if (forecasts.length) sheets.push(forecastSheet(forecasts, sys));
  if (s.costs) sheets.push(costsSheet(s.costs, sys));
  if (s.collectors?.length) sheets.push(collectorSheet(s.collectors, sys));
  if (s.comparisons?.length) sheets.push(comparisonSheet(s.comparisons, sys));
  if (s.plans?.length) sheets.push(planSheet(s.plans, sys));
  if (s.tubFills?.length) sheets.push(tubFillSheet(s.tubFills, sys));
  return {
    summary: [...provenanceItems(s.provenance, sys), ...limitItems(sys), ...fitSummaryItems(fits, sys), ...forecastSummaryItems(forecasts, sys), ...collectorSummaryItems(s.collectors ?? [])],
    summaryNotice: sheetNotice(sys, forecasts.flatMap((f, k) => [
      { where: `pool of ${f.label ?? `Forecast ${k + 1}`}`, valuesC: [f.result.maxTempC] },
      { where: `heater outlet of ${f.label ?? `Forecast ${k + 1}`}`, valuesC: [f.result.maxOutletTempC] },
    ])),
    summaryNotes: [...(s.notes ?? []), ANALYSIS_AID_NOTICE, ...STANDING_NOTES.slice(1)],
    sheets,
    created: s.provenance.exportedAt,
  };
}

/**
 * A study as an XLSX file (see buildWorkbook for the sheet conventions).
 * @example await studyWorkbook({ unitSystem: 'us', provenance, trials, fits: [{ fit }], forecasts: [{ result }] })
 */
export function studyWorkbook(s: StudyExport): Promise<Buffer> {
  return buildWorkbook(studyWorkbookSpec(s));
}

/**
 * A fit as an XLSX file: Summary, Trials, Fit, Residuals and (when given) Performance.
 * @example await fitWorkbook({ unitSystem: 'si', provenance, trials, fits: [{ fit, pointIds }] })
 */
export function fitWorkbook(f: FitWorkbookInput): Promise<Buffer> {
  return studyWorkbook(f);
}

/**
 * One table of a study as CSV (through papaparse; units in the header names).
 * @param sheet a name of {@link STUDY_SHEETS}
 * @returns the CSV text, or null when the study has no such table
 */
export function studyCsv(s: StudyExport, sheet: StudySheetName, options?: CsvOptions): string | null {
  const spec = studyWorkbookSpec(s);
  const table = sheet === 'Summary' ? summarySheet(spec.summary ?? [], spec.summaryNotes, spec.summaryNotice) : spec.sheets.find((t) => t.name === sheet);
  return table ? sheetCsv(table, options) : null;
}

/**
 * Any sheet description as CSV: its notice rows and its notes (cautions, the analysis-aid notice)
 * as "# " comment lines before the header, so a CSV never travels without them.
 */
export function sheetCsv(sheet: SheetSpec, options?: CsvOptions): string {
  const notice = sheet.notice?.length ? sheet.notice : [ANALYSIS_AID_NOTICE];
  return toCsv(sheet.columns, sheet.rows, { ...options, comments: [...(options?.comments ?? []), ...notice, ...(sheet.notes ?? [])] });
}
