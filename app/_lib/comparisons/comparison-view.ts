import 'server-only';
/**
 * The numbers and plots of a design comparison, recomputed from the stored trials: each design
 * fitted on its own (`fitModel`), every design against the first with `compareDesigns` (UA ratio
 * and Ts difference by the delta method with a paired residual bootstrap check, delivered heat at
 * the common inlet and flow, the verdict in words), the overlaid curves, and the heat per metre
 * of tube, per m² of collector and per unit of build cost where the rigs record them.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { Trial } from '@/entities';
import { fitModel, type FitSuccess } from '@/analysis/fit';
import { compareDesigns, MAX_COMPARE_POINTS, type DesignData, type DeltaInterval } from '@/analysis/compare/compare-designs';
import { performanceTable } from '@/analysis/performance/performance-table';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit } from '@/app/_contracts/units';
import type { DesignComparisonView, DesignView, IntervalView, PairView } from '@/app/_contracts/design-comparison';
import type { PlotView } from '@/app/_contracts/study-blocks';
import { fitData, modelLabel } from '../fits/fit-analysis';
import { parseStoredFit } from '../fits/stored-fit';
import { comparisonPlots } from '../plots/comparison';
import { plotToSvg } from '../plots/plot-svg';
import type { PlotFigure } from '../plots';
import { invalid } from '../server/errors';
import type { LoadedSubject } from './comparisons';

const KEYS = ['A', 'B', 'C', 'D', 'E', 'F'];
/** Bootstrap resamples per pair: fewer for large datasets (bounded work per request). */
const resamplesFor = (points: number) => (points > 600 ? 60 : points > 200 ? 120 : 200);

interface Design { key: string; label: string; loaded: LoadedSubject; model: string; data: DesignData; fit: FitSuccess }

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

const iv = (d: DeltaInterval | null, boot: { ciLow: number; ciHigh: number } | null | undefined): IntervalView | null =>
  d && { value: d.value, ciLow: d.ciLow, ciHigh: d.ciHigh, bootstrap: boot ?? null };
const svg = (f: PlotFigure): PlotView => ({ title: f.title, summary: f.summary, svg: plotToSvg(f.options), ...(f.cautions?.length ? { cautions: f.cautions } : {}) });
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : null);

/**
 * Builds the comparison. Designs that cannot be loaded or fitted are named in `problems`; the
 * others are compared when at least two remain.
 * @param opts.publicView leave out ids into the lab (share links); opts.plots false skips the bootstrap and the plots (a check only)
 * @throws DomainError invalid when fewer than two designs can be fitted (naming why)
 */
export async function comparisonView(
  em: EntityManager,
  input: { title: string; loaded: LoadedSubject[]; missing?: string[]; inletTempC?: number; flowM3PerS?: number },
  units: UnitSystem,
  opts: { publicView?: boolean; plots?: boolean } = {},
): Promise<DesignComparisonView> {
  const problems = [...(input.missing ?? [])];
  const designs: Design[] = [];
  for (const l of input.loaded) {
    const label = l.fit ? `${l.fit.title} v${l.fit.version}` : l.rig.name;
    const d = await designData(em, l);
    if (typeof d === 'string') {
      problems.push(d);
      continue;
    }
    const f = fitModel({ ...d.data, model: d.model, level: 0.95 });
    if (!f.ok) {
      problems.push(`${label}: the ${modelLabel(d.model)} model cannot be fitted (${f.reason})`);
      continue;
    }
    designs.push({ key: KEYS[designs.length], label, loaded: l, model: d.model, data: d.data, fit: f });
  }
  if (designs.length < 2) throw invalid(`A comparison needs two designs that can be fitted. ${problems.join('; ')}`.trim(), { subjects: problems.join('; ') || 'fewer than two designs' });

  // common conditions: the mean inlet of all trials (to 0.5 °C), the middle of the flows every design was tested at (to 0.5 L/min)
  const tins = designs.flatMap((d) => d.data.covariates.Tin);
  const inletTempC = input.inletTempC ?? Math.round((2 * tins.reduce((a, b) => a + b, 0)) / tins.length) / 2;
  let lo = Math.max(...designs.map((d) => d.fit.xRange[0])), hi = Math.min(...designs.map((d) => d.fit.xRange[1]));
  const overlap = hi > lo;
  if (!overlap) [lo, hi] = [Math.min(...designs.map((d) => d.fit.xRange[0])), Math.max(...designs.map((d) => d.fit.xRange[1]))];
  const halfLpm = 1 / 120000;
  const flowM3PerS = input.flowM3PerS ?? Math.max(halfLpm, Math.round((lo + hi) / 2 / halfLpm) * halfLpm);
  const flows = Array.from({ length: 6 }, (_, i) => lo + ((hi - lo) * i) / 5);
  const flowUnit = displayUnit('volumeFlow', units).mathUnit;
  const notes: string[] = [];
  if (!overlap) notes.push('The designs were tested over flows that do not overlap: at every common flow at least one of them is extrapolated.');

  const ref = designs[0];
  const pairs: PairView[] = [];
  for (const d of designs.slice(1)) {
    const r = compareDesigns({
      a: { ...ref.data, model: ref.model }, b: { ...d.data, model: d.model }, labels: [ref.label, d.label], inletTempC,
      flowsM3PerS: [flowM3PerS], verdictFlowM3PerS: flowM3PerS, flowUnit, level: 0.95,
      bootstrap: opts.plots === false ? false : { resamples: resamplesFor(ref.data.x.length + d.data.x.length), seed: 1 },
    });
    if (!r.ok) {
      problems.push(r.reason);
      continue;
    }
    const h = r.heatAt[0];
    pairs.push({
      keys: [ref.key, d.key],
      uaRatio: iv(r.uaRatio, r.bootstrap?.uaRatio), tsDifferenceK: iv(r.tsDifferenceK, r.bootstrap?.tsDifferenceK),
      heatDifferencePercent: iv(h.differencePercent, r.bootstrap?.differencePercent)!,
      verdict: r.verdict, notes: r.notes,
    });
  }

  const heatAt = (d: Design, xs: number[]) => performanceTable(d.fit, xs, inletTempC, { level: 0.95 }).rows;
  const views: DesignView[] = designs.map((d) => {
    const row = heatAt(d, [flowM3PerS])[0];
    const det = d.loaded.rig.details ?? {};
    const tube = num(det.coilLengthM), area = num(det.collectorAreaM2), cost = num(det.buildCost);
    const currency = typeof det.buildCostCurrency === 'string' && det.buildCostCurrency ? det.buildCostCurrency : 'USD';
    return {
      key: d.key, label: d.label, kind: d.loaded.fit ? 'fit' : 'rig',
      id: opts.publicView ? null : (d.loaded.fit?.id ?? d.loaded.rig.id), rigId: opts.publicView ? null : d.loaded.rig.id, rigName: d.loaded.rig.name,
      model: d.model, modelLabel: modelLabel(d.model), n: d.fit.n, residualSD: d.fit.residualSD, flowRangeM3PerS: d.fit.xRange, maxOutletC: Math.max(...d.data.y),
      params: d.fit.parameterNames.map((k) => ({ name: k, value: d.fit.params[k].value, stdErr: d.fit.params[k].stdErr, ciLow: d.fit.params[k].ciLow, ciHigh: d.fit.params[k].ciHigh })),
      heatW: { value: row.heatW, ciLow: row.heatCiW[0], ciHigh: row.heatCiW[1] },
      tubeLengthM: tube, collectorAreaM2: area, buildCost: cost ? { amount: cost, currency } : null,
      heatPerMetreW: tube ? row.heatW / tube : null, heatPerM2W: area ? row.heatW / area : null, heatPerCostW: cost ? row.heatW / cost : null,
      warnings: d.fit.warnings.map((w) => w.message),
    };
  });
  const heatTable = flows.map((q) => {
    const rows = designs.map((d) => {
      try {
        return heatAt(d, [q])[0];
      } catch {
        return null;
      }
    });
    return { flowM3PerS: q, heatW: rows.map((r) => r?.heatW ?? null), extrapolated: rows.some((r) => !r || r.extrapolated) };
  });
  const figs = opts.plots === false ? null : comparisonPlots(designs.map((d) => ({ key: d.key, label: d.label, fit: d.fit })), inletTempC, flowM3PerS, units);
  const empty: PlotView = { title: '', summary: '', svg: '' };
  for (const p of pairs) for (const n of p.notes) if (/different models|fitted with the/.test(n) && !notes.includes(n)) notes.push(n);
  return {
    title: input.title, inletTempC, flowM3PerS, level: 0.95, designs: views, pairs, heatTable,
    plots: figs ? { outlet: svg(figs.outlet), heat: svg(figs.heat) } : { outlet: empty, heat: empty },
    verdict: pairs.map((p) => p.verdict).join(' '), notes, problems,
  };
}
