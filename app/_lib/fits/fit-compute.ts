/**
 * The CPU work of fits, as pure functions of plain data (no database, no request): they run in
 * the analysis worker pool (app/_lib/analysis-worker, started by app/_lib/server/analysis-pool.ts),
 * so this file and everything it imports stay free of `server-only`, entities and the ORM.
 * `fit-analysis.ts` and `fits.ts` load and authorize, then hand these the numbers.
 */
import { compareModels, type FitSuccess } from '@/analysis/fit';
import { chooseFlow } from '@/analysis/performance/choose-flow';
import { performanceTable } from '@/analysis/performance/performance-table';
import { DISPLAY_MAX_POINTS, reduceForDisplay } from '@/analysis/reduce';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { modelLabel } from '@/app/_contracts/models';
import type { FitView } from '@/app/_contracts/fit-report';
import type { PlotView } from '@/app/_contracts/study-blocks';
import type { AnalyzePlots } from '@/app/_contracts/analyze';
import { fitCurveInputFromFits, heatInputFromFit, residualInputFromFit } from '../plots/adapters';
import { fitCurvePlot, heatPlot, residualPlots, type FitCurveInput, type FitCurveTrial, type PlotFigure } from '@/app/_plots';
import { plotToSvg } from '../plots/plot-svg';
import { storedFitResult, type StoredFit, type StoredTrialSource } from './stored-fit';

/** Fit data in SI (see `fitData` in fit-analysis.ts): x m³/s, y °C, covariates Tin °C, rho kg/m³, cp J/(kg·K). */
export interface FitData {
  x: number[];
  y: number[];
  covariates: { Tin: number[]; rho: number[]; cp: number[] };
}

/** A figure as the pages and blocks carry it: words, server SVG, cautions. */
export const plotView = (f: PlotFigure): PlotView => ({ title: f.title, summary: f.summary, svg: plotToSvg(f.options), ...(f.cautions?.length ? { cautions: f.cautions } : {}) });

/** Only what the fit tables show: no per-point arrays, Jacobian or data. */
export function fitView(fit: FitSuccess, label: string): FitView {
  const { model, params, parameterNames, correlation, n, df, rss, residualSD, r2, adjustedR2, aicc, bic, level, iterations, stoppingReason, flags, lackOfFit, warnings } = fit;
  return { label, model, params, parameterNames, correlation, n, df, rss, residualSD, r2, adjustedR2, aicc, bic, level, iterations, stoppingReason, flags, lackOfFit: lackOfFit as FitView['lackOfFit'], warnings };
}

/** The parts of a fit a full analysis carries (no internal solver data): the table's numbers and every point's diagnostics. */
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

/**
 * More trials than the display limit (a fit over thousands of log segments): ordered by flow and
 * reduced with LTTB keeping each bucket's extreme outlets (analysis/reduce), so outliers stay visible.
 */
export function reduceTrials(trials: FitCurveTrial[]): FitCurveTrial[] {
  if (trials.length <= DISPLAY_MAX_POINTS) return trials;
  const sorted = [...trials].sort((a, b) => a.flowM3PerS - b.flowM3PerS);
  const { indices } = reduceForDisplay(sorted.map((t) => t.flowM3PerS), sorted.map((t) => t.outletTempC));
  return Array.from(indices, (i) => sorted[i]);
}

/** What the analyze route hands the worker: the trials' numbers (already loaded and authorized) and the request. */
export interface AnalyzeTask {
  data: FitData;
  models: string[];
  measurementSdK: number;
  planInletC: number;
  /** a label per trial (its start time) */
  labels: string[];
  /** each trial's start, ISO 8601 */
  times: string[];
  excluded: { flowM3PerS: number; outletTempC: number; label?: string }[];
  /** 'display': what the page draws; 'full': every point's diagnostics too */
  detail: 'display' | 'full';
}

/** Keeps `digits` significant digits: plot coordinates need no more (a pixel is ~1/600 of an axis). */
const sig = (v: number, digits = 6) => (Number.isFinite(v) && v !== 0 ? Number(v.toPrecision(digits)) : v);

/** The plot inputs reduced for display: at most DISPLAY_MAX_POINTS dots, coordinates to 6 significant digits. */
function leanPlots(curve: FitCurveInput, heat: AnalyzePlots['heat'], residuals: AnalyzePlots['residuals']): AnalyzePlots {
  const trials = reduceTrials(curve.trials).map((t) => ({ ...t, flowM3PerS: sig(t.flowM3PerS), outletTempC: sig(t.outletTempC) }));
  const models = curve.models.map((m) => ({ label: m.label, points: m.points.map((p) => ({ x: sig(p.x), y: sig(p.y), ciLow: sig(p.ciLow), ciHigh: sig(p.ciHigh), piLow: sig(p.piLow), piHigh: sig(p.piHigh) })) }));
  const heatLean = {
    ...heat,
    curve: heat.curve.map((c) => ({ flowM3PerS: sig(c.flowM3PerS), heatW: sig(c.heatW), ciLowW: sig(c.ciLowW), ciHighW: sig(c.ciHighW), piLowW: sig(c.piLowW), piHighW: sig(c.piHighW) })),
    trials: heat.trials.length > DISPLAY_MAX_POINTS ? heat.trials.filter((_, i) => i % Math.ceil(heat.trials.length / DISPLAY_MAX_POINTS) === 0) : heat.trials,
  };
  return { curve: { ...curve, trials, models }, heat: heatLean, residuals };
}

/**
 * Everything the fit page shows, from the trials' numbers: the comparison, each fitted model's
 * table, the flow choice and the performance table at the planning inlet, and the inputs of the
 * plot builders (app/_plots) for the browser to draw. With `detail: 'full'` each fit also carries
 * its per-point diagnostics (fitted values, residuals, leverage, Cook's distance).
 */
export function computeAnalysis(t: AnalyzeTask) {
  const comparison = compareModels({ ...t.data, measurementSD: t.measurementSdK }, t.models.map((m) => ({ label: modelLabel(m), model: m })));
  const okFits = comparison.ranking.filter((r) => r.ok && r.fit) as (typeof comparison.ranking[number] & { fit: FitSuccess })[];
  const primary = okFits[0]?.fit;
  let choice = null;
  let performance = null;
  let plots: AnalyzePlots | null = null;
  if (primary) {
    choice = chooseFlow(primary, t.planInletC);
    const [lo, hi] = primary.xRange;
    const steps = Array.from({ length: 8 }, (_, i) => lo + ((hi * 1.25 - lo) * i) / 7);
    performance = performanceTable(primary, steps, t.planInletC);
    const curve = fitCurveInputFromFits(okFits.map((r) => ({ label: r.label, fit: r.fit })), { excluded: t.excluded, labels: t.labels, inletTempC: t.planInletC });
    const residuals = residualInputFromFit(primary, { labels: t.labels, times: t.times });
    const heat = heatInputFromFit(primary, { inletTempC: t.planInletC, choice, excluded: t.excluded, labels: t.labels });
    plots = leanPlots(curve, heat, residuals);
  }
  return {
    n: t.data.x.length,
    planInletC: t.planInletC,
    measurementSdK: t.measurementSdK,
    detail: t.detail,
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
    fits: okFits.map((r) => (t.detail === 'full' ? summarizeFit(r.model, r.label, r.fit) : fitView(r.fit, r.label))),
    choice,
    performance,
    plots,
  };
}
export type ComputedAnalysis = ReturnType<typeof computeAnalysis>;

/** What saveFit hands the worker. */
export interface SaveFitTask {
  data: FitData;
  model: string;
  compareWith: string[];
  measurementSdK: number;
  planInletC: number;
  trials: (Omit<StoredTrialSource, 'startedAt'> & { startedAt: string })[];
}

/**
 * The stored result of a fit to save (the fit, the comparison, the choice and performance at the
 * planning inlet, the trials), or why the chosen model cannot be fitted.
 */
export function computeSavedFit(t: SaveFitTask): { ok: true; result: StoredFit } | { ok: false; reason: string } {
  const models = [t.model, ...t.compareWith.filter((m) => m !== t.model)];
  const comparison = compareModels({ ...t.data, measurementSD: t.measurementSdK }, models.map((m) => ({ label: modelLabel(m), model: m })));
  const mine = comparison.ranking.find((r) => r.model === t.model);
  if (!mine?.ok || !mine.fit) return { ok: false, reason: mine?.reason ?? 'unknown reason' };
  return { ok: true, result: storedFitResult(mine.fit, comparison, t.planInletC, t.trials.map((x) => ({ ...x, startedAt: new Date(x.startedAt) }))) };
}

/** A saved fit's figures: what its page and its study blocks draw. */
export interface SavedFitFiguresTask {
  fit: FitSuccess;
  label: string;
  inletTempC: number;
  choice: StoredFit['choice'];
  /** the trials' start times, ISO 8601, in the fit's point order */
  times: string[];
  units: UnitSystem;
}

/** Server SVG of a saved fit's page: the curve, the heat curve and the four residual plots. */
export function savedFitFigures(t: SavedFitFiguresTask) {
  const labels = t.times.map((s) => s.slice(0, 16).replace('T', ' '));
  const curve = plotView(fitCurvePlot(fitCurveInputFromFits([{ label: t.label, fit: t.fit }], { labels, inletTempC: t.inletTempC }), t.units));
  const heat = plotView(heatPlot(heatInputFromFit(t.fit, { inletTempC: t.inletTempC, choice: t.choice, labels }), t.units));
  const res = residualPlots(residualInputFromFit(t.fit, { labels, times: t.times }), t.units);
  return { curve, heat, residuals: [res.vsFlow, res.vsFitted, res.vsOrder, res.qq].map(plotView) };
}

/** The fit block's figure: the saved fit's curve at its planning inlet, its trials reduced for display when there are many. */
export function fitBlockFigure(t: { fit: FitSuccess; label: string; inletTempC: number; units: UnitSystem }): PlotView {
  const input = fitCurveInputFromFits([{ label: t.label, fit: t.fit }], { inletTempC: t.inletTempC });
  const n = input.trials.length;
  let fig = fitCurvePlot(n > DISPLAY_MAX_POINTS ? { ...input, trials: reduceTrials(input.trials) } : input, t.units);
  if (n > DISPLAY_MAX_POINTS) fig = { ...fig, summary: fig.summary.replace(/^\d[\d,]* trials? fitted/, `${n.toLocaleString('en-US')} trials fitted (${DISPLAY_MAX_POINTS.toLocaleString('en-US')} or fewer drawn, reduced for display keeping the extremes)`) };
  return plotView(fig);
}
