/**
 * What the block-data routes return for one study block (plain JSON: numbers in SI, tables, and
 * the server-rendered SVG of its plots in the reader's units), built by app/_lib/studies/
 * study-blocks.ts and rendered by app/_components/study-blocks.tsx. Their SWR keys are in
 * study-keys.ts beside this file.
 */
import type { ChoiceView, ComparisonView, FitView, PerformanceView } from './fit-report';
import type { DesignComparisonView } from './design-comparison';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { CautionLike } from '@/analysis/safety/cautions';
import type { CollectorViewDto } from './collector';
import type { OperatingPlanDto } from './operating-plan';

/** A plot as the server rendered it (plotToSvg) with the words of its figcaption. */
export interface PlotView {
  title: string;
  summary: string;
  svg: string;
  /** the cautions of the temperatures the plot shows (absent when none reaches 40 °C) */
  cautions?: CautionView[];
}

/** A caution as blocks carry it (JSON of analysis/safety's Caution). */
export type CautionView = CautionLike;

/** The saved fit a block shows; `fitId` is null on the public share view (no links into the lab). */
export interface FitHead {
  fitId: string | null;
  title: string;
  version: number;
  label: string;
  reviewState: string;
}

export interface CostView {
  fuel: string;
  fuelLabel: string;
  currency: string;
  price: number;
  priceUnit: string;
  /** η (0–1) or, for a heat pump, the COP */
  efficiency: number;
  efficiencyIsCop: boolean;
  perUsefulTherm: number;
  perUsefulKWh: number;
  /** where the heat figure comes from, in words */
  heatBasis: string;
  /** water volume, m³ (null when the heat was given as energy) */
  volumeM3: number | null;
  /** the rise of the heat-up, K (null when the heat was given as energy) */
  riseK: number | null;
  perDegF: number | null;
  perK: number | null;
  /** useful heat of the heat-up (or the heat given), J */
  heatJ: number;
  heatCost: number;
  /** fuel bought for that heat, in the price unit */
  fuelQuantity: number;
  source: string;
  cautions: string[];
  /** a season's energy, money and payback (app/_lib/forecasts/season.ts), when the sheet has a season */
  season?: SeasonView | null;
}

/** A season held at a target temperature (SI; money in `currency`): its heat, fuel, cost and the payback of the build. */
export interface SeasonView {
  days: number;
  hoursPerDay: number;
  targetTempC: number;
  cover: boolean;
  /** mean losses at the target under the forecast's weather and the season's cover, W; the sun's mean gain, W; losses − sun, W */
  lossW: number;
  solarW: number;
  netLossW: number;
  /** the heater's heat into water at the target while it runs, W */
  heaterW: number;
  /** heater hours a day that hold the target (null: it cannot) */
  holdHoursPerDay: number | null;
  /** the season's hours a day cannot hold the target: the heat is what they deliver */
  limitedByHeater: boolean;
  /** useful heat of the season, J; fuel (or electricity) energy bought for it, J */
  usefulJ: number;
  fuelJ: number;
  /** that energy in the fuel's price unit (therm, gal, kWh, cord), in kWh and in therms */
  fuelUnits: number;
  fuelUnit: string;
  fuelKWh: number;
  fuelTherms: number;
  burnerHours: number;
  poolHours: number;
  annualCost: number;
  currency: string;
  payback: {
    buildCost: number;
    buildBasis: string;
    purchasedPrice: number;
    purchasedFuel: string;
    purchasedEfficiency: number;
    perUsefulThermBuild: number;
    perUsefulThermPurchased: number;
    annualCostBuild: number;
    annualCostPurchased: number;
    annualSaving: number;
    /** seasons to pay back; null: never (the verdict says why) */
    years: number | null;
    verdict: string;
  } | null;
  notes: string[];
  cautions: CautionView[];
}

export interface SensorSegmentView {
  startS: number;
  endS: number;
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
}

/** The body of a block, by what it shows. */
export type BlockBody =
  | { type: 'text'; html: string }
  | { type: 'caution'; items: string[] }
  | { type: 'fit'; head: FitHead; plot: PlotView; fit: FitView; choice: ChoiceView }
  | { type: 'comparison'; head: FitHead; comparison: ComparisonView }
  | { type: 'performance'; head: FitHead; table: PerformanceView }
  | { type: 'trials'; head: FitHead; trials: { startedAt: string; flowM3PerS: number; inletTempC: number; outletTempC: number }[] }
  | {
      type: 'forecast'; finalTempC: number; hoursToTarget: number | null; fitNote: string | null; cautions: CautionView[]; plot: PlotView;
      // solar and measured-day additions: where the pool settles, the hours that hold the target, a measured day
      equilibriumTempC?: number | null; holdHoursPerDay?: number | null; holdNote?: string | null; measuredDay?: MeasuredDayView | null;
    }
  | { type: 'costs'; cost: CostView }
  | {
      type: 'sensor-log';
      rigName: string;
      /** the log's file name; null on the public share view (no raw files there) */
      filename: string | null;
      startedAt: string;
      samples: number;
      shownPoints: number;
      durationS: number;
      /** the first SEGMENT_ROWS steady segments, for the table */
      segments: SensorSegmentView[];
      /** how many steady segments the log has in all */
      segmentCount: number;
      plots: PlotView[];
    }
  /** a saved design comparison; `comparisonId` is null on the public share view */
  | { type: 'design-comparison'; comparisonId: string | null; view: DesignComparisonView }
  // solar collectors: a saved collector fit (ISO 9806 steady state)
  | { type: 'collector'; head: FitHead; view: CollectorViewDto }
  /** an operating plan of a rig with the cautions it raises now; `planId` and `rigId` are null on the public share view */
  | { type: 'operating-plan'; planId: string | null; rigId: string | null; name: string; rigName: string; updatedAt: string; plan: Pick<OperatingPlanDto, 'steps' | 'loop' | 'cautions'> }
  // a tub filled in one pass through a saved coil fit's heater
  | { type: 'tub-fill'; head: FitHead; fill: TubFillView }
  | { type: 'note'; tone: 'muted' | 'danger'; message: string };

/** A tub filled in one pass through the heater (app/_lib/forecasts/tub-fill.ts; SI). */
export interface TubFillView {
  tubVolumeM3: number;
  flowM3PerS: number;
  supplyTempC: number;
  fillTimeS: number;
  outletTempC: number;
  finalTempC: number;
  /** the flow whose outlet gives the target after mixing, when a target was given */
  target: { targetTempC: number; outletTempC: number; flowM3PerS: number | null; fillTimeS: number | null; note: string } | null;
  heaterNote: string;
  cautions: CautionView[];
}

/** A measured day against its forecast (SI, names carry the unit; see analysis/forecast/measured-day-check.ts). */
export interface MeasuredDayView {
  startTemp_degC: number;
  observedEndTemp_degC: number;
  predictedEndTemp_degC: number;
  residual_K: number;
  residualU_K: number;
  unmodelledGain_J: number;
  unmodelledGainU_J: number;
  unmodelledGain_W: number;
  unmodelledGainU_W: number;
  unmodelledGain_W_per_m2: number | null;
  significant: boolean;
  verdict: string;
}

/** One block, ready to show. */
export interface BlockData {
  id: string;
  kind: string;
  units: UnitSystem;
  body: BlockBody;
}

/** The study record the page and the editor share (GET /api/studies/:id). */
export interface StudyRecord {
  study: {
    id: string;
    title: string;
    reviewState: string;
    revision: number;
    updatedAt: string;
    updatedBy: string | null;
    blocks: { id: string; kind: string; data: Record<string, unknown> }[];
  };
}

/** Rows of a sensor-log block's segment table (the block says how many there are in all). */
export const SEGMENT_ROWS = 50;
