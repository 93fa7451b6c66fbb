import 'server-only';
/**
 * The collector efficiency test of a solar-collector rig: its trials (irradiance in the collector
 * plane, ambient, inlet, outlet, flow; a log period's spreads from `segment.collectorSpread`)
 * through the ISO 9806 steady-state fit of analysis/performance/collector-test.ts, on the area the
 * engineer names (gross or aperture, from the rig's details), with the plots. Saving keeps the
 * result as an immutable fit of kind `collector` (fits.ts reviews it as any fit).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Fit, type FitRow, type RigRow, type TrialRow, type UserRow } from '@/entities';
import { collectorTest, type CollectorTestResult, type CollectorTrial } from '@/analysis/performance/collector-test';
import { ISO9806_STEADY_LIMITS } from '@/analysis/performance/collector-steadiness';
import type { CollectorParameters } from '@/analysis/performance/collector-efficiency';
import type { CollectorViewDto, SkippedTrialView } from '@/app/_contracts/collector';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { StudyExport } from '../exports';
import { invalid } from '../server/errors';
import { collectorPlots } from '../plots/collector';
import { plotToSvg } from '../plots/plot-svg';
import { MAX_FIT_TRIALS, SOFTWARE_VERSION, trialsForFit, trialsHash } from './fit-analysis';

/** What the collector page posts (bounded). */
export const collectorAnalyzeInput = z
  .object({
    trialIds: z.array(z.string().uuid()).max(MAX_FIT_TRIALS).optional(),
    areaBasis: z.enum(['gross', 'aperture']).default('gross'),
    order: z.union([z.literal(1), z.literal(2)]).default(2),
    uncertainty: z
      .object({
        temperatureDifferenceK: z.number().min(0).max(5, 'the ΔT uncertainty is at most 5 K').optional(),
        flowRelative: z.number().min(0).max(0.5, 'the flow uncertainty is at most 50 %').optional(),
        irradianceRelative: z.number().min(0).max(0.5, 'the irradiance uncertainty is at most 50 %').optional(),
      })
      .strict()
      .optional(),
  })
  .strict();
export type CollectorAnalyzeInput = z.infer<typeof collectorAnalyzeInput>;

export const saveCollectorFitInput = collectorAnalyzeInput.extend({
  title: z.string().trim().min(1, 'Give the fit a title.').max(160),
  trialIds: z.array(z.string().uuid()).min(2).max(MAX_FIT_TRIALS).optional(),
});

/** The model name a collector fit is saved under. */
export const collectorModel = (order: 1 | 2) => `iso9806-steady-order${order}`;

const MODEL_LABELS: Record<string, string> = { 'iso9806-steady-order1': 'ISO 9806 steady state, first order', 'iso9806-steady-order2': 'ISO 9806 steady state, second order' };
export const collectorModelLabel = (model: string) => MODEL_LABELS[model] ?? model;

/** A trial the test could not use, and why (the contract's shape). */
export type SkippedTrial = SkippedTrialView;

const label = (t: TrialRow) => t.startedAt.toISOString().slice(0, 16).replace('T', ' ');

/** The rig's area on the chosen basis (gross falls back to the older `collectorAreaM2`). */
export function collectorArea(rig: RigRow, basis: 'gross' | 'aperture'): number {
  const d = rig.details ?? {};
  const a = basis === 'gross' ? (d.grossAreaM2 ?? d.collectorAreaM2) : d.apertureAreaM2;
  if (!(typeof a === 'number' && a > 0)) {
    throw invalid(`This rig has no ${basis} area: edit the rig and give its ${basis} area in m² (the coefficients are stated per that area).`, { areaBasis: `no ${basis} area on the rig` });
  }
  return a;
}

function spreadOf(t: TrialRow): CollectorTrial['spread'] {
  const s = (t.segment as { collectorSpread?: Record<string, unknown> } | null)?.collectorSpread;
  if (!s || typeof s !== 'object') return undefined;
  const n = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
  return { irradianceWPerM2: n(s.irradianceWPerM2), ambientTempK: n(s.ambientTempK), inletTempK: n(s.inletTempK), flowRelative: n(s.flowRelative) };
}

/** The trials with irradiance and ambient as the test takes them; the others skipped with a reason. */
export function collectorTrials(trials: TrialRow[]) {
  const used: { trial: TrialRow; input: CollectorTrial }[] = [];
  const skipped: SkippedTrial[] = [];
  for (const t of trials) {
    const why = t.irradianceWPerM2 == null ? 'no irradiance' : !(t.irradianceWPerM2 > 0) ? 'irradiance 0 W/m² (no sun: no efficiency)' : t.ambientTempC == null ? 'no ambient temperature' : null;
    if (why) { skipped.push({ id: t.id, label: label(t), reason: why }); continue; }
    used.push({ trial: t, input: { irradianceWPerM2: t.irradianceWPerM2!, inletTempC: t.inletTempC, outletTempC: t.outletTempC, ambientTempC: t.ambientTempC!, flowM3PerS: t.flowM3PerS, windMPerS: t.windMPerS ?? undefined, spread: spreadOf(t) } });
  }
  return { used, skipped };
}

function fluidOf(rig: RigRow) {
  const d = rig.details ?? {};
  return d.fluidCpJPerKgK || d.fluidDensityKgPerM3 ? { cpJPerKgK: d.fluidCpJPerKgK, densityKgPerM3: d.fluidDensityKgPerM3 } : undefined;
}

/** Runs the test; a test that cannot give a curve is a 422 with the reason. */
async function runTest(em: EntityManager, rig: RigRow, input: CollectorAnalyzeInput) {
  if (rig.heatSource !== 'solar-collector') throw invalid('This rig is not a solar collector: the collector efficiency test needs a rig whose heat source is a solar collector.');
  const areaM2 = collectorArea(rig, input.areaBasis);
  const trials = await trialsForFit(em, rig, input.trialIds);
  const { used, skipped } = collectorTrials(trials);
  if (used.length === 0) throw invalid(`None of the ${trials.length} trial(s) has both an irradiance and an ambient temperature: record them with each trial, or import a log with those columns.`, { trialIds: 'no trial with irradiance and ambient' });
  let r: ReturnType<typeof collectorTest>;
  try {
    r = collectorTest({ trials: used.map((u) => u.input), areaM2, areaBasis: input.areaBasis, order: input.order, fluid: fluidOf(rig), uncertainty: input.uncertainty });
  } catch (e) {
    if (e instanceof RangeError || e instanceof TypeError) throw invalid(`The collector test cannot use these trials: ${e.message}`);
    throw e;
  }
  if (!r.ok) throw invalid(`No efficiency curve: ${r.reason}.`, undefined, 'fit_failed', { skipped });
  return { r, used, skipped, areaM2, trials };
}

/** Everything the collector page shows (nothing stored). */
export async function analyzeCollector(em: EntityManager, rig: RigRow, input: CollectorAnalyzeInput) {
  const { r, used, skipped } = await runTest(em, rig, input);
  return collectorView(r, used.map((u) => ({ id: u.trial.id, label: label(u.trial) })), skipped);
}

/** The page's view of a test result (also what a saved collector fit shows). */
export function collectorView(r: CollectorTestResult, trials: { id: string; label: string }[], skipped: SkippedTrial[]): CollectorViewDto {
  const excluded = r.excluded.map((e) => ({ trialId: trials[e.index]?.id ?? null, label: trials[e.index]?.label ?? `trial ${e.index + 1}`, reasons: e.reasons }));
  const labels = r.points.map((p) => trials[p.index]?.label ?? `trial ${p.index + 1}`);
  const figs = collectorPlots(r, labels, excluded.map((e) => ({ label: e.label, efficiency: null, xM2KPerW: null, reasons: e.reasons })));
  const svg = (f: { title: string; summary: string; options: Parameters<typeof plotToSvg>[0] }) => ({ title: f.title, summary: f.summary, svg: plotToSvg(f.options) });
  return {
    areaBasis: r.areaBasis,
    areaM2: r.areaM2,
    eta0: r.eta0,
    a1WPerM2K: r.a1WPerM2K,
    a2WPerM2K2: r.a2WPerM2K2,
    parameterNames: r.parameterNames,
    covariance: r.covariance,
    n: r.n,
    df: r.df,
    r2: r.r2,
    residualSD: r.residualSD,
    weighted: r.weighted,
    level: r.level,
    xRangeM2KPerW: r.xRangeM2KPerW,
    bandIrradianceWPerM2: r.bandIrradianceWPerM2,
    points: r.points.map((p, i) => ({ ...p, trialId: trials[p.index]?.id ?? null, label: labels[i] })),
    excluded,
    skipped,
    limits: ISO9806_STEADY_LIMITS,
    warnings: r.warnings,
    plots: { curve: svg(figs.curve), resX: svg(figs.resX), resOrder: svg(figs.resOrder) },
  };
}

/** What a saved collector fit keeps in `Fit.result` (the test result, plain JSON, and its trials). */
export interface StoredCollectorFit {
  test: CollectorTestResult;
  trials: { id: string; label: string }[];
  skipped: SkippedTrial[];
}

const storedCollectorSchema = z.looseObject({
  test: z.looseObject({
    ok: z.literal(true),
    areaBasis: z.enum(['gross', 'aperture']),
    areaM2: z.number().positive(),
    eta0: z.looseObject({ value: z.number(), stdErr: z.number() }),
    a1WPerM2K: z.looseObject({ value: z.number(), stdErr: z.number() }),
    a2WPerM2K2: z.looseObject({ value: z.number(), stdErr: z.number() }),
    covariance: z.array(z.array(z.number())),
    n: z.number().int().positive(),
    points: z.array(z.looseObject({ index: z.number().int(), efficiency: z.number(), xM2KPerW: z.number(), residual: z.number() })),
    band: z.array(z.looseObject({ xM2KPerW: z.number(), efficiency: z.number(), ciLow: z.number(), ciHigh: z.number() })),
    excluded: z.array(z.looseObject({ index: z.number().int(), reasons: z.array(z.string()) })),
    warnings: z.array(z.string()),
  }),
  trials: z.array(z.looseObject({ id: z.string(), label: z.string() })),
  skipped: z.array(z.looseObject({ id: z.string(), label: z.string(), reason: z.string() })),
});

/**
 * Reads a collector fit's stored result.
 * @throws Error naming the fit when the stored result does not have the shape saveCollectorFit writes
 */
export function parseStoredCollectorFit(result: unknown, fitId: string | null = null): StoredCollectorFit {
  const p = storedCollectorSchema.safeParse(result);
  if (!p.success) throw new Error(`The stored result of ${fitId ? `collector fit ${fitId}` : 'a collector fit'} is malformed (${p.error.issues.slice(0, 3).map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}).`);
  return p.data as unknown as StoredCollectorFit;
}

/** The coefficients of a saved collector fit for `solarCollectorHeater` (null when unphysical). */
export function collectorParameters(fit: FitRow): CollectorParameters | null {
  const t = parseStoredCollectorFit(fit.result, fit.id).test;
  return t.parameters ?? null;
}

/**
 * Saves a collector test as an immutable fit of kind `collector`, recomputed here from the stored
 * trials (never from the browser); the same title on the same rig makes the next version.
 */
export async function saveCollectorFit(em: EntityManager, rig: RigRow, user: UserRow, input: z.infer<typeof saveCollectorFitInput>): Promise<FitRow> {
  const { r, used, skipped, trials } = await runTest(em, rig, input);
  const previous = await em.findOne(Fit, { rig, title: input.title }, { orderBy: { version: 'desc' } });
  const stored: StoredCollectorFit = JSON.parse(JSON.stringify({ test: r, trials: used.map((u) => ({ id: u.trial.id, label: label(u.trial) })), skipped }));
  const row = em.create(Fit, {
    lab: rig.lab,
    rig,
    createdBy: user,
    kind: 'collector',
    title: input.title,
    version: (previous?.version ?? 0) + 1,
    previous: previous ?? null,
    model: collectorModel(input.order),
    trialIds: trials.map((t) => t.id),
    trialsHash: trialsHash(trials),
    settings: { areaBasis: input.areaBasis, areaM2: r.areaM2, order: input.order, uncertainty: input.uncertainty ?? null, x: '(Tm − Ta)/G, m²·K/W', y: `efficiency on the ${input.areaBasis} area` },
    result: stored as unknown as Record<string, unknown>,
    softwareVersion: SOFTWARE_VERSION,
  });
  await em.flush();
  return row;
}

/** A saved collector fit as its page shows it: the view rebuilt from the stored test. */
export function savedCollectorView(fit: FitRow): CollectorViewDto {
  const s = parseStoredCollectorFit(fit.result, fit.id);
  return collectorView(s.test, s.trials, s.skipped);
}
export type { FitRow as SavedFitRow };

/** A saved collector fit as the workbook's data (Summary and Collector sheets). */
export function collectorFitExport(fit: FitRow, labName: string, unitSystem: UnitSystem): StudyExport {
  const s = parseStoredCollectorFit(fit.result, fit.id);
  return {
    unitSystem,
    provenance: {
      lab: labName, rig: fit.rig.name, fitId: fit.id, fitVersion: fit.version, model: collectorModelLabel(fit.model),
      fitTime: fit.createdAt, softwareVersion: fit.softwareVersion, dataHash: fit.trialsHash,
      settings: { 'area basis': `${s.test.areaBasis} (${s.test.areaM2} m²)`, 'confidence level': s.test.level ?? 0.95 },
    },
    collectors: [{ label: fit.title, test: s.test, trialLabels: s.test.points.map((p) => s.trials[p.index]?.label ?? `trial ${p.index + 1}`) }],
    notes: [`Review state: ${fit.reviewState}.`, ...s.skipped.map((k) => `Trial ${k.label} not used: ${k.reason}.`)],
  };
}
