import 'server-only';
import { createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Trial, type RigRow, type TrialRow } from '@/entities';
import { trialWaterProperties } from '@/analysis/water/trial-water';
import { runAnalysis } from '../server/analysis-pool';
import { DomainError } from '../server/errors';
import type { FitData } from './fit-compute';

export { SOFTWARE_VERSION } from '../server/version';

import { MODEL_CHOICES, modelLabel } from '@/app/_contracts/models';
export { MODEL_CHOICES, modelLabel };

/**
 * Default outlet-temperature uncertainty: a Type T thermocouple at standard limits, ±1.0 °C
 * (ASTM E230, DOMAIN.md §2.2), taken as rectangular: 1.0/√3 = 0.58 K.
 */
export const DEFAULT_MEASUREMENT_SD_K = 1 / Math.sqrt(3);

const uuid = z.string().uuid();
/** Most trials one fit (or one analysis) takes: the work of a fit grows with them. */
export const MAX_FIT_TRIALS = 5000;
export const analyzeInput = z
  .object({
    trialIds: z.array(uuid).max(MAX_FIT_TRIALS).optional(),
    models: z.array(z.string().trim().min(1).max(400)).min(1, 'Pick at least one model.').max(6, 'Compare at most six models at once.'),
    measurementSdK: z.number().positive().max(20).default(DEFAULT_MEASUREMENT_SD_K),
    planInletC: z.number().min(0).max(99).optional(),
  })
  .strict();
export type AnalyzeInput = z.infer<typeof analyzeInput>;

/** The trials a fit uses: the given ids (checked to belong to the rig) or every included trial. */
export async function trialsForFit(em: EntityManager, rig: RigRow, ids?: string[]): Promise<TrialRow[]> {
  if (!ids) {
    const n = await em.count(Trial, { rig, excluded: false });
    if (n > MAX_FIT_TRIALS) {
      throw new DomainError('invalid', 'too_many', `This rig has ${n} included trials; a fit takes at most ${MAX_FIT_TRIALS}. Pick the trials to fit, or exclude some.`, { fields: { trialIds: `at most ${MAX_FIT_TRIALS} trials` } });
    }
  }
  const rows = ids
    ? await em.find(Trial, { rig, id: { $in: ids } }, { orderBy: { startedAt: 'asc', id: 'asc' } })
    : await em.find(Trial, { rig, excluded: false }, { orderBy: { startedAt: 'asc', id: 'asc' } });
  if (ids && rows.length !== new Set(ids).size) throw new DomainError('not_found', 'not_found', 'Some of those trials are not in this rig.');
  return rows;
}

/** SHA-256 of the trial values a fit used, in order: any later edit of those numbers changes it. */
export function trialsHash(trials: TrialRow[]): string {
  const h = createHash('sha256');
  for (const t of trials) h.update(JSON.stringify([t.id, t.flowM3PerS, t.inletTempC, t.outletTempC]) + '\n');
  return h.digest('hex');
}

/**
 * Fit data in SI: x = volume flow m³/s, y = outlet °C, covariates Tin (°C), rho (kg/m³, at the
 * outlet temperature: the bucket holds outlet water, DOMAIN.md §1.1) and cp (J/(kg·K), IAPWS-IF97
 * at the mean of inlet and outlet).
 */
export function fitData(trials: readonly Pick<TrialRow, 'flowM3PerS' | 'inletTempC' | 'outletTempC'>[]): FitData {
  // the water rule of analysis/water/trial-water.ts, on temperatures kept inside liquid water (a
  // trial may record up to 150 °C: the property tables stop at 100 °C)
  const clamp = (t: number) => Math.min(Math.max(t, 0.01), 99.9);
  const water = trials.map((t) => trialWaterProperties(clamp(t.inletTempC), clamp(t.outletTempC)));
  return {
    x: trials.map((t) => t.flowM3PerS),
    y: trials.map((t) => t.outletTempC),
    covariates: {
      Tin: trials.map((t) => t.inletTempC),
      rho: water.map((w) => w.densityKgPerM3),
      cp: water.map((w) => w.cpJPerKgK),
    },
  };
}

/** The detail of an analysis: what the page draws ('display') or every point's diagnostics too ('full'). */
export type AnalyzeDetail = 'display' | 'full';

/**
 * The `?detail=` of the analyze route: absent or `display`, or `full`.
 * @throws DomainError invalid naming the parameter for anything else
 */
export function analyzeDetail(q: string | null): AnalyzeDetail {
  if (q === null || q === 'display') return 'display';
  if (q === 'full') return 'full';
  throw new DomainError('invalid', 'invalid', 'detail must be "display" or "full".', { fields: { detail: 'display or full' } });
}

/**
 * Everything the fit page shows, computed in the analysis pool (fit-compute.ts) from the stored
 * trials: the comparison, the fitted models' tables, the flow choice and performance table at the
 * planning inlet, and the plot builders' inputs, reduced for display, for the browser to draw.
 * @throws DomainError invalid (fewer than two trials, too many), not_found (trials of another rig), unavailable (the pool is full)
 */
export async function analyze(em: EntityManager, rig: RigRow, input: AnalyzeInput, detail: AnalyzeDetail = 'display') {
  const used = await trialsForFit(em, rig, input.trialIds);
  if (used.length < 2) throw new DomainError('invalid', 'too_few', 'Pick at least two included trials to fit.');
  const excluded = input.trialIds ? [] : await em.find(Trial, { rig, excluded: true }, { fields: ['flowM3PerS', 'outletTempC'], limit: MAX_FIT_TRIALS });
  const data = fitData(used);
  const meanTin = data.covariates.Tin.reduce((a, b) => a + b, 0) / data.covariates.Tin.length;
  const planInletC = input.planInletC ?? Math.round(meanTin * 10) / 10;
  const computed = await runAnalysis('analyze', {
    data,
    models: input.models,
    measurementSdK: input.measurementSdK,
    planInletC,
    labels: used.map((t) => t.startedAt.toISOString().slice(0, 16).replace('T', ' ')),
    times: used.map((t) => t.startedAt.toISOString()),
    excluded: excluded.map((t) => ({ flowM3PerS: t.flowM3PerS, outletTempC: t.outletTempC, label: 'excluded' })),
    detail,
  });
  return { trialIds: used.map((t) => t.id), trialsHash: trialsHash(used), ...computed };
}
export type Analysis = Awaited<ReturnType<typeof analyze>>;
