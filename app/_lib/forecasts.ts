import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Fit, type LabRow } from '@/entities';
import type { FitSuccess } from '@/analysis/fit';
import { run as runForecast } from '@/analysis/cli/forecast';
import { run as runVolume } from '@/analysis/cli/volume';
import { HttpError } from './errors';
import { plotToSvg } from './plot-svg';
import { energyBudgetInput, energyBudgetPlot, forecastPlot, type UnitSystem } from './plots';
import { UUID } from './rigs';

interface ForecastOutput {
  finalTemp_degC: number;
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
  const input = { ...body };
  let fitNote: string | null = null;
  if (typeof input.fitId === 'string') {
    const fit = UUID.test(input.fitId) ? await em.findOne(Fit, { id: input.fitId, lab }) : null;
    if (!fit) throw new HttpError(404, 'not_found', 'No such saved fit in this lab.');
    if (fit.model !== 'coil') throw new HttpError(422, 'invalid', 'Forecasts take a saved coil fit (its Ts and UA carry over to any inlet temperature).', { fields: { fitId: 'Pick a coil fit.' } });
    const p = (fit.result as { fit: FitSuccess }).fit.params;
    input.heater = { model: 'coil', sourceTemp: `${p.Ts.value} degC`, UA: `${p.UA.value} W/K` };
    fitNote = `Heater: saved fit "${fit.title}" v${fit.version} (Ts ${p.Ts.value.toFixed(1)} °C, UA ${p.UA.value.toFixed(0)} W/K).`;
    delete input.fitId;
  }
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
  const hours = out.series.at(-1)?.time_h ?? 0;
  const targetC = typeof out.hoursToTarget_h === 'number' || input.targetTemp ? parseTarget(input.targetTemp) : null;
  const e = out.energy_J;
  const trajectory = forecastPlot(
    {
      timeH: out.series.map((s) => s.time_h),
      poolC: out.series.map((s) => s.temp_degC),
      outletC: out.series.map((s) => s.outletTemp_degC),
      targetC,
      hoursToTarget: out.hoursToTarget_h,
      cautions: out.cautions.filter((c) => c.thresholdC !== null).map((c) => ({ thresholdC: c.thresholdC!, level: c.level, message: c.message })),
    },
    units,
  );
  const budget = energyBudgetPlot(
    energyBudgetInput(
      { heaterJ: e.heater_J ?? 0, solarJ: e.solar_J ?? 0, evaporationJ: e.evaporation_J ?? 0, convectionJ: e.convection_J ?? 0, radiationJ: e.radiation_J ?? 0, wallsJ: e.walls_J ?? 0, netJ: e.net_J ?? 0, evaporatedKg: out.evaporated_kg ?? 0 },
      hours,
    ),
    units,
  );
  const { series, ...summary } = out;
  return {
    ...summary,
    samples: series.length,
    fitNote,
    pool,
    plots: {
      trajectory: { title: trajectory.title, summary: trajectory.summary, svg: plotToSvg(trajectory.options) },
      budget: { title: budget.title, summary: budget.summary, svg: plotToSvg(budget.options) },
    },
  };
}

function parseTarget(v: unknown): number | null {
  if (typeof v !== 'string') return null;
  const m = /^\s*(-?[\d.]+)\s*(degC|degF)\s*$/.exec(v);
  if (!m) return null;
  return m[2] === 'degF' ? ((Number(m[1]) - 32) * 5) / 9 : Number(m[1]);
}
