/**
 * A design comparison as the page, the study block and the export read it (plain JSON, SI numbers,
 * server-rendered SVG plots in the reader's units), built by app/_lib/comparisons/comparison-view.ts.
 * Every design is compared against the first one (the reference, "A").
 */
import type { PlotView } from './study-blocks';

/** An estimate with its delta-method interval and the bootstrap check of it. */
export interface IntervalView {
  value: number;
  ciLow: number;
  ciHigh: number;
  /** percentile interval of the paired residual bootstrap (null when skipped or failed) */
  bootstrap: { ciLow: number; ciHigh: number } | null;
}

/** One design: a rig's included trials fitted on their own, or a saved fit's trials and model. */
export interface DesignView {
  /** 'A', 'B', … in the order given */
  key: string;
  /** the name in the words: the rig's name, or the fit's title and version */
  label: string;
  kind: 'rig' | 'fit';
  /** ids into the lab (null on a public share view) */
  id: string | null;
  rigId: string | null;
  rigName: string;
  model: string;
  modelLabel: string;
  n: number;
  residualSD: number;
  flowRangeM3PerS: [number, number];
  /** hottest measured outlet of the design's trials, °C (for the cautions) */
  maxOutletC: number;
  /** fitted parameters (Ts °C and UA W/K for the coil; others as the model names them) with their intervals */
  params: { name: string; value: number; stdErr: number; ciLow: number; ciHigh: number }[];
  /** heat delivered at the common inlet and flow, W, with its confidence interval */
  heatW: { value: number; ciLow: number; ciHigh: number };
  /** what the rig records: tube length (m), collector area (m²), build cost */
  tubeLengthM: number | null;
  collectorAreaM2: number | null;
  buildCost: { amount: number; currency: string } | null;
  /** heat at the common conditions per metre of tube (W/m), per m² of collector (W/m²), per unit of build cost (W per currency unit) */
  heatPerMetreW: number | null;
  heatPerM2W: number | null;
  heatPerCostW: number | null;
  warnings: string[];
}

/** A design against the reference. */
export interface PairView {
  /** keys of the reference and the design, e.g. ['A', 'B'] */
  keys: [string, string];
  /** UA_B/UA_A and Ts_B − Ts_A (K): coil against coil only */
  uaRatio: IntervalView | null;
  tsDifferenceK: IntervalView | null;
  /** 100·(q_B/q_A − 1) at the common inlet and flow */
  heatDifferencePercent: IntervalView;
  /** the plain-words verdict at the common flow */
  verdict: string;
  /** sentences on UA and Ts, and notes (different models, intervals that disagree) */
  notes: string[];
}

export interface DesignComparisonView {
  title: string;
  /** the common conditions, SI */
  inletTempC: number;
  flowM3PerS: number;
  level: number;
  designs: DesignView[];
  pairs: PairView[];
  /** heat of every design at the common flows (W, null where a design cannot be evaluated) */
  heatTable: { flowM3PerS: number; heatW: (number | null)[]; extrapolated: boolean }[];
  plots: { outlet: PlotView; heat: PlotView };
  /** the verdicts of every pair, in one paragraph */
  verdict: string;
  notes: string[];
  /** designs that could not be loaded or fitted, in words (a comparison of what is left is shown) */
  problems: string[];
}
