import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Fit, Rig, type StudyRow } from '@/entities';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { STUDY_SHEETS, studyCsv, studyWorkbook, type CollectorExport, type FitExport, type PlanExport, type ForecastExport, type PerformanceExport, type RunningCostExport, type StudyExport, type StudySheetName, type TrialExportRow, type TubFillExport } from '../exports';
import { costExport, costSeason, costView } from '../forecasts/cost-sheet';
import { InputError } from '@/analysis/units/reading-input';
import { tubFillOfFit } from '../forecasts/tub-fill';
import { DomainError } from '../server/errors';
import { forecastForExport } from '../forecasts/forecasts';
import { modelLabel, SOFTWARE_VERSION } from '../fits/fit-analysis';
import { parseStoredFit } from '../fits/stored-fit';
import { cachedFile } from '../server/http-cache';
import { collectorModelLabel, parseStoredCollectorFit } from '../fits/collector-analysis';
import { comparisonInLab, readComparison } from '../comparisons/comparisons';
import type { DesignComparisonView } from '@/app/_contracts/design-comparison';
import { isUuid } from '../labs/load-in-lab';
import { planDto, planInLab } from '../rigs/operating-plans';

/** The saved fits a study's blocks point at, in block order, once each (lab-scoped). */
export async function studyFits(em: EntityManager, study: StudyRow) {
  const ids = [...new Set(study.blocks.map((b) => b.data.fitId).filter((x): x is string => typeof x === 'string'))];
  const rows = ids.length ? await em.find(Fit, { id: { $in: ids }, lab: study.lab }) : [];
  return ids.map((id) => rows.find((r) => r.id === id)).filter((r): r is NonNullable<typeof r> => !!r);
}

/** The study's tables (Summary with provenance, Trials, Fit, Residuals, Performance, Forecast series of its forecast blocks, Costs of its cost-sheet blocks, Comparison of its design-comparison blocks) as export data. */
export async function studyExportData(em: EntityManager, study: StudyRow, labName: string, unitSystem: UnitSystem): Promise<StudyExport> {
  const fits = await studyFits(em, study);
  const rigs = fits.length ? await em.find(Rig, { id: { $in: fits.map((f) => f.rig.id) } }) : [];
  const trials: TrialExportRow[] = [];
  const fitExports: FitExport[] = [];
  const performance: PerformanceExport[] = [];
  const collectors: CollectorExport[] = [];
  for (const f of fits) {
    if (f.kind === 'collector') {
      // solar collectors: the Collector sheet
      const c = parseStoredCollectorFit(f.result, f.id);
      collectors.push({ label: `${f.title} v${f.version}`, test: c.test, trialLabels: c.test.points.map((p) => c.trials[p.index]?.label ?? `trial ${p.index + 1}`) });
      continue;
    }
    const r = parseStoredFit(f.result, f.id);
    const label = `${f.title} v${f.version} (${modelLabel(f.model)})`;
    r.trials.forEach((t, i) =>
      trials.push({ id: t.id, order: i + 1, timestamp: new Date(t.startedAt), included: true, flowM3PerS: t.flowM3PerS, inletTempC: t.inletTempC, outletTempC: t.outletTempC, ambientTempC: t.ambientTempC, bucketVolumeM3: t.bucketVolumeM3, fillTimesS: t.fillTimesS }),
    );
    fitExports.push({ label, fit: r.fit, pointIds: r.trials.map((t) => t.id) });
    performance.push({ label, table: r.performance });
  }
  const running: RunningCostExport[] = [];
  const notes = [`Study revision ${study.revision}, review state: ${study.reviewState}.`];
  const forecasts: ForecastExport[] = [];
  for (const [i, b] of study.blocks.entries()) {
    if (b.kind !== 'forecast') continue;
    const label = `Forecast (block ${i + 1})`;
    try {
      forecasts.push(await forecastForExport(em, study.lab, b.data, label));
    } catch (e) {
      if (!(e instanceof DomainError)) throw e;
      notes.push(`${label} cannot be computed: ${e.message}`);
    }
  }
  for (const [i, b] of study.blocks.entries()) {
    if (b.kind !== 'costs') continue;
    const label = `Cost sheet (block ${i + 1})`;
    try {
      running.push(costExport(label, { ...costView(b.data, study.blocks), season: await costSeason(em, study.lab, b.data, study.blocks) }));
    } catch (e) {
      if (!((e instanceof DomainError && e.kind === 'invalid') || e instanceof InputError)) throw e;
      notes.push(`${label} cannot be computed: ${e.message}`);
    }
  }
  const tubFills: TubFillExport[] = [];
  for (const [i, b] of study.blocks.entries()) {
    if (b.kind !== 'tub-fill') continue;
    const label = `Tub fill (block ${i + 1})`;
    const fit = fits.find((f) => f.id === b.data.fitId);
    if (!fit) {
      notes.push(`${label} cannot be computed: no saved coil fit chosen.`);
      continue;
    }
    try {
      tubFills.push({ label, fill: tubFillOfFit(fit, b.data) });
    } catch (e) {
      if (!((e instanceof DomainError && e.kind === 'invalid') || e instanceof InputError)) throw e;
      notes.push(`${label} cannot be computed: ${e.message}`);
    }
  }
  const comparisons: DesignComparisonView[] = [];
  for (const [i, b] of study.blocks.entries()) {
    if (b.kind !== 'design-comparison' || !isUuid(b.data.comparisonId)) continue;
    const c = await comparisonInLab(em, study.lab, b.data.comparisonId);
    if (!c) continue;
    try {
      comparisons.push(await readComparison(em, c, unitSystem));
    } catch (e) {
      if (!(e instanceof DomainError && e.kind === 'invalid')) throw e;
      notes.push(`Design comparison (block ${i + 1}) cannot be computed: ${e.message}`);
    }
  }
  const plans: PlanExport[] = [];
  for (const b of study.blocks) {
    if (b.kind !== 'operating-plan') continue;
    const row = await planInLab(em, study.lab, b.data.planId);
    if (row) plans.push(planDto(row));
  }
  return {
    unitSystem,
    provenance: {
      lab: labName,
      study: study.title,
      rig: rigs.map((r) => r.name).join(', ') || null,
      model: fits.map((f) => (f.kind === 'collector' ? collectorModelLabel(f.model) : modelLabel(f.model))).join(', ') || null,
      fitTime: fits[0]?.createdAt ?? null,
      softwareVersion: SOFTWARE_VERSION,
      dataHash: fits.map((f) => f.trialsHash.slice(0, 16)).join(' ') || null,
    },
    trials,
    fits: fitExports,
    performance,
    forecasts,
    ...(collectors.length ? { collectors } : {}),
    ...(running.length ? { costs: { currency: running[0].currency, running } } : {}),
    ...(comparisons.length ? { comparisons } : {}),
    ...(plans.length ? { plans } : {}),
    ...(tubFills.length ? { tubFills } : {}),
    notes,
  };
}

/**
 * The export response: XLSX by default; `?format=csv&table=Trials` (or Fit, Residuals,
 * Performance, Summary) gives one table as CSV, units in the header names. Given the request, it
 * answers with an ETag (private, revalidated) and 304 when the reader already has this file.
 */
export async function exportResponse(data: StudyExport, title: string, search: URLSearchParams, req?: { headers: Headers }): Promise<Response> {
  // the file follows from its data, format and table: with the request, it carries an ETag of those and a 304 skips building it
  if (req) return cachedFile(req, { data, title, format: search.get('format'), table: search.get('table') }, () => exportResponse(data, title, search));
  if (search.get('format') !== 'csv') return xlsxResponse(await studyWorkbook(data), title);
  const table = search.get('table') ?? 'Trials';
  if (!(STUDY_SHEETS as readonly string[]).includes(table)) throw new DomainError('invalid', 'invalid', `No table "${table}": choose one of ${STUDY_SHEETS.join(', ')}.`);
  const csv = studyCsv(data, table as StudySheetName);
  if (csv === null) throw new DomainError('not_found', 'not_found', `This export has no ${table} table.`);
  const name = `${title.replace(/[^\w.-]+/g, '-').slice(0, 50) || 'export'}-${table.toLowerCase()}.csv`;
  return new Response(csv, { headers: { 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="${name}"` } });
}

export function xlsxResponse(buf: Buffer, title: string) {
  const name = `${title.replace(/[^\w.-]+/g, '-').slice(0, 60) || 'study'}.xlsx`;
  return new Response(new Uint8Array(buf), {
    headers: { 'Content-Type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'Content-Disposition': `attachment; filename="${name}"` },
  });
}
