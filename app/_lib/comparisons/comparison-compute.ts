/**
 * The pure part of a design comparison, run in the analysis worker pool (app/_lib/analysis-worker,
 * task `designComparison`): each design fitted on its own (`fitModel`), every design against the
 * first with `compareDesigns` (UA ratio and Ts difference by the delta method with a paired
 * residual bootstrap check, delivered heat at the common inlet and flow, the verdict in words),
 * the overlaid curves, and the heat per metre of tube, per m² of collector and per unit of build
 * cost where the rigs record them. Structured-cloneable data in and out; no `server-only`,
 * entities or ORM here (comparison-view.ts loads the data).
 */
import { fitModel, type FitSuccess } from '@/analysis/fit';
import { compareDesigns, type DesignData, type DeltaInterval } from '@/analysis/compare/compare-designs';
import { performanceTable } from '@/analysis/performance/performance-table';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit } from '@/app/_contracts/units';
import { modelLabel } from '@/app/_contracts/models';
import type { DesignComparisonView, DesignView, IntervalView, PairView } from '@/app/_contracts/design-comparison';
import type { PlotView } from '@/app/_contracts/study-blocks';
import { comparisonPlots } from '../plots/comparison';
import { plotToSvg } from '../plots/plot-svg';
import type { PlotFigure } from '../plots';
import { invalid } from '../server/errors';

const KEYS = ['A', 'B', 'C', 'D', 'E', 'F'];
/** Bootstrap resamples per pair: fewer for large datasets (bounded work per task). */
const resamplesFor = (points: number) => (points > 600 ? 60 : points > 200 ? 120 : 200);

/** One design as the task takes it: its names, its trials in the fit's SI form, and the rig's records. */
export interface DesignInput {
  label: string;
  kind: 'rig' | 'fit';
  id: string | null;
  rigId: string | null;
  rigName: string;
  model: string;
  data: DesignData;
  tubeLengthM: number | null;
  collectorAreaM2: number | null;
  buildCost: { amount: number; currency: string } | null;
}

/** The task's input. */
export interface ComparisonTaskInput {
  title: string;
  designs: DesignInput[];
  /** designs that could not be loaded, in words */
  problems: string[];
  inletTempC?: number;
  flowM3PerS?: number;
  units: UnitSystem;
  /** false: no bootstrap and no plots (a check before saving) */
  plots: boolean;
}

interface Design extends DesignInput { key: string; fit: FitSuccess }

const iv = (d: DeltaInterval | null, boot: { ciLow: number; ciHigh: number } | null | undefined): IntervalView | null =>
  d && { value: d.value, ciLow: d.ciLow, ciHigh: d.ciHigh, bootstrap: boot ?? null };
const svg = (f: PlotFigure): PlotView => ({ title: f.title, summary: f.summary, svg: plotToSvg(f.options), ...(f.cautions?.length ? { cautions: f.cautions } : {}) });

/**
 * The comparison. Designs that cannot be fitted are named in `problems`; the others are compared
 * when at least two remain.
 * @throws DomainError invalid when fewer than two designs can be fitted (naming why)
 */
export function computeComparison(input: ComparisonTaskInput): DesignComparisonView {
  const problems = [...input.problems];
  const units = input.units;
  const designs: Design[] = [];
  for (const d of input.designs) {
    const f = fitModel({ ...d.data, model: d.model, level: 0.95 });
    if (!f.ok) {
      problems.push(`${d.label}: the ${modelLabel(d.model)} model cannot be fitted (${f.reason})`);
      continue;
    }
    designs.push({ ...d, key: KEYS[designs.length], fit: f });
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
      bootstrap: !input.plots ? false : { resamples: resamplesFor(ref.data.x.length + d.data.x.length), seed: 1 },
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
    const tube = d.tubeLengthM, area = d.collectorAreaM2, cost = d.buildCost?.amount ?? null;
    return {
      key: d.key, label: d.label, kind: d.kind, id: d.id, rigId: d.rigId, rigName: d.rigName,
      model: d.model, modelLabel: modelLabel(d.model), n: d.fit.n, residualSD: d.fit.residualSD, flowRangeM3PerS: d.fit.xRange, maxOutletC: Math.max(...d.data.y),
      params: d.fit.parameterNames.map((k) => ({ name: k, value: d.fit.params[k].value, stdErr: d.fit.params[k].stdErr, ciLow: d.fit.params[k].ciLow, ciHigh: d.fit.params[k].ciHigh })),
      heatW: { value: row.heatW, ciLow: row.heatCiW[0], ciHigh: row.heatCiW[1] },
      tubeLengthM: tube, collectorAreaM2: area, buildCost: d.buildCost,
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
  const figs = !input.plots ? null : comparisonPlots(designs.map((d) => ({ key: d.key, label: d.label, fit: d.fit })), inletTempC, flowM3PerS, units);
  const empty: PlotView = { title: '', summary: '', svg: '' };
  for (const p of pairs) for (const n of p.notes) if (/different models|fitted with the/.test(n) && !notes.includes(n)) notes.push(n);
  return {
    title: input.title, inletTempC, flowM3PerS, level: 0.95, designs: views, pairs, heatTable,
    plots: figs ? { outlet: svg(figs.outlet), heat: svg(figs.heat) } : { outlet: empty, heat: empty },
    verdict: pairs.map((p) => p.verdict).join(' '), notes, problems,
  };
}
