import 'server-only';
import { DomainError } from '../server/errors';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Fit, Rig, SourceFile, type FitRow, type LabRow, type StudyRow } from '@/entities';
import type { StudyBlock } from '@/entities/study';
import type { BlockBody, BlockData, FitHead } from '@/app/_contracts/study-blocks';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { costBlockData, costSeason, costView, seasonForecastBlock } from '../forecasts/cost-sheet';
import { InputError } from '@/analysis/units/reading-input';
import { tubFillOfFit } from '../forecasts/tub-fill';
import { modelLabel } from '../fits/fit-analysis';
import { collectorModelLabel, savedCollectorView } from '../fits/collector-analysis';
import { parseStoredFit } from '../fits/stored-fit';
import { forecast } from '../forecasts/forecasts';
import { renderMarkdown } from './markdown';
import { STANDING_NOTICE } from '@/analysis/safety/standing-notice';
import { fitView } from '../fits/fit-compute';
import { runAnalysis } from '../server/analysis-pool';
import { isUuid } from '../labs/load-in-lab';
import { sensorLogBody as sensorLogView } from './sensor-log-body';
import { blockCacheKey, cachedBlockData, jsonHash } from '../server/block-cache';
import { comparisonInLab, readComparison } from '../comparisons/comparisons';
import { planDto, planInLab } from '../rigs/operating-plans';

/**
 * One study block as plain JSON for the page's first paint (the SWR fallback) and the block-data
 * routes: numbers in SI, tables, and the server-rendered SVG of its plots in the reader's units.
 * The public view (a share link) never carries links into the lab, member names or raw files.
 */

/** The standing cautions of every caution block: the standing notice (analysis/safety/standing-notice.ts). */
export const STANDING_CAUTIONS = STANDING_NOTICE;

export interface BlockContext {
  em: EntityManager;
  lab: LabRow;
  study: StudyRow;
  units: UnitSystem;
  /** the share view: no fit links, no file names */
  publicView: boolean;
  /** saved fits by id, loaded once for the blocks that need them */
  fits?: Map<string, BlockFit>;
}

/** A saved fit as a block's cache key needs it: the row without its stored result. */
type BlockFit = Omit<FitRow, 'result'>;

const FIT_KINDS = new Set(['fit', 'comparison', 'performance', 'trials', 'collector']);

/**
 * The saved fits the given blocks point at (lab-scoped), by id, without their stored results: a
 * block's cache key needs only the id and version, and the result (tens of kB of JSON each) is
 * read only when a block is computed (`withResult`).
 */
export async function blockFits(em: EntityManager, lab: LabRow, blocks: readonly StudyBlock[]): Promise<Map<string, BlockFit>> {
  const ids = [...new Set(blocks.filter((b) => FIT_KINDS.has(b.kind) || b.kind === 'forecast' || b.kind === 'tub-fill').map((b) => b.data.fitId).filter((x): x is string => isUuid(x)))];
  const rows = ids.length ? await em.find(Fit, { id: { $in: ids }, lab }, { exclude: ['result'] }) : [];
  return new Map(rows.map((f) => [f.id, f]));
}

/** The fit with its stored result (the ORM reads the row again when `blockFits` left it out). */
const withResult = (em: EntityManager, fit: BlockFit): Promise<FitRow> => em.findOneOrFail(Fit, { id: fit.id });

/** A fit block's body without its head (the head carries the review state, which changes). */
type FitBlockBody = Extract<BlockBody, { head: FitHead }>;
type WithoutHead<T> = T extends unknown ? Omit<T, 'head'> : never;

async function fitBodyOf(em: EntityManager, kind: string, row: BlockFit, units: UnitSystem): Promise<WithoutHead<FitBlockBody>> {
  const fit = await withResult(em, row);
  const r = parseStoredFit(fit.result, fit.id);
  const label = modelLabel(fit.model);
  switch (kind) {
    case 'fit': {
      const plot = await runAnalysis('fitBlockFigure', { fit: r.fit, label, inletTempC: r.choice.inletTempC, units });
      return { type: 'fit', plot, fit: fitView(r.fit, label), choice: r.choice };
    }
    case 'comparison':
      return { type: 'comparison', comparison: r.comparison };
    case 'performance':
      return { type: 'performance', table: r.performance };
    default:
      return { type: 'trials', trials: r.trials.map(({ startedAt, flowM3PerS, inletTempC, outletTempC }) => ({ startedAt, flowM3PerS, inletTempC, outletTempC })) };
  }
}

/**
 * A fit block: its data comes from the block cache, keyed by (kind, fit id, fit version, unit
 * system, software version) — a saved fit never changes — and its head is built from the row
 * (the review state moves).
 */
async function fitBody(ctx: BlockContext, kind: string, fit: BlockFit): Promise<BlockBody> {
  if (fit.kind === 'collector' || kind === 'collector') {
    // solar collectors: a collector block shows a saved collector fit, and only there
    if (fit.kind !== 'collector') return { type: 'note', tone: 'muted', message: 'A collector block shows a saved collector fit: choose one.' };
    if (kind !== 'collector') return { type: 'note', tone: 'muted', message: 'This saved fit is a collector efficiency curve: show it in a collector block.' };
    const head: FitHead = { fitId: ctx.publicView ? null : fit.id, title: fit.title, version: fit.version, label: collectorModelLabel(fit.model), reviewState: fit.reviewState };
    const key = blockCacheKey(['collector-block', fit.id, fit.version, ctx.units]);
    const data = await cachedBlockData(ctx.em, key, { labId: ctx.lab.id, fitId: fit.id }, async () => ({ view: savedCollectorView(await withResult(ctx.em, fit)) }));
    return { type: 'collector', head, view: data.view };
  }
  const head: FitHead = { fitId: ctx.publicView ? null : fit.id, title: fit.title, version: fit.version, label: modelLabel(fit.model), reviewState: fit.reviewState };
  const key = blockCacheKey(['fit-block', kind, fit.id, fit.version, ctx.units]);
  const data = await cachedBlockData(ctx.em, key, { labId: ctx.lab.id, fitId: fit.id }, () => fitBodyOf(ctx.em, kind, fit, ctx.units));
  return { ...data, head } as BlockBody;
}

async function sensorLogBody(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const fileId = block.data.sourceFileId;
  if (!isUuid(fileId)) return { type: 'note', tone: 'muted', message: 'No sensor log chosen for this block yet.' };
  const file = await ctx.em.findOne(SourceFile, { id: fileId, lab: ctx.lab }, { populate: ['rig'] });
  if (!file) return { type: 'note', tone: 'muted', message: 'The sensor log of this block no longer exists.' };
  const body = await sensorLogView(ctx.em, ctx.lab, file, ctx.units, ctx.publicView);
  return body ?? { type: 'note', tone: 'muted', message: 'This file holds no logged samples (it was not imported as a sensor log).' };
}

/**
 * A forecast block, kept in the block cache under what it reads: its settings (by hash), the
 * saved coil fit it names (id and version: immutable), the unit system and the software version.
 * A forecast that cannot be computed is not kept.
 */
async function forecastBody(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const d = block.data;
  const fits = ctx.fits ?? (await blockFits(ctx.em, ctx.lab, [block]));
  const fit = typeof d.fitId === 'string' ? fits.get(d.fitId) : undefined;
  const key = blockCacheKey(['forecast-block', jsonHash(d), fit ? `${fit.id}@${fit.version}` : 'no-fit', ctx.units]);
  return cachedBlockData(ctx.em, key, { labId: ctx.lab.id, fitId: fit?.id ?? null }, async (): Promise<BlockBody> => {
    const f = await forecast(ctx.em, ctx.lab, { ...d }, ctx.units, 'svg');
    const { title, summary, svg, cautions } = f.plots.trajectory;
    return {
      type: 'forecast', finalTempC: f.finalTemp_degC, hoursToTarget: f.hoursToTarget_h, fitNote: f.fitNote, cautions: f.cautions, plot: { title, summary, svg: svg ?? '', ...(cautions?.length ? { cautions } : {}) },
      equilibriumTempC: f.equilibriumTemp_degC, holdHoursPerDay: f.holdHoursPerDay_h, holdNote: f.holdNote, measuredDay: f.measuredDay ?? null,
    };
  });
}

/**
 * A cost block's season, kept in the block cache under what it reads: its own settings and the
 * forecast block's (by hash), that block's saved fit (id and version: immutable) and its rig's
 * build cost. SI: no units.
 */
async function seasonBody(ctx: BlockContext, block: StudyBlock) {
  const fb = seasonForecastBlock(costBlockData.parse(block.data), ctx.study.blocks);
  const fits = ctx.fits ?? (await blockFits(ctx.em, ctx.lab, [fb]));
  const fit = typeof fb.data.fitId === 'string' ? fits.get(fb.data.fitId) : undefined;
  // the rig's build cost (mutable details) stands in for a build price the season does not give
  const rig = fit ? await ctx.em.findOne(Rig, { id: fit.rig.id }) : null;
  const key = blockCacheKey(['cost-season', jsonHash(block.data), jsonHash(fb.data), fit ? `${fit.id}@${fit.version}` : 'no-fit', String(rig?.details?.buildCost ?? '')]);
  return cachedBlockData(ctx.em, key, { labId: ctx.lab.id, fitId: fit?.id ?? null }, async () => (await costSeason(ctx.em, ctx.lab, block.data, ctx.study.blocks))!);
}

/**
 * A tub-fill block: a saved coil fit (immutable) and the block's settings, kept in the block cache
 * under the fit's id and version, the settings' hash and the units; cheap (closed forms and a
 * bisection), so it runs here rather than in the analysis pool. Bad settings become a note.
 */
async function tubFillBody(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const d = block.data;
  const fits = ctx.fits ?? (await blockFits(ctx.em, ctx.lab, [block]));
  const fit = typeof d.fitId === 'string' ? fits.get(d.fitId) : undefined;
  if (!fit) return { type: 'note', tone: 'muted', message: 'No saved coil fit chosen for this tub fill yet.' };
  const head: FitHead = { fitId: ctx.publicView ? null : fit.id, title: fit.title, version: fit.version, label: modelLabel(fit.model), reviewState: fit.reviewState };
  try {
    const key = blockCacheKey(['tub-fill-block', fit.id, fit.version, jsonHash(d), ctx.units]);
    const fill = await cachedBlockData(ctx.em, key, { labId: ctx.lab.id, fitId: fit.id }, async () => tubFillOfFit(await withResult(ctx.em, fit), d));
    return { type: 'tub-fill', head, fill };
  } catch (e) {
    if ((e instanceof DomainError && e.kind === 'invalid') || e instanceof InputError) return { type: 'note', tone: 'danger', message: `This tub fill cannot be computed: ${e.message}` };
    throw e;
  }
}

/** A saved design comparison of the study's lab, recomputed (app/_lib/comparisons). */
async function designComparisonBody(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const c = isUuid(block.data.comparisonId) ? await comparisonInLab(ctx.em, ctx.lab, block.data.comparisonId) : null;
  if (!c) return { type: 'note', tone: 'muted', message: isUuid(block.data.comparisonId) ? 'The design comparison of this block no longer exists.' : 'No design comparison chosen for this block yet.' };
  try {
    return { type: 'design-comparison', comparisonId: ctx.publicView ? null : c.id, view: await readComparison(ctx.em, c, ctx.units, { publicView: ctx.publicView }) };
  } catch (e) {
    if (e instanceof DomainError && e.kind === 'invalid') return { type: 'note', tone: 'danger', message: `This comparison cannot be computed: ${e.message}` };
    throw e;
  }
}

/**
 * An operating plan of the study's lab with the cautions the checker raises now. A plan can be
 * edited, so the block is read each time and never kept in the block cache (the checker is cheap).
 */
async function operatingPlanBody(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const row = await planInLab(ctx.em, ctx.lab, block.data.planId);
  if (!row) return { type: 'note', tone: 'muted', message: isUuid(block.data.planId) ? 'The operating plan of this block no longer exists.' : 'No operating plan chosen for this block yet.' };
  const { steps, loop, cautions } = planDto(row);
  return {
    type: 'operating-plan', planId: ctx.publicView ? null : row.id, rigId: ctx.publicView ? null : row.rig.id,
    name: row.name, rigName: row.rig.name, updatedAt: row.updatedAt.toISOString(), plan: { steps, loop, cautions },
  };
}

async function body(ctx: BlockContext, block: StudyBlock): Promise<BlockBody> {
  const d = block.data;
  switch (block.kind) {
    case 'text':
      return { type: 'text', html: renderMarkdown(String(d.markdown ?? '')) };
    case 'caution':
      return { type: 'caution', items: [...(typeof d.text === 'string' && d.text.trim() ? [d.text.trim()] : []), ...STANDING_CAUTIONS] };
    case 'forecast':
      try {
        return await forecastBody(ctx, block);
      } catch (e) {
        if (e instanceof DomainError && e.kind === 'unavailable') throw e;
        return { type: 'note', tone: 'danger', message: `This forecast cannot be computed: ${(e as Error).message}` };
      }
    case 'costs':
      try {
        const cost = costView(d, ctx.study.blocks);
        return { type: 'costs', cost: d.season ? { ...cost, season: await seasonBody(ctx, block) } : cost };
      } catch (e) {
        if (e instanceof DomainError && e.kind === 'invalid') return { type: 'note', tone: 'danger', message: `This cost sheet cannot be computed: ${e.message}` };
        if (e instanceof InputError) return { type: 'note', tone: 'danger', message: `This cost sheet’s season cannot be computed: its forecast block says ${e.message}` };
        throw e;
      }
    case 'sensor-log':
      return sensorLogBody(ctx, block);
    case 'tub-fill':
      return tubFillBody(ctx, block);
    case 'design-comparison':
      return designComparisonBody(ctx, block);
    case 'operating-plan':
      return operatingPlanBody(ctx, block);
    default: {
      if (!FIT_KINDS.has(block.kind)) return { type: 'note', tone: 'muted', message: 'This block kind is not shown yet.' };
      const fitId = typeof d.fitId === 'string' ? d.fitId : null;
      const fits = ctx.fits ?? (await blockFits(ctx.em, ctx.lab, [block]));
      const fit = fitId ? fits.get(fitId) : undefined;
      if (!fit) return { type: 'note', tone: 'muted', message: 'No saved fit chosen for this block yet.' };
      return fitBody(ctx, block.kind, fit);
    }
  }
}

/** One block, ready to show. */
export async function blockData(ctx: BlockContext, block: StudyBlock): Promise<BlockData> {
  return { id: block.id, kind: block.kind, units: ctx.units, body: await body(ctx, block) };
}

/**
 * Every block of the study, in order (the fits they use loaded once). The blocks are built side
 * by side: what is not in the block cache is computed in the analysis pool, a thread per core.
 */
export async function studyBlocksData(ctx: Omit<BlockContext, 'fits'>): Promise<BlockData[]> {
  const full: BlockContext = { ...ctx, fits: await blockFits(ctx.em, ctx.lab, ctx.study.blocks) };
  return Promise.all(ctx.study.blocks.map((b) => blockData(full, b)));
}

/** The lab's imported sensor logs (files with logged samples), newest first, for the editor's picker. */
export async function sensorLogsOf(em: EntityManager, lab: LabRow): Promise<{ id: string; label: string }[]> {
  const rows = await em.getConnection().execute<{ id: string; filename: string; rows_imported: number; rig: string }[]>(
    `SELECT f.id, f.filename, f.rows_imported, r.name AS rig FROM source_file f JOIN rig r ON r.id = f.rig_id
      WHERE f.lab_id = ? AND f.state = 'imported' AND EXISTS (SELECT 1 FROM sensor_sample s WHERE s.source_file_id = f.id)
      ORDER BY f.created_at DESC LIMIT 100`,
    [lab.id],
  );
  return rows.map((r) => ({ id: r.id, label: `${r.rig}: ${r.filename} (${Number(r.rows_imported).toLocaleString('en-US')} samples)` }));
}
