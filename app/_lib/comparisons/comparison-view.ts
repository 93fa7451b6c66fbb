import 'server-only';
/**
 * A design comparison recomputed from the stored trials: the designs' data loaded here (a rig's
 * included trials, or a saved fit's stored trials, in the fit's SI form), the numbers and plots
 * computed off the request thread by the analysis pool (task `designComparison`,
 * comparison-compute.ts).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { Trial } from '@/entities';
import { MAX_COMPARE_POINTS, type DesignData } from '@/analysis/compare/compare-designs';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { DesignComparisonView } from '@/app/_contracts/design-comparison';
import { fitData } from '../fits/fit-analysis';
import { parseStoredFit } from '../fits/stored-fit';
import { runAnalysis } from '../server/analysis-pool';
import { blockCacheKey, cachedBlockData, jsonHash } from '../server/block-cache';
import type { DesignInput } from './comparison-compute';
import type { LoadedSubject } from './comparisons';

/** A design's trials in the fit's SI form: a rig's included trials, or a saved fit's stored trials. */
async function designData(em: EntityManager, l: LoadedSubject): Promise<{ data: DesignData; model: string } | string> {
  if (l.fit) {
    const stored = parseStoredFit(l.fit.result, l.fit.id);
    if (stored.trials.length > MAX_COMPARE_POINTS) return `${l.fit.title}: more than ${MAX_COMPARE_POINTS} trials`;
    return { data: fitData(stored.trials), model: l.fit.model };
  }
  const n = await em.count(Trial, { rig: l.rig, excluded: false });
  if (n > MAX_COMPARE_POINTS) return `${l.rig.name}: ${n} included trials; a comparison takes at most ${MAX_COMPARE_POINTS} per design`;
  const trials = await em.find(Trial, { rig: l.rig, excluded: false }, { orderBy: { startedAt: 'asc', id: 'asc' } });
  if (trials.length < 3) return `${l.rig.name}: fewer than three included trials`;
  return { data: fitData(trials), model: l.subject.model ?? 'coil' };
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : null);

/**
 * Builds the comparison. Designs that cannot be loaded or fitted are named in `problems`; the
 * others are compared when at least two remain.
 * @param opts.publicView leave out ids into the lab (share links); opts.plots false skips the bootstrap and the plots (a check only)
 * @throws DomainError invalid when fewer than two designs can be fitted (naming why); unavailable when the analysis pool is full
 */
export async function comparisonView(
  em: EntityManager,
  input: { title: string; loaded: LoadedSubject[]; missing?: string[]; inletTempC?: number; flowM3PerS?: number },
  units: UnitSystem,
  opts: { publicView?: boolean; plots?: boolean } = {},
): Promise<DesignComparisonView> {
  const problems = [...(input.missing ?? [])];
  const designs: DesignInput[] = [];
  for (const l of input.loaded) {
    const d = await designData(em, l);
    if (typeof d === 'string') {
      problems.push(d);
      continue;
    }
    const det = l.rig.details ?? {};
    const cost = num(det.buildCost);
    designs.push({
      label: l.fit ? `${l.fit.title} v${l.fit.version}` : l.rig.name, kind: l.fit ? 'fit' : 'rig',
      id: opts.publicView ? null : (l.fit?.id ?? l.rig.id), rigId: opts.publicView ? null : l.rig.id, rigName: l.rig.name,
      model: d.model, data: d.data, tubeLengthM: num(det.coilLengthM), collectorAreaM2: num(det.collectorAreaM2),
      buildCost: cost ? { amount: cost, currency: typeof det.buildCostCurrency === 'string' && det.buildCostCurrency ? det.buildCostCurrency : 'USD' } : null,
    });
  }
  const task = { title: input.title, designs, problems, inletTempC: input.inletTempC, flowM3PerS: input.flowM3PerS, units, plots: opts.plots !== false };
  const labId = input.loaded[0]?.rig.lab.id;
  if (!task.plots || !labId) return runAnalysis('designComparison', task);
  // the comparison is a pure function of its task, which holds every trial value of every design
  // and the settings: kept under the task's hash (block cache), it is computed once until a trial,
  // a fit or a setting changes, for the study block, the comparison's page and its export alike
  return cachedBlockData(em, blockCacheKey(['design-comparison', jsonHash(task)]), { labId }, () => runAnalysis('designComparison', task));
}
