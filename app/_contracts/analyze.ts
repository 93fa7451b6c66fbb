/**
 * What `POST /api/rigs/:id/analyze` answers (built by app/_lib/fits/fit-compute.ts in the analysis
 * pool, drawn by the fit workbench): SI numbers, the fitted models' tables, and the plot builders'
 * inputs (app/_plots) reduced for display — at most 2,000 trial dots, coordinates to six
 * significant digits — which the page renders with Observable Plot in the reader's units. With
 * `?detail=full` every fit also carries its per-point diagnostics (`FitDetail`).
 */
import type { FitCurveInput, HeatPlotInput, ResidualInput } from '@/app/_plots';
import type { ChoiceView, ComparisonView, FitView, PerformanceView } from './fit-report';

/** The inputs of the fit page's plot builders. */
export interface AnalyzePlots {
  curve: FitCurveInput;
  heat: HeatPlotInput;
  residuals: ResidualInput;
}

/** Per-point diagnostics of one fit (only with `?detail=full`), in the fit's point order. */
export interface FitDetail {
  expression: string;
  covariance: number[][];
  p: number;
  rmse: number;
  aic: number | null;
  fitted: number[];
  residuals: number[];
  studentizedResiduals: (number | null)[];
  leverage: number[];
  cooksDistance: (number | null)[];
  converged: boolean;
  xRange: [number, number];
}

/** The analyze route's answer. */
export interface AnalyzeResponse {
  trialIds: string[];
  trialsHash: string;
  n: number;
  planInletC: number;
  measurementSdK: number;
  detail: 'display' | 'full';
  comparison: ComparisonView & { best: string | null; ranking: (ComparisonView['ranking'][number] & { model: string; runsP: number | null })[] };
  fits: (FitView & Partial<FitDetail>)[];
  choice: ChoiceView | null;
  performance: PerformanceView | null;
  /** null when no model could be fitted */
  plots: AnalyzePlots | null;
}
