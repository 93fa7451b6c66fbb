import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { Fit, type FitRow, type LabRow, type RigRow, type UserRow } from '@/entities';
import type { FitKind } from '@/entities/fit';
import { DomainError } from '../server/errors';
import { DEFAULT_MEASUREMENT_SD_K, MAX_FIT_TRIALS, SOFTWARE_VERSION, fitData, modelLabel, trialsForFit, trialsHash } from './fit-analysis';
import { parseStoredFit } from './stored-fit';
import { collectorModelLabel, parseStoredCollectorFit } from './collector-analysis';
import { runAnalysis } from '../server/analysis-pool';

export const saveFitInput = z
  .object({
    title: z.string().trim().min(1, 'Give the fit a title.').max(160),
    model: z.string().trim().min(1).max(400),
    trialIds: z.array(z.string().uuid()).min(2).max(MAX_FIT_TRIALS),
    compareWith: z.array(z.string().trim().min(1).max(400)).max(5).default([]),
    measurementSdK: z.number().positive().max(20).default(DEFAULT_MEASUREMENT_SD_K),
    planInletC: z.number().min(0).max(99).optional(),
  })
  .strict();

/**
 * Saves a fit as an immutable record. The numbers are recomputed here from the stored trials
 * (never taken from the browser); a fit of the same title on the same rig becomes its next version.
 */
export async function saveFit(em: EntityManager, rig: RigRow, user: UserRow, input: z.infer<typeof saveFitInput>): Promise<FitRow> {
  const trials = await trialsForFit(em, rig, input.trialIds);
  const data = fitData(trials);
  const meanTin = data.covariates.Tin.reduce((a, b) => a + b, 0) / trials.length;
  const planInletC = input.planInletC ?? Math.round(meanTin * 10) / 10;
  const computed = await runAnalysis('saveFit', {
    data,
    model: input.model,
    compareWith: input.compareWith,
    measurementSdK: input.measurementSdK,
    planInletC,
    trials: trials.map((t) => ({ id: t.id, startedAt: t.startedAt.toISOString(), flowM3PerS: t.flowM3PerS, inletTempC: t.inletTempC, outletTempC: t.outletTempC, bucketVolumeM3: t.bucketVolumeM3, fillTimesS: t.fillTimesS, ambientTempC: t.ambientTempC, notes: t.notes })),
  });
  if (!computed.ok) throw new DomainError('invalid', 'fit_failed', `The ${modelLabel(input.model)} model cannot be fitted to these trials: ${computed.reason}`);
  const previous = await em.findOne(Fit, { rig, title: input.title }, { orderBy: { version: 'desc' } });
  const row = em.create(Fit, {
    lab: rig.lab,
    rig,
    createdBy: user,
    title: input.title,
    version: (previous?.version ?? 0) + 1,
    previous: previous ?? null,
    model: input.model,
    trialIds: trials.map((t) => t.id),
    trialsHash: trialsHash(trials),
    settings: { measurementSdK: input.measurementSdK, planInletC, compareWith: input.compareWith, x: 'volume flow, m³/s', y: 'outlet temperature, °C' },
    result: computed.result as unknown as Record<string, unknown>,
    softwareVersion: SOFTWARE_VERSION,
  });
  await em.flush();
  return row;
}

/** A saved fit as lists load it (`fitsOfLab`): without its stored result and settings. */
export type ListedFit = Omit<FitRow, 'result' | 'settings'>;

export const fitListDto = (f: ListedFit) => ({
  id: f.id,
  rigId: f.rig.id,
  title: f.title,
  version: f.version,
  kind: f.kind,
  model: f.model,
  modelLabel: f.kind === 'collector' ? collectorModelLabel(f.model) : modelLabel(f.model),
  n: f.trialIds.length,
  reviewState: f.reviewState,
  createdAt: f.createdAt.toISOString(),
  createdBy: f.createdBy?.name ?? null,
});

export const fitDto = (f: FitRow) => ({
  ...fitListDto(f), trialIds: f.trialIds, trialsHash: f.trialsHash, settings: f.settings,
  result: f.kind === 'collector' ? parseStoredCollectorFit(f.result, f.id) : parseStoredFit(f.result, f.id), softwareVersion: f.softwareVersion,
});

/**
 * A lab's saved fits, newest first, for lists and pickers: without their stored results and
 * settings (tens of kB of JSON each, which no list shows; `fitDto` needs a fit loaded by id).
 * `kind` keeps heater or collector fits only, `model` one model.
 */
export const fitsOfLab = (em: EntityManager, lab: LabRow, opts: { limit?: number; model?: string; kind?: FitKind } = {}) =>
  em.find(Fit, { lab, ...(opts.model ? { model: opts.model } : {}), ...(opts.kind ? { kind: opts.kind } : {}) }, { populate: ['rig', 'createdBy'], exclude: ['result', 'settings'], orderBy: { createdAt: 'desc' }, limit: opts.limit ?? 200 });


/**
 * The figures of a saved fit's page as server SVG (the curve at its planning inlet, the heat
 * curve, the four residual plots), drawn in the analysis pool.
 */
export function savedFitPageFigures(row: FitRow, units: UnitSystem) {
  const r = parseStoredFit(row.result, row.id);
  return runAnalysis('savedFitFigures', { fit: r.fit, label: modelLabel(row.model), inletTempC: r.choice.inletTempC, choice: r.choice, times: r.trials.map((t) => t.startedAt), units });
}
