/**
 * A collector efficiency test as the page, a saved collector fit and a study block show it
 * (ISO 9806 steady-state form; SI: areas m², a1 W/(m²·K), a2 W/(m²·K²), x m²·K/W).
 */
export interface CollectorEstimateView { value: number; stdErr: number; ciLow: number; ciHigh: number }

export interface CollectorViewDto {
  areaBasis: 'gross' | 'aperture';
  areaM2: number;
  eta0: CollectorEstimateView;
  a1WPerM2K: CollectorEstimateView;
  a2WPerM2K2: CollectorEstimateView;
  parameterNames: string[];
  covariance: number[][];
  n: number;
  df: number;
  r2: number | null;
  residualSD: number;
  weighted: boolean;
  level: number;
  xRangeM2KPerW: [number, number];
  bandIrradianceWPerM2: number;
  points: { index: number; trialId: string | null; label: string; efficiency: number; xM2KPerW: number; meanTempC: number; heatW: number; fitted: number; residual: number }[];
  /** trials left out by the steadiness limits, with the reasons */
  excluded: { trialId: string | null; label: string; reasons: string[] }[];
  /** trials the test could not use (no irradiance or ambient) */
  skipped: { id: string; label: string; reason: string }[];
  limits: Record<string, unknown>;
  warnings: string[];
  plots: Record<'curve' | 'resX' | 'resOrder', { title: string; summary: string; svg: string }>;
}
