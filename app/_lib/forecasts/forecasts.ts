import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Fit, type FitRow, type LabRow } from '@/entities';
import { solarCollectorHeater } from '@/analysis/performance/collector-efficiency';
import type { HeaterModel } from '@/analysis/performance/heater-model';
import { measuredDayCheck } from '@/analysis/forecast/measured-day-check';
import { collectorParameters } from '../fits/collector-analysis';
import { costPerDegree, usefulHeatCost, USEFUL_THERM_J } from '@/analysis/cost/useful-heat-cost';
import type { FuelKind } from '@/analysis/cost/fuels';
import { checkForecastWork, FORECAST_LIMITS } from '@/analysis/forecast/forecast-limits';
import { forecastJson } from '@/analysis/forecast/forecast-json';
import { readForecastInput } from '@/analysis/forecast/read-forecast-input';
import { recirculatingForecast, type ForecastInput, type ForecastResult } from '@/analysis/forecast/recirculating-forecast';
import { risePerHourTable } from '@/analysis/pool/mixing';
import { poolGeometry, type PoolGeometry } from '@/analysis/pool/pool-geometry';
import { readPoolDimensions } from '@/analysis/pool/read-pool-dimensions';
import { reduceForDisplay } from '@/analysis/reduce';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { readingInput } from '@/analysis/units/reading-input';
import { waterDensityKgPerM3 } from '@/analysis/water/water-properties';
import { invalid, notFound } from '../server/errors';
import { plotToSvg } from '../plots/plot-svg';
import { energyBudgetInput, energyBudgetPlot, forecastPlot } from '../plots';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { isUuid } from '../labs/load-in-lab';
import { parseStoredFit } from '../fits/stored-fit';
import type { ForecastExport } from '../exports';

/** A forecast as the app runs it: the typed input, its result, and what the page adds. */
interface Prepared {
  input: ForecastInput;
  result: ForecastResult;
  pool: PoolGeometry | null;
  fitNote: string | null;
  costInput: unknown;
}

/**
 * Runs the recirculating forecast of a request body (the same fields as `npm run analysis --
 * forecast`, quantities as unit strings; `pool` by its shape instead of a volume; `fitId` for a
 * saved coil fit as the heater) and renders its plots.
 * @throws DomainError not_found (no such fit); InputError (422) naming the field the user wrote
 */
export async function forecast(em: EntityManager, lab: LabRow, body: Record<string, unknown>, units: UnitSystem) {
  const { input, result: r, pool, fitNote, costInput } = await prepareForecast(em, lab, body);
  const measured = body.measured === undefined ? null : measuredDayOf(input, body.measured);
  // Long series (a season sampled hourly and finer) are reduced for display, keeping extremes and endpoints.
  const shown = reduceForDisplay(r.timeH, r.tempC);
  const pick = (a: Float64Array) => Array.from(shown.indices, (i) => a[i]);
  const trajectory = forecastPlot(
    {
      timeH: pick(r.timeH),
      poolC: pick(r.tempC),
      outletTempC: pick(r.outletTempC),
      targetC: input.targetTempC ?? null,
      hoursToTarget: r.hoursToTarget,
      cautions: r.cautions.filter((c) => c.thresholdC !== null).map((c) => ({ thresholdC: c.thresholdC!, level: c.level, message: c.message })),
    },
    units,
  );
  const budget = energyBudgetPlot(energyBudgetInput(r.energy, input.hours), units);
  return {
    ...forecastJson(r),
    samples: r.timeH.length,
    shownSamples: shown.indices.length,
    fitNote,
    pool: pool && { volume_m3: pool.volumeM3, area_m2: pool.areaM2 },
    ...forecastExtras(input, r, costInput),
    measuredDay: measured,
    plots: {
      trajectory: { title: trajectory.title, summary: trajectory.summary, svg: plotToSvg(trajectory.options), cautions: trajectory.cautions },
      budget: { title: budget.title, summary: budget.summary, svg: plotToSvg(budget.options) },
    },
  };
}

/**
 * Why a forecast body would be more work than one forecast may be (the horizon, the step, the
 * number of steps or of weather rows beyond FORECAST_LIMITS), or null. Checked when a study's
 * forecast block is saved, so a study never stores a forecast that cannot run; the forecast itself
 * checks the same limits again when it runs.
 */
export function forecastWorkProblem(body: Record<string, unknown>): string | null {
  try {
    const hours = body.hours;
    if (hours === undefined) return null;
    if (typeof hours !== 'number' || !Number.isFinite(hours) || hours <= 0) return 'hours must be a number of hours greater than 0';
    const stepS = body.step === undefined ? 60 : parseQuantity(body.step, 'time', 'step');
    checkForecastWork(hours, stepS);
    const losses = body.losses as { weather?: unknown } | undefined;
    if (losses && Array.isArray(losses.weather) && losses.weather.length > FORECAST_LIMITS.maxWeatherRows) {
      return `losses.weather has ${losses.weather.length} rows; at most ${FORECAST_LIMITS.maxWeatherRows} (a leap year of hours) are allowed`;
    }
    return null;
  } catch (e) {
    return e instanceof Error ? e.message : String(e);
  }
}

/**
 * The typed forecast of a request body: the saved fit as heater, the pool by its shape (its area
 * the surface of the loss terms), read by the same reader as the command line.
 */
async function prepareForecast(em: EntityManager, lab: LabRow, body: Record<string, unknown>): Promise<Prepared> {
  const { fitId, cost: costInput, pool: poolBody, measured: _measured, sun, ...rest } = body;
  void _measured;
  let fitNote: string | null = null;
  let collector: { heater: HeaterModel; note: string } | null = null;
  const input: Record<string, unknown> = { ...rest };
  if (fitId !== undefined) {
    const fit = isUuid(fitId) ? await em.findOne(Fit, { id: fitId, lab }) : null;
    if (!fit) throw notFound('No such saved fit in this lab.');
    if (fit.kind === 'collector') {
      collector = collectorHeaterOf(fit, sun);
      input.heater = { model: 'fixed-rise', rise: '0 K' }; // replaced by the collector below, once the input is read
      fitNote = collector.note;
    } else {
      if (fit.model !== 'coil') throw invalid('Forecasts take a saved coil fit (its Ts and UA carry over to any inlet temperature) or a collector fit.', { fitId: 'Pick a coil or collector fit.' });
      const p = parseStoredFit(fit.result, fit.id).fit.params;
      input.heater = { model: 'coil', sourceTemp: `${p.Ts.value} degC`, UA: `${p.UA.value} W/K` };
      fitNote = `Heater: saved fit "${fit.title}" v${fit.version} (Ts ${p.Ts.value.toFixed(1)} °C, UA ${p.UA.value.toFixed(0)} W/K).`;
    }
  }
  return readingInput((read) => {
    const pool = poolBody === undefined ? null : poolGeometry(readPoolDimensions(read, poolBody, 'pool'));
    if (pool && input.losses && typeof input.losses === 'object') input.losses = { ...(input.losses as object), surfaceArea: `${pool.areaM2} m^2` };
    const typed = readForecastInput(read, input);
    if (pool) typed.poolVolumeM3 = pool.volumeM3;
    if (collector) typed.heater = collector.heater;
    return { input: typed, result: recirculatingForecast(typed), pool, fitNote, costInput };
  });
}

/**
 * A forecast block's results for the spreadsheet export (Forecast sheet and Summary items).
 * @throws as {@link forecast}
 */
export async function forecastForExport(em: EntityManager, lab: LabRow, body: Record<string, unknown>, label: string): Promise<ForecastExport> {
  return { label, result: (await prepareForecast(em, lab, body)).result };
}

/** The sun on a collector heater during the forecast: irradiance in its plane and the air around it. */
const sunSchema = z.object({
  irradiance: z.string().trim().min(1).max(40),
  ambientTemp: z.string().trim().min(1).max(40),
  modules: z.number().int().min(1).max(200).optional(),
}).strict();

/** A saved collector fit as the heater of a forecast (`solarCollectorHeater` at a steady sun). */
function collectorHeaterOf(fit: FitRow, sun: unknown): { heater: HeaterModel; note: string } {
  const p = collectorParameters(fit);
  if (!p) throw invalid(`The collector fit "${fit.title}" has unphysical coefficients (η0 outside (0, 1] or a negative loss): it cannot heat a forecast.`, { fitId: 'Pick another collector fit.' });
  const s = sunSchema.safeParse(sun);
  if (!s.success) throw invalid('A collector heater needs the sun of the forecast: sun.irradiance in its plane (e.g. "800 W/m^2") and sun.ambientTemp (e.g. "25 degC").', { sun: s.error.issues[0]?.message ?? 'missing' });
  const G = parseQuantity(s.data.irradiance, 'irradiance', 'sun.irradiance');
  const Ta = parseQuantity(s.data.ambientTemp, 'temperature', 'sun.ambientTemp');
  if (!(G >= 0 && G <= 1500)) throw invalid(`sun.irradiance ${G.toFixed(0)} W/m² is outside 0–1,500 W/m².`, { sun: 'irradiance 0–1,500 W/m²' });
  const heater = solarCollectorHeater({ collector: p, irradianceWPerM2: G, ambientTempC: Ta, modules: s.data.modules });
  return { heater, note: `Heater: collector fit "${fit.title}" v${fit.version} (η0 ${p.eta0?.toFixed(3) ?? '–'}, a1 ${p.a1WPerM2K.toFixed(2)} W/(m²·K) on ${p.areaM2} m² ${p.areaBasis}) at ${G.toFixed(0)} W/m² and ${Ta.toFixed(1)} °C air during the heater hours.` };
}

const measuredSchema = z.object({
  endTemp: z.string().trim().min(1, 'give the measured end temperature').max(40),
  thermometerU: z.string().trim().min(1).max(40).default('0.3 K'),
  volumeRelativeU: z.number().min(0).max(0.5, 'the volume uncertainty is at most 50 %').default(0.05),
}).strict();

/** The measured day of a forecast: its end against the measured end, the unmodelled gain and its uncertainty. */
function measuredDayOf(input: ForecastInput, body: unknown) {
  const m = measuredSchema.safeParse(body);
  if (!m.success) throw invalid(`measured: ${m.error.issues[0]?.message ?? 'invalid'}`, { measured: m.error.issues[0]?.message ?? 'invalid' });
  const endC = parseQuantity(m.data.endTemp, 'temperature', 'measured.endTemp');
  const uT = parseQuantity(m.data.thermometerU, 'temperatureDifference', 'measured.thermometerU');
  if (!(endC > -40 && endC < 100)) throw invalid(`measured.endTemp ${endC.toFixed(1)} °C is outside the water range 0–100 °C.`, { measured: 'end temperature 0–100 °C' });
  if (!(uT >= 0 && uT <= 5)) throw invalid('measured.thermometerU must be within 0–5 K.', { measured: 'thermometer uncertainty 0–5 K' });
  const c = measuredDayCheck(input, endC, { thermometerK: uT, volumeRelative: m.data.volumeRelativeU });
  return {
    startTemp_degC: input.startTempC, observedEndTemp_degC: c.observedEndC, predictedEndTemp_degC: c.predictedEndC, residual_K: c.residualK, residualU_K: c.residualUK,
    unmodelledGain_J: c.unmodelledGainJ, unmodelledGainU_J: c.gainUJ, unmodelledGain_W: c.unmodelledGainW, unmodelledGainU_W: c.gainUW,
    unmodelledGain_W_per_m2: c.unmodelledGainWPerM2, significant: c.significant, verdict: c.verdict, heaterHours: input.heaterHours ?? null, hours: input.hours,
  };
}
export type MeasuredDayView = ReturnType<typeof measuredDayOf>;

const costSchema = z.object({ fuel: z.enum(['natural-gas', 'propane', 'electric-resistance', 'heat-pump', 'wood']), pricePerUnit: z.number().positive(), efficiency: z.number().positive().max(10).optional() }).strict();

/**
 * The rise per hour by flow × pool size (a heater with a source temperature, at the start temperature) and, with a fuel
 * price, the cost of a useful therm, of one degree and of this forecast's heat.
 */
function forecastExtras(input: ForecastInput, r: ForecastResult, costInput: unknown) {
  let riseTable: { flowsM3PerS: number[]; volumesM3: number[]; risePerHourK: number[][] } | null = null;
  const volumeM3 = input.poolVolumeM3 ?? r.poolMassKg / waterDensityKgPerM3(input.startTempC);
  const q = input.flowM3PerS ?? 0;
  if (input.heater.sourceTempC !== null && q > 0) {
    const flowsM3PerS = [0.5, 1, 1.5, 2].map((k) => q * k);
    const volumesM3 = [0.5, 1, 2].map((k) => volumeM3 * k);
    riseTable = { flowsM3PerS, volumesM3, risePerHourK: risePerHourTable(input.heater, flowsM3PerS, volumesM3, input.startTempC) };
  }
  let cost: { perUsefulTherm: number; perDegF: number; perK: number; forecastHeatCost: number; basis: string } | null = null;
  if (costInput !== undefined) {
    const c = costSchema.safeParse(costInput);
    if (!c.success) throw invalid('cost: give a fuel, a price per unit and optionally an efficiency (COP for a heat pump).', { cost: c.error.issues[0]?.message ?? 'invalid' });
    const u = usefulHeatCost({ fuel: c.data.fuel as FuelKind, pricePerUnit: c.data.pricePerUnit, efficiency: c.data.efficiency });
    const d = volumeM3 ? costPerDegree(volumeM3, u.perUsefulTherm) : { perDegF: NaN, perK: NaN };
    cost = { perUsefulTherm: u.perUsefulTherm, perDegF: d.perDegF, perK: d.perK, forecastHeatCost: (r.energy.heaterJ / USEFUL_THERM_J) * u.perUsefulTherm, basis: 'HHV' };
    if (!Number.isFinite(cost.perK)) cost = { ...cost, perDegF: 0, perK: 0 };
  }
  return { riseTable, cost };
}
