/**
 * The numbers of a fit as the browser receives them (the analyze route, the saved-fit page, the
 * fit, comparison and performance blocks of a study): plain JSON, SI, temperatures in °C.
 * Rendered by app/_components/fit-report.tsx; built on the server from analysis/fit results.
 */

export interface ParamView {
  value: number;
  stdErr: number;
  ciLow: number;
  ciHigh: number;
  atBound?: string | null;
}

export interface FitView {
  label: string;
  model: string;
  params: Record<string, ParamView>;
  parameterNames: string[];
  correlation: number[][];
  n: number;
  df: number;
  rss: number;
  residualSD: number;
  r2: number | null;
  adjustedR2: number | null;
  aicc: number | null;
  bic: number | null;
  level: number;
  iterations: number;
  stoppingReason: string;
  flags: { highLeverage: number[]; influential: number[]; outliers: number[] };
  lackOfFit: { ok: boolean; F?: number; pValue?: number; verdict?: string; reason?: string } | null;
  warnings: { code: string; message: string; parameter?: string }[];
}

export interface ComparisonView {
  verdict: string;
  ranking: { label: string; ok: boolean; reason: string | null; aicc: number | null; deltaAicc: number | null; akaikeWeight: number | null; residualSD: number | null; sdRatio: number | null; patterned: boolean; verdict: string }[];
}

export interface ChoiceView {
  inletTempC: number;
  optimum: { flowM3PerS: number; flowU: number | null; heatW: number } | null;
  optimumNote: string;
  ceiling: { fraction: number; flowM3PerS: number; flowU: number | null; heatCeilingW: number; extrapolated: boolean } | null;
  minimumFlows: { label: string; limitC: number; flowM3PerS: number | null; conservativeFlowM3PerS: number | null; note: string }[];
  notes: string[];
}

export interface PerformanceView {
  inletTempC: number;
  rows: { flowM3PerS: number; outletTempC: number; outletPiC: [number, number]; deltaTK: number; heatW: number; heatPiW: [number, number]; extrapolated: boolean }[];
  notes: string[];
  cautions: { code: string; level: string; message: string }[];
}
