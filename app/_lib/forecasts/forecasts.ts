import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Fit, type LabRow } from '@/entities';
import { run as runForecast } from '@/analysis/cli/forecast';
import { run as runVolume } from '@/analysis/cli/volume';
import { costPerDegree, usefulHeatCost, USEFUL_THERM_J } from '@/analysis/cost/useful-heat-cost';
import type { FuelKind } from '@/analysis/cost/fuels';
import { coilHeater } from '@/analysis/performance/heater-model';
import { risePerHourTable } from '@/analysis/pool/mixing';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { reduceForDisplay } from '@/analysis/reduce';
import { checkForecastWork, FORECAST_LIMITS } from '@/analysis/forecast/forecast-limits';
import { z } from 'zod';
import { HttpError } from '../server/errors';
import { plotToSvg } from '../plots/plot-svg';
import { energyBudgetInput, energyBudgetPlot, forecastPlot } from '../plots';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { UUID } from '../rigs/rigs';
import { parseStoredFit } from '../fits/stored-fit';
import type { ForecastExport } from '../exports';

interface ForecastOutput {
  finalTemp_degC: number;
  poolMass_kg: number;
  maxTemp_degC: number;
  maxOutletTemp_degC: number;
  hoursToTarget_h: number | null;
  equilibriumTemp_degC: number | null;
  equilibriumNote?: string;
  energy_J: Record<string, number>;
  evaporated_kg: number;
  series: { time_h: number; temp_degC: number; outletTemp_degC: number }[];
  cautions: { code: string; level: string; thresholdC: number | null; message: string }[];
}

/**
 * Runs the recirculating forecast (the same contract as `npm run analysis -- forecast`, unit
 * strings in) and renders its plots. With `fitId`, the heater is the saved coil fit's Ts and UA.
 */
export async function forecast(em: EntityManager, lab: LabRow, body: Record<string, unknown>, units: UnitSystem) {
  const { input, out, pool, fitNote, costInput } = await runForecastBody(em, lab, body);
  const hours = out.series.at(-1)?.time_h ?? 0;
  const targetC = typeof out.hoursToTarget_h === 'number' || input.targetTemp ? parseTarget(input.targetTemp) : null;
  // Long series (a season sampled hourly and finer) are reduced for display, keeping extremes and endpoints.
  const shown = reduceForDisplay(out.series.map((s) => s.time_h), out.series.map((s) => s.temp_degC));
  const pick = <T,>(f: (s: ForecastOutput['series'][number]) => T) => Array.from(shown.indices, (i) => f(out.series[i]));
  const trajectory = forecastPlot(
    {
      timeH: pick((s) => s.time_h),
      poolC: pick((s) => s.temp_degC),
      outletTempC: pick((s) => s.outletTemp_degC),
      targetC,
      hoursToTarget: out.hoursToTarget_h,
      cautions: out.cautions.filter((c) => c.thresholdC !== null).map((c) => ({ thresholdC: c.thresholdC!, level: c.level, message: c.message })),
    },
    units,
  );
  const budget = energyBudgetPlot(
    energyBudgetInput(
      budgetOf(out),
      hours,
    ),
    units,
  );
  const { series, ...summary } = out;
  const extras = await forecastExtras(input, pool, out, costInput);
  return {
    ...summary,
    samples: series.length,
    shownSamples: shown.indices.length,
    fitNote,
    pool,
    ...extras,
    plots: {
      trajectory: { title: trajectory.title, summary: trajectory.summary, svg: plotToSvg(trajectory.options) },
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

/** The forecast of a request body: the saved fit as heater, the pool by shape, the CLI contract. */
async function runForecastBody(em: EntityManager, lab: LabRow, body: Record<string, unknown>) {
  const input = { ...body };
  let fitNote: string | null = null;
  if (typeof input.fitId === 'string') {
    const fit = UUID.test(input.fitId) ? await em.findOne(Fit, { id: input.fitId, lab }) : null;
    if (!fit) throw new HttpError(404, 'not_found', 'No such saved fit in this lab.');
    if (fit.model !== 'coil') throw new HttpError(422, 'invalid', 'Forecasts take a saved coil fit (its Ts and UA carry over to any inlet temperature).', { fields: { fitId: 'Pick a coil fit.' } });
    const p = parseStoredFit(fit.result, fit.id).fit.params;
    input.heater = { model: 'coil', sourceTemp: `${p.Ts.value} degC`, UA: `${p.UA.value} W/K` };
    fitNote = `Heater: saved fit "${fit.title}" v${fit.version} (Ts ${p.Ts.value.toFixed(1)} °C, UA ${p.UA.value.toFixed(0)} W/K).`;
    delete input.fitId;
  }
  const costInput = input.cost;
  delete input.cost;
  let out: ForecastOutput;
  let pool: { volume_m3: number; area_m2: number } | null = null;
  try {
    if (input.pool && typeof input.pool === 'object') {
      pool = runVolume(input.pool) as { volume_m3: number; area_m2: number };
      input.poolVolume = `${pool.volume_m3} m^3`;
      if (input.losses && typeof input.losses === 'object') (input.losses as Record<string, unknown>).surfaceArea = `${pool.area_m2} m^2`;
      delete input.pool;
    }
    out = runForecast(input) as ForecastOutput;
  } catch (e) {
    if (e instanceof Error && (e.name === 'InputError' || e instanceof RangeError || e instanceof TypeError)) {
      const field = /^([\w.[\]]+):/.exec(e.message)?.[1] ?? '_';
      throw new HttpError(422, 'invalid', e.message, { fields: { [field]: e.message } });
    }
    throw e;
  }
  return { input, out, pool, fitNote, costInput };
}

/**
 * A forecast block's results for the spreadsheet export (Forecast sheet and Summary items).
 * @throws HttpError 404 / 422 as {@link forecast}
 */
export async function forecastForExport(em: EntityManager, lab: LabRow, body: Record<string, unknown>, label: string): Promise<ForecastExport> {
  const { out } = await runForecastBody(em, lab, body);
  return {
    label,
    result: {
      timeH: Float64Array.from(out.series, (x) => x.time_h),
      tempC: Float64Array.from(out.series, (x) => x.temp_degC),
      outletTempC: Float64Array.from(out.series, (x) => x.outletTemp_degC),
      finalTempC: out.finalTemp_degC, maxTempC: out.maxTemp_degC, maxOutletTempC: out.maxOutletTemp_degC, poolMassKg: out.poolMass_kg,
      steps: out.series.length, hoursToTarget: out.hoursToTarget_h, equilibriumTempC: out.equilibriumTemp_degC, equilibriumNote: out.equilibriumNote ?? '',
      energy: budgetOf(out),
      cautions: out.cautions as ForecastExport['result']['cautions'],
    },
  };
}

/** The energy budget by term from the CLI's output (J, kg). */
function budgetOf(out: ForecastOutput) {
  const e = out.energy_J;
  return {
    heaterJ: e.heater_J ?? 0, solarJ: e.solar_J ?? 0, evaporationJ: e.evaporation_J ?? 0, convectionJ: e.convection_J ?? 0,
    radiationJ: e.radiation_J ?? 0, wallsJ: e.walls_J ?? 0, netJ: e.net_J ?? 0, evaporatedKg: out.evaporated_kg ?? 0,
  };
}

/** The target as the forecast read it (analysis/units), °C; null when none was given. */
function parseTarget(v: unknown): number | null {
  if (typeof v !== 'string') return null;
  try {
    return parseQuantity(v, 'temperature', 'targetTemp');
  } catch {
    return null;
  }
}

const costSchema = z.object({ fuel: z.enum(['natural-gas', 'propane', 'electric-resistance', 'heat-pump', 'wood']), pricePerUnit: z.number().positive(), efficiency: z.number().positive().max(10).optional() }).strict();

/**
 * The rise per hour by flow × pool size (coil heater, at the start temperature) and, with a fuel
 * price, the cost of a useful therm, of one degree and of this forecast's heat.
 */
async function forecastExtras(input: Record<string, unknown>, pool: { volume_m3: number } | null, out: ForecastOutput, costInput: unknown) {
  const heater = input.heater as { model?: string; sourceTemp?: string; UA?: string } | undefined;
  let riseTable: { flowsM3PerS: number[]; volumesM3: number[]; risePerHourK: number[][] } | null = null;
  let volumeM3: number | null = pool?.volume_m3 ?? null;
  try {
    if (volumeM3 === null && typeof input.poolVolume === 'string') volumeM3 = parseQuantity(input.poolVolume, 'volume', 'poolVolume');
    if (heater?.model === 'coil' && heater.sourceTemp && heater.UA && volumeM3 && typeof input.flow === 'string' && typeof input.startTemp === 'string') {
      const coil = coilHeater({ sourceTempC: parseQuantity(heater.sourceTemp, 'temperature', 'heater.sourceTemp'), uaWPerK: parseQuantity(heater.UA, 'conductance', 'heater.UA') });
      const q = parseQuantity(input.flow, 'volumeFlow', 'flow');
      const flowsM3PerS = [0.5, 1, 1.5, 2].map((k) => q * k);
      const volumesM3 = [0.5, 1, 2].map((k) => volumeM3! * k);
      riseTable = { flowsM3PerS, volumesM3, risePerHourK: risePerHourTable(coil, flowsM3PerS, volumesM3, parseQuantity(input.startTemp, 'temperature', 'startTemp')) };
    }
  } catch {
    riseTable = null;
  }
  let cost: { perUsefulTherm: number; perDegF: number; perK: number; forecastHeatCost: number; basis: string } | null = null;
  if (costInput !== undefined) {
    const c = costSchema.safeParse(costInput);
    if (!c.success) throw new HttpError(422, 'invalid', 'cost: give a fuel, a price per unit and optionally an efficiency (COP for a heat pump).', { fields: { cost: c.error.issues[0]?.message ?? 'invalid' } });
    const u = usefulHeatCost({ fuel: c.data.fuel as FuelKind, pricePerUnit: c.data.pricePerUnit, efficiency: c.data.efficiency });
    const d = volumeM3 ? costPerDegree(volumeM3, u.perUsefulTherm) : { perDegF: NaN, perK: NaN };
    cost = { perUsefulTherm: u.perUsefulTherm, perDegF: d.perDegF, perK: d.perK, forecastHeatCost: ((out.energy_J.heater_J ?? 0) / USEFUL_THERM_J) * u.perUsefulTherm, basis: 'HHV' };
    if (!Number.isFinite(cost.perK)) cost = { ...cost, perDegF: 0, perK: 0 };
  }
  return { riseTable, cost };
}
