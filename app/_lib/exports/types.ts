/**
 * Plain data the study and fit workbooks are built from. Values are SI with the unit in the field
 * name (temperatures °C, differences K, flows m³/s, heat W, energy J); the workbook converts them
 * for its headers and cells to the chosen `unitSystem`. Results of analysis/ go in as they are:
 * `FitSuccess` (analysis/fit), `PerformanceTable` (analysis/performance), `ForecastResult`
 * (analysis/forecast), `BuildCostSheet`, `UsefulHeatCost`, `Payback` (analysis/cost).
 */
import type { FitSuccess } from '@/analysis/fit';
import type { PerformanceTable } from '@/analysis/performance/performance-table';
import type { ForecastResult } from '@/analysis/forecast/recirculating-forecast';
import type { BuildCostSheet } from '@/analysis/cost/build-cost';
import type { UsefulHeatCost } from '@/analysis/cost/useful-heat-cost';
import type { Payback } from '@/analysis/cost/payback';
import type { FuelKind } from '@/analysis/cost/fuels';
import type { CollectorTestResult } from '@/analysis/performance/collector-test';
import type { MeasuredDayView } from '@/app/_contracts/study-blocks';
import type { CellValue } from './cells';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { DesignComparisonView } from '@/app/_contracts/design-comparison';
import type { PlanExport } from './plan-sheet';
import type { SeasonView, TubFillView } from '@/app/_contracts/study-blocks';

/** Where the numbers come from: the Summary sheet's Provenance section (DOMAIN.md §7, reproducibility). */
export interface ExportProvenance {
  lab: string;
  rig?: string | null;
  /** study title, for a study export */
  study?: string | null;
  /** saved-fit id and version, when the export is of a saved fit */
  fitId?: string | null;
  fitVersion?: number | null;
  /** model name(s) */
  model?: string | null;
  /** when the fit was computed */
  fitTime?: Date | null;
  /** Emberline version that computed the results */
  softwareVersion: string;
  /** hash of the raw trial data the results come from (e.g. sha256 hex) */
  dataHash?: string | null;
  /** export time (default now) */
  exportedAt?: Date;
  /** calculation settings, e.g. { 'steady-state preset': 'default', 'confidence level': 0.95 } */
  settings?: Record<string, CellValue>;
}

/** One trial: raw inputs and derived values (DOMAIN.md §7 raw and derived trial tables). */
export interface TrialExportRow {
  id: string;
  /** run order, 1-based */
  order?: number | null;
  timestamp?: Date | null;
  /** false for a trial excluded from the fit */
  included?: boolean;
  steady?: boolean | null;
  flowM3PerS: number;
  inletTempC: number;
  outletTempC: number;
  sourceTempC?: number | null;
  ambientTempC?: number | null;
  bucketVolumeM3?: number | null;
  fillTimesS?: number[] | null;
  irradianceWPerM2?: number | null;
  windMPerS?: number | null;
  notes?: string | null;
  massFlowKgPerS?: number | null;
  deltaTK?: number | null;
  heatW?: number | null;
  /** standard uncertainty of the heat rate, W */
  heatUncertaintyW?: number | null;
  effectiveness?: number | null;
  uaWPerK?: number | null;
}

/** One fitted model, as `fitModel` returned it. */
export interface FitExport {
  /** name shown in the sheets (default the model name) */
  label?: string;
  fit: FitSuccess;
  /** trial id of each fitted point, in the fit's point order */
  pointIds?: string[];
  /**
   * x is volume flow (m³/s) and y outlet temperature (°C), as for the heater built-ins (default
   * true); false exports x and y as fitted, without units
   */
  heater?: boolean;
}

/** A performance table with a label. */
export interface PerformanceExport {
  label?: string;
  table: PerformanceTable;
}

/** A forecast with a label; with `startTime` the series gets a timestamp column. */
export interface ForecastExport {
  label?: string;
  result: ForecastResult;
  startTime?: Date;
  /** what was measured that day against the forecast (analysis/forecast/measured-day-check.ts) */
  measuredDay?: MeasuredDayView;
}

/** Cost results; money is in `currency` (a code such as "USD", shown in the headers). */
export interface CostExport {
  currency: string;
  build?: BuildCostSheet;
  usefulHeat?: UsefulHeatCost & { fuel: FuelKind };
  /** from costPerDegree (analysis/cost/useful-heat-cost) */
  perDegree?: { perDegF: number; perK: number };
  payback?: Payback;
  /** running costs of a study's cost-sheet blocks, one group each (money in each one's own currency) */
  running?: RunningCostExport[];
}

/** One running-cost figure set (a study's cost-sheet block): SI energy, money in `currency`. */
export interface RunningCostExport {
  label: string;
  fuel: FuelKind;
  currency: string;
  /** price per `priceUnit` (therm, gal, kWh, cord) */
  price: number;
  priceUnit: string;
  /** η 0–1, or the COP of a heat pump */
  efficiency: number;
  perUsefulTherm: number;
  perUsefulKWh: number;
  perDegF: number | null;
  perK: number | null;
  /** useful heat of the heat-up, J */
  heatJ: number;
  heatCost: number;
  /** fuel bought for that heat, in `priceUnit` */
  fuelQuantity: number;
  heatBasis: string;
  /** a season held at a target, with the payback of the build (app/_lib/forecasts/season.ts) */
  season?: SeasonView;
}

/** A collector efficiency test (analysis/performance/collector-test.ts `collectorTest`) with a label. */
export interface CollectorExport {
  label: string;
  test: Pick<CollectorTestResult, 'areaBasis' | 'areaM2' | 'eta0' | 'a1WPerM2K' | 'a2WPerM2K2' | 'n' | 'residualSD' | 'points' | 'excluded' | 'warnings'>;
  /** a label per point (the trial's time) */
  trialLabels?: string[];
}

/** A tub-fill block's result with a label. */
export interface TubFillExport {
  label: string;
  fill: TubFillView;
}

/** Everything a study export can hold; each part gives its sheet when present. */
export interface StudyExport {
  unitSystem: UnitSystem;
  provenance: ExportProvenance;
  trials?: TrialExportRow[];
  fits?: FitExport[];
  performance?: PerformanceExport[];
  forecasts?: ForecastExport[];
  costs?: CostExport;
  collectors?: CollectorExport[];
  /** design comparisons (a study's design-comparison blocks, or one comparison's export) */
  comparisons?: DesignComparisonView[];
  /** operating plans (a study's operating-plan blocks) with their cautions */
  plans?: PlanExport[];
  /** tubs filled in one pass (a study's tub-fill blocks) */
  tubFills?: TubFillExport[];
  /** extra lines under the Summary table (cautions, the reviewer's sign-off…) */
  notes?: string[];
}

/** What a fit export holds: the trials, the fitted model(s) and optionally their performance table. */
export type FitWorkbookInput = Pick<StudyExport, 'unitSystem' | 'provenance' | 'trials' | 'fits' | 'performance' | 'notes' | 'collectors'>;
