/**
 * A collector efficiency test as the page, a saved collector fit and a study block show it
 * (ISO 9806 steady-state form; SI: areas m², a1 W/(m²·K), a2 W/(m²·K²), x m²·K/W): the result of
 * analysis/performance/collector-test.ts with each point and excluded trial named, the trials
 * the test could not use, the steadiness limits and the plots as SVG. Types only, derived from
 * the analysis types so the two cannot drift.
 */
import type { CollectorPoint, CollectorTestResult } from '@/analysis/performance/collector-test';
import type { CollectorTestLimits } from '@/analysis/performance/collector-steadiness';

/** A trial the test could not use (no irradiance or ambient), and why. */
export interface SkippedTrialView { id: string; label: string; reason: string }

export interface CollectorViewDto extends Pick<CollectorTestResult,
  | 'areaBasis' | 'areaM2' | 'eta0' | 'a1WPerM2K' | 'a2WPerM2K2' | 'parameterNames' | 'covariance' | 'n' | 'df' | 'r2'
  | 'residualSD' | 'weighted' | 'level' | 'xRangeM2KPerW' | 'bandIrradianceWPerM2' | 'warnings'> {
  points: (Pick<CollectorPoint, 'index' | 'efficiency' | 'xM2KPerW' | 'meanTempC' | 'heatW' | 'fitted' | 'residual'> & { trialId: string | null; label: string })[];
  /** trials left out by the steadiness limits, with the reasons */
  excluded: (Pick<CollectorTestResult['excluded'][number], 'reasons'> & { trialId: string | null; label: string })[];
  /** trials the test could not use (no irradiance or ambient) */
  skipped: SkippedTrialView[];
  limits: CollectorTestLimits;
  plots: Record<'curve' | 'resX' | 'resOrder', { title: string; summary: string; svg: string }>;
}
