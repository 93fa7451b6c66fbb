import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Fit, type FitRow, type LabRow } from '@/entities';
import { collectorParameters } from '../fits/collector-analysis';
import { checkForecastWork, FORECAST_LIMITS } from '@/analysis/forecast/forecast-limits';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { invalid, notFound } from '../server/errors';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { isUuid } from '../labs/load-in-lab';
import { parseStoredFit } from '../fits/stored-fit';
import { runAnalysis } from '../server/analysis-pool';
import type { ForecastExport } from '../exports';
import type { SeasonView } from '@/app/_contracts/study-blocks';
import type { BuildFuel, RigBuild } from './season';

/**
 * The heater of a saved coil fit named by `fitId` (its Ts and UA as unit strings) and the note
 * the page shows about it; nothing when the body names no fit.
 * @throws DomainError not_found (no such fit in this lab), invalid (not a coil fit)
 */
async function fitHeater(em: EntityManager, lab: LabRow, fitId: unknown, sun?: unknown): Promise<{ heater?: Record<string, unknown>; fitNote: string | null; rigBuild?: RigBuild }> {
  if (fitId === undefined) return { fitNote: null };
  const fit = isUuid(fitId) ? await em.findOne(Fit, { id: fitId, lab }, { populate: ['rig'] }) : null;
  if (!fit) throw notFound('No such saved fit in this lab.');
  if (fit.kind === 'collector') return collectorHeaterOf(fit, sun);
  if (fit.model !== 'coil') throw invalid('Forecasts take a saved coil fit (its Ts and UA carry over to any inlet temperature) or a collector fit.', { fitId: 'Pick a coil or collector fit.' });
  const p = parseStoredFit(fit.result, fit.id).fit.params;
  const cost = Number(fit.rig.details?.buildCost);
  return {
    ...(cost > 0 ? { rigBuild: { amount: cost, rig: fit.rig.name } } : {}),
    heater: { model: 'coil', sourceTemp: `${p.Ts.value} degC`, UA: `${p.UA.value} W/K` },
    fitNote: `Heater: saved fit "${fit.title}" v${fit.version} (Ts ${p.Ts.value.toFixed(1)} °C, UA ${p.UA.value.toFixed(0)} W/K).`,
  };
}

/** The sun on a collector heater during the forecast: irradiance in its plane and the air around it. */
const sunSchema = z.object({
  irradiance: z.string().trim().min(1).max(40),
  ambientTemp: z.string().trim().min(1).max(40),
  modules: z.number().int().min(1).max(200).optional(),
}).strict();

/**
 * A saved collector fit as the heater of a forecast: its coefficients and the steady sun of the
 * heater hours, as plain data for the analysis pool (`solarCollectorHeater` runs there).
 * @throws DomainError invalid (unphysical coefficients, no or bad sun)
 */
function collectorHeaterOf(fit: FitRow, sun: unknown): { heater: Record<string, unknown>; fitNote: string } {
  const p = collectorParameters(fit);
  if (!p) throw invalid(`The collector fit "${fit.title}" has unphysical coefficients (η0 outside (0, 1] or a negative loss): it cannot heat a forecast.`, { fitId: 'Pick another collector fit.' });
  const s = sunSchema.safeParse(sun);
  if (!s.success) throw invalid('A collector heater needs the sun of the forecast: sun.irradiance in its plane (e.g. "800 W/m^2") and sun.ambientTemp (e.g. "25 degC").', { sun: s.error.issues[0]?.message ?? 'missing' });
  const G = parseQuantity(s.data.irradiance, 'irradiance', 'sun.irradiance');
  const Ta = parseQuantity(s.data.ambientTemp, 'temperature', 'sun.ambientTemp');
  if (!(G >= 0 && G <= 1500)) throw invalid(`sun.irradiance ${G.toFixed(0)} W/m² is outside 0–1,500 W/m².`, { sun: 'irradiance 0–1,500 W/m²' });
  if (!(Ta > -40 && Ta < 60)) throw invalid(`sun.ambientTemp ${Ta.toFixed(1)} °C is outside −40…60 °C.`, { sun: 'air −40…60 °C' });
  return {
    heater: { model: 'solar-collector', collector: p, irradianceWPerM2: G, ambientTempC: Ta, modules: s.data.modules ?? 1 },
    fitNote: `Heater: collector fit "${fit.title}" v${fit.version} (η0 ${p.eta0?.toFixed(3) ?? '–'}, a1 ${p.a1WPerM2K.toFixed(2)} W/(m²·K) on ${p.areaM2} m² ${p.areaBasis}) at ${G.toFixed(0)} W/m² and ${Ta.toFixed(1)} °C air during the heater hours.`,
  };
}

/**
 * Runs the recirculating forecast of a request body (the same fields as `npm run analysis --
 * forecast`, quantities as unit strings; `pool` by its shape instead of a volume; `fitId` for a
 * saved coil fit as the heater) in the analysis pool (forecast-compute.ts). Its plots come as the
 * builders' inputs for the browser to draw, and as server SVG too when `render` is 'svg' (study
 * blocks).
 * @throws DomainError not_found (no such fit), unavailable (the pool is full); InputError (422) naming the field the user wrote
 */
export async function forecast(em: EntityManager, lab: LabRow, body: Record<string, unknown>, units: UnitSystem, render: 'svg' | 'data' = 'svg') {
  const { heater, fitNote, rigBuild } = await fitHeater(em, lab, body.fitId, body.sun);
  return runAnalysis('forecast', { body, heater, fitNote, units, render, rigBuild });
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
 * A forecast block's results for the spreadsheet export (Forecast sheet and Summary items, the
 * measured day among them when the block has one).
 * @throws as {@link forecast}
 */
export async function forecastForExport(em: EntityManager, lab: LabRow, body: Record<string, unknown>, label: string): Promise<ForecastExport> {
  const { heater } = await fitHeater(em, lab, body.fitId, body.sun);
  const { result, measuredDay } = await runAnalysis('forecastExport', { body, heater });
  return { label, result, ...(measuredDay ? { measuredDay } : {}) };
}

/**
 * A season of a forecast's pool for a cost sheet (app/_lib/forecasts/season.ts), in the analysis
 * pool: the forecast body's pool, weather and loss terms, its saved fit as the heater.
 * @throws DomainError invalid naming the season's field, not_found (no such fit); InputError naming the forecast's field
 */
export async function forecastSeason(em: EntityManager, lab: LabRow, body: Record<string, unknown>, season: unknown, build: BuildFuel): Promise<SeasonView> {
  const { heater, rigBuild } = await fitHeater(em, lab, body.fitId, body.sun);
  return runAnalysis('forecastSeason', { body, heater, season, build: { ...build, rigBuild } });
}
