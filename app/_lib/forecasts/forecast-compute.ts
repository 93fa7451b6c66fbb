/**
 * The CPU work of a forecast as pure functions of the request body (no database): they run in the
 * analysis worker pool (app/_lib/analysis-worker), so this file and its imports stay free of
 * `server-only`, entities and the ORM. `forecasts.ts` loads the saved fit and hands its heater here.
 */
import { z } from 'zod';
import { costPerDegree, usefulHeatCost, USEFUL_THERM_J } from '@/analysis/cost/useful-heat-cost';
import type { FuelKind } from '@/analysis/cost/fuels';
import { forecastJson } from '@/analysis/forecast/forecast-json';
import { readForecastInput } from '@/analysis/forecast/read-forecast-input';
import { recirculatingForecast, type ForecastInput, type ForecastResult } from '@/analysis/forecast/recirculating-forecast';
import { risePerHourTable } from '@/analysis/pool/mixing';
import { poolGeometry, type PoolGeometry } from '@/analysis/pool/pool-geometry';
import { readPoolDimensions } from '@/analysis/pool/read-pool-dimensions';
import { reduceForDisplay } from '@/analysis/reduce';
import { readingInput } from '@/analysis/units/reading-input';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { waterDensityKgPerM3 } from '@/analysis/water/water-properties';
import { energyBudgetInput, energyBudgetPlot, forecastPlot, type EnergyBudgetInput, type ForecastPlotInput } from '@/app/_plots';
import { invalid } from '../server/errors';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { solarCollectorHeater, type CollectorParameters } from '@/analysis/performance/collector-efficiency';
import { measuredDayCheck } from '@/analysis/forecast/measured-day-check';
import type { MeasuredDayView, SeasonView } from '@/app/_contracts/study-blocks';
import { FUEL_KINDS, parseSeason, seasonForecastBody, seasonView, type BuildFuel, type RigBuild } from './season';
import { plotToSvg } from '../plots/plot-svg';

/** What forecasts.ts hands the worker: the body with the saved fit already turned into a heater. */
export interface ForecastTask {
  /** the request body without fitId (quantities as unit strings) */
  body: Record<string, unknown>;
  /** the saved fit's heater (`{ model: 'coil', sourceTemp, UA }` as unit strings), when the body named one */
  heater?: Record<string, unknown>;
  fitNote: string | null;
  units: UnitSystem;
  /** 'svg': server SVG of both plots too (study blocks, the no-JavaScript path); 'data': the plot inputs only */
  render: 'svg' | 'data';
  /** the build cost of the saved fit's rig (a season's payback, when it gives none) */
  rigBuild?: RigBuild;
}

interface Prepared {
  input: ForecastInput;
  result: ForecastResult;
  pool: PoolGeometry | null;
}

/** The typed forecast of a request body: the pool by its shape (its area the surface of the loss terms), read by the same reader as the command line. */
function prepare(t: Pick<ForecastTask, 'body' | 'heater'>): Prepared {
  const { input, pool } = typedInput(t);
  return { input, result: readingInput(() => recirculatingForecast(input)), pool };
}

/** The typed input of a request body (the forecast not yet run). */
function typedInput(t: Pick<ForecastTask, 'body' | 'heater'>): { input: ForecastInput; pool: PoolGeometry | null } {
  const { fitId: _f, cost: _c, pool: poolBody, measured: _m, sun: _s, ...rest } = t.body;
  void _f;
  void _c;
  void _m;
  void _s;
  // a saved collector fit (forecasts.ts): the collector at the steady sun of the heater hours replaces the placeholder once read
  const collector = t.heater?.model === 'solar-collector' ? (t.heater as unknown as { collector: CollectorParameters; irradianceWPerM2: number; ambientTempC: number; modules: number }) : null;
  const heater = collector ? { model: 'fixed-rise', rise: '0 K' } : t.heater;
  const input: Record<string, unknown> = { ...rest, ...(heater ? { heater } : {}) };
  return readingInput((read) => {
    const pool = poolBody === undefined ? null : poolGeometry(readPoolDimensions(read, poolBody, 'pool'));
    if (pool && input.losses && typeof input.losses === 'object') input.losses = { ...(input.losses as object), surfaceArea: `${pool.areaM2} m^2` };
    const typed = readForecastInput(read, input);
    if (pool) typed.poolVolumeM3 = pool.volumeM3;
    if (collector) typed.heater = solarCollectorHeater({ collector: collector.collector, irradianceWPerM2: collector.irradianceWPerM2, ambientTempC: collector.ambientTempC, modules: collector.modules });
    return { input: typed, pool };
  });
}

/**
 * A season of a forecast's pool (app/_lib/forecasts/season.ts) for a study's cost block: the
 * forecast's typed input without running it, the season's settings and the build's fuel.
 * @throws DomainError invalid naming the season's field; InputError naming the forecast's
 */
export function computeSeason(t: Pick<ForecastTask, 'body' | 'heater'> & { season: unknown; build: BuildFuel }): SeasonView {
  const season = parseSeason(t.season);
  return seasonView(typedInput({ body: seasonForecastBody(t.body, season), heater: t.heater }).input, season, t.build);
}

const measuredSchema = z.object({
  endTemp: z.string().trim().min(1, 'give the measured end temperature').max(40),
  thermometerU: z.string().trim().min(1).max(40).default('0.3 K'),
  volumeRelativeU: z.number().min(0).max(0.5, 'the volume uncertainty is at most 50 %').default(0.05),
}).strict();

/**
 * The measured day of a forecast (`body.measured`): its end against the measured end, the gain
 * the model did not include and its uncertainty (analysis/forecast/measured-day-check.ts).
 * @throws DomainError invalid naming `measured` for a bad body
 */
function measuredDayOf(input: ForecastInput, body: unknown): MeasuredDayView {
  const m = measuredSchema.safeParse(body);
  if (!m.success) throw invalid(`measured: ${m.error.issues[0]?.message ?? 'invalid'}`, { measured: m.error.issues[0]?.message ?? 'invalid' });
  const endC = parseQuantity(m.data.endTemp, 'temperature', 'measured.endTemp');
  const uT = parseQuantity(m.data.thermometerU, 'temperatureDifference', 'measured.thermometerU');
  if (!(endC >= 0 && endC <= 100)) throw invalid(`measured.endTemp ${endC.toFixed(1)} °C is outside the water range 0–100 °C.`, { measured: 'end temperature 0–100 °C' });
  if (!(uT >= 0 && uT <= 5)) throw invalid('measured.thermometerU must be within 0–5 K.', { measured: 'thermometer uncertainty 0–5 K' });
  const c = measuredDayCheck(input, endC, { thermometerK: uT, volumeRelative: m.data.volumeRelativeU });
  return {
    startTemp_degC: input.startTempC, observedEndTemp_degC: c.observedEndC, predictedEndTemp_degC: c.predictedEndC, residual_K: c.residualK, residualU_K: c.residualUK,
    unmodelledGain_J: c.unmodelledGainJ, unmodelledGainU_J: c.gainUJ, unmodelledGain_W: c.unmodelledGainW, unmodelledGainU_W: c.gainUW,
    unmodelledGain_W_per_m2: c.unmodelledGainWPerM2, significant: c.significant, verdict: c.verdict,
  };
}

/** The forecast's result and, when the body has one, its measured day (the spreadsheet export's Forecast sheet and Summary). */
export function computeForecastExport(t: Pick<ForecastTask, 'body' | 'heater'>): { result: ForecastResult; measuredDay: MeasuredDayView | null } {
  const { input, result } = prepare(t);
  return { result, measuredDay: t.body.measured === undefined ? null : measuredDayOf(input, t.body.measured) };
}

/** A plot as the forecast response carries it: its words, the builder's input (for the browser), and server SVG when asked. */
export interface ForecastFigure<I> {
  title: string;
  summary: string;
  input: I;
  svg?: string;
  cautions?: ReturnType<typeof forecastPlot>['cautions'];
}

/**
 * Runs the forecast of a request body and shapes what the page and the study block show: the
 * numbers, the rise table and cost, and both plots as builder inputs reduced for display (a season
 * sampled every minute is cut to at most 2,000 points keeping extremes and endpoints), with their
 * server SVG when `render` is 'svg'.
 * @throws InputError (422) naming the field the user wrote; DomainError invalid for a bad cost
 */
export function computeForecast(t: ForecastTask) {
  const { input, result: r, pool } = prepare(t);
  const shown = reduceForDisplay(r.timeH, r.tempC);
  const pick = (a: Float64Array) => Array.from(shown.indices, (i) => a[i]);
  const trajectoryInput: ForecastPlotInput = {
    timeH: pick(r.timeH),
    poolC: pick(r.tempC),
    outletTempC: pick(r.outletTempC),
    targetC: input.targetTempC ?? null,
    hoursToTarget: r.hoursToTarget,
    cautions: r.cautions.filter((c) => c.thresholdC !== null).map((c) => ({ thresholdC: c.thresholdC!, level: c.level, message: c.message })),
  };
  const budgetInput: EnergyBudgetInput = energyBudgetInput(r.energy, input.hours);
  const trajectory = forecastPlot(trajectoryInput, t.units);
  const budget = energyBudgetPlot(budgetInput, t.units);
  const svg = t.render === 'svg';
  return {
    ...forecastJson(r),
    samples: r.timeH.length,
    shownSamples: shown.indices.length,
    fitNote: t.fitNote,
    pool: pool && { volume_m3: pool.volumeM3, area_m2: pool.areaM2 },
    ...forecastExtras(input, r, t.body.cost, t.rigBuild),
    measuredDay: t.body.measured === undefined ? null : measuredDayOf(input, t.body.measured),
    plots: {
      trajectory: { title: trajectory.title, summary: trajectory.summary, input: trajectoryInput, ...(svg ? { svg: plotToSvg(trajectory.options) } : {}), cautions: trajectory.cautions } as ForecastFigure<ForecastPlotInput>,
      budget: { title: budget.title, summary: budget.summary, input: budgetInput, ...(svg ? { svg: plotToSvg(budget.options) } : {}) } as ForecastFigure<EnergyBudgetInput>,
    },
  };
}
export type ComputedForecast = ReturnType<typeof computeForecast>;

const costSchema = z.object({
  fuel: z.enum(FUEL_KINDS), pricePerUnit: z.number().positive(), efficiency: z.number().positive().max(10).optional(),
  currency: z.string().trim().max(8).optional(), season: z.unknown().optional(),
}).strict();

/**
 * The rise per hour by flow × pool size (a heater with a source temperature, at the start temperature) and, with a fuel
 * price, the cost of a useful therm, of one degree and of this forecast's heat.
 */
function forecastExtras(input: ForecastInput, r: ForecastResult, costInput: unknown, rigBuild?: RigBuild) {
  let riseTable: { flowsM3PerS: number[]; volumesM3: number[]; risePerHourK: number[][] } | null = null;
  const volumeM3 = input.poolVolumeM3 ?? r.poolMassKg / waterDensityKgPerM3(input.startTempC);
  const q = input.flowM3PerS ?? 0;
  if (input.heater.sourceTempC !== null && q > 0) {
    const flowsM3PerS = [0.5, 1, 1.5, 2].map((k) => q * k);
    const volumesM3 = [0.5, 1, 2].map((k) => volumeM3 * k);
    riseTable = { flowsM3PerS, volumesM3, risePerHourK: risePerHourTable(input.heater, flowsM3PerS, volumesM3, input.startTempC) };
  }
  let cost: { perUsefulTherm: number; perDegF: number; perK: number; forecastHeatCost: number; basis: string; season: SeasonView | null } | null = null;
  if (costInput !== undefined) {
    const c = costSchema.safeParse(costInput);
    if (!c.success) throw invalid('cost: give a fuel, a price per unit and optionally an efficiency (COP for a heat pump).', { cost: c.error.issues[0]?.message ?? 'invalid' });
    const u = usefulHeatCost({ fuel: c.data.fuel as FuelKind, pricePerUnit: c.data.pricePerUnit, efficiency: c.data.efficiency });
    const d = volumeM3 ? costPerDegree(volumeM3, u.perUsefulTherm) : { perDegF: NaN, perK: NaN };
    const season = c.data.season === undefined ? null
      : seasonView(input, parseSeason(c.data.season, 'cost.season'), { fuel: c.data.fuel, pricePerUnit: c.data.pricePerUnit, efficiency: c.data.efficiency, currency: c.data.currency || 'USD', rigBuild }, 'cost.season');
    cost = { perUsefulTherm: u.perUsefulTherm, perDegF: d.perDegF, perK: d.perK, forecastHeatCost: (r.energy.heaterJ / USEFUL_THERM_J) * u.perUsefulTherm, basis: 'HHV', season };
    if (!Number.isFinite(cost.perK)) cost = { ...cost, perDegF: 0, perK: 0 };
  }
  return { riseTable, cost };
}
