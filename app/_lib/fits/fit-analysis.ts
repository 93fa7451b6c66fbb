import 'server-only';
import { createHash } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Trial, type RigRow, type TrialRow } from '@/entities';
import { compareModels, type FitSuccess } from '@/analysis/fit';
import { chooseFlow } from '@/analysis/performance/choose-flow';
import { performanceTable } from '@/analysis/performance/performance-table';
import { trialWaterProperties } from '@/analysis/water/trial-water';
import { plotToSvg } from '../plots/plot-svg';
import { fitCurveInputFromFits, fitCurvePlot, heatInputFromFit, heatPlot, residualInputFromFit, residualPlots, type PlotFigure } from '../plots';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { DomainError } from '../server/errors';
import pkg from '@/package.json';

export const SOFTWARE_VERSION = `emberline ${pkg.version}`;

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
export function fitData(trials: readonly Pick<TrialRow, 'flowM3PerS' | 'inletTempC' | 'outletTempC'>[]) {
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

const svgOf = (f: PlotFigure) => ({ title: f.title, summary: f.summary, svg: plotToSvg(f.options), ...(f.cautions?.length ? { cautions: f.cautions } : {}) });

/** Everything the fit page shows, computed on the server from the stored trials. */
export async function analyze(em: EntityManager, rig: RigRow, input: AnalyzeInput, units: UnitSystem) {
  const used = await trialsForFit(em, rig, input.trialIds);
  if (used.length < 2) throw new DomainError('invalid', 'too_few', 'Pick at least two included trials to fit.');
  const excluded = input.trialIds ? [] : await em.find(Trial, { rig, excluded: true });
  const data = fitData(used);
  const comparison = compareModels({ ...data, measurementSD: input.measurementSdK }, input.models.map((m) => ({ label: modelLabel(m), model: m })));
  const okFits = comparison.ranking.filter((r) => r.ok && r.fit) as (typeof comparison.ranking[number] & { fit: FitSuccess })[];
  const meanTin = data.covariates.Tin.reduce((a, b) => a + b, 0) / data.covariates.Tin.length;
  const planInletC = input.planInletC ?? Math.round(meanTin * 10) / 10;
  const labels = used.map((t) => t.startedAt.toISOString().slice(0, 16).replace('T', ' '));
  const excludedPts = excluded.map((t) => ({ flowM3PerS: t.flowM3PerS, outletTempC: t.outletTempC, label: 'excluded' }));
  let plots: Record<string, { title: string; summary: string; svg: string; cautions?: PlotFigure['cautions'] }> = {};
  let choice = null;
  let performance = null;
  const primary = okFits[0]?.fit;
  if (primary) {
    choice = chooseFlow(primary, planInletC);
    const [lo, hi] = primary.xRange;
    const steps = Array.from({ length: 8 }, (_, i) => lo + ((hi * 1.25 - lo) * i) / 7);
    performance = performanceTable(primary, steps, planInletC);
    const curve = fitCurvePlot(fitCurveInputFromFits(okFits.map((r) => ({ label: r.label, fit: r.fit })), { excluded: excludedPts, labels, inletTempC: planInletC }), units);
    const res = residualPlots(residualInputFromFit(primary, { labels, times: used.map((t) => t.startedAt) }), units);
    const heat = heatPlot(heatInputFromFit(primary, { inletTempC: planInletC, choice, excluded: excludedPts, labels }), units);
    plots = { curve: svgOf(curve), heat: svgOf(heat), resFlow: svgOf(res.vsFlow), resFitted: svgOf(res.vsFitted), resOrder: svgOf(res.vsOrder), qq: svgOf(res.qq) };
  }
  return {
    trialIds: used.map((t) => t.id),
    trialsHash: trialsHash(used),
    n: used.length,
    planInletC,
    measurementSdK: input.measurementSdK,
    comparison: {
      best: comparison.best,
      verdict: comparison.verdict,
      ranking: comparison.ranking.map((r) => ({
        label: r.label,
        model: r.model,
        ok: r.ok,
        reason: r.reason,
        aicc: r.aicc,
        deltaAicc: r.deltaAicc,
        akaikeWeight: r.akaikeWeight,
        residualSD: r.residualSD,
        sdRatio: r.sdRatio,
        runsP: r.runs?.pValue ?? null,
        patterned: r.patterned,
        verdict: r.verdict,
      })),
    },
    fits: okFits.map((r) => summarizeFit(r.model, r.label, r.fit)),
    choice,
    performance,
    plots,
  };
}

/** The parts of a fit a page, a saved record and an export need (no internal solver data). */
export function summarizeFit(model: string, label: string, f: FitSuccess) {
  return {
    model,
    label,
    expression: f.expression,
    params: f.params,
    parameterNames: f.parameterNames,
    covariance: f.covariance,
    correlation: f.correlation,
    n: f.n,
    p: f.p,
    df: f.df,
    rss: f.rss,
    residualSD: f.residualSD,
    r2: f.r2,
    adjustedR2: f.adjustedR2,
    rmse: f.rmse,
    aic: f.aic,
    aicc: f.aicc,
    bic: f.bic,
    level: f.level,
    fitted: f.fitted,
    residuals: f.residuals,
    studentizedResiduals: f.studentizedResiduals,
    leverage: f.leverage,
    cooksDistance: f.cooksDistance,
    flags: f.flags,
    iterations: f.iterations,
    converged: f.converged,
    stoppingReason: f.stoppingReason,
    xRange: f.xRange,
    lackOfFit: f.lackOfFit,
    warnings: f.warnings,
  };
}
export type FitSummary = ReturnType<typeof summarizeFit>;
export type Analysis = Awaited<ReturnType<typeof analyze>>;
