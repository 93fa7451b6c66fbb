/**
 * The loss and gain options of the recirculating forecast, and their resolution (once per run)
 * into the plain numbers and typed arrays the time loop reads.
 */
import { requireFinite, requireInRange, requireNonNegative, requirePositive } from '../units/guards';
import type { ConvectionModel } from './surface-losses';
import { normaliseWeather, type WeatherPoint, type WeatherSeries } from './weather';

/** A pool cover and the hours of the day it is on. */
export interface CoverOptions {
  /** hours of the day (0–23, local, counted from `startHourOfDay`) with the cover on */
  coveredHours: number[];
  /** multiplier on evaporation while covered; default 0.1 (covers cut evaporation 90–95 %, DOMAIN.md §3.4 [4c]) */
  evaporationFactor?: number;
  /** multiplier on solar gain while covered; default 0.8 (opaque covers cut absorption 20–40 % [4d]; a clear bubble cover admits more) */
  solarFactor?: number;
  /** multiplier on convection while covered; default 1 (no sourced value: set it from your own data) */
  convectionFactor?: number;
  /** multiplier on sky radiation while covered; default 1 (no sourced value) */
  radiationFactor?: number;
}

/** Loss and gain terms. Every term can be switched off with `false`. */
export interface LossOptions {
  weather: WeatherPoint | WeatherPoint[];
  /** water surface area, m² */
  surfaceAreaM2: number;
  evaporation?: false | { activityFactor?: number; correction?: number };
  convection?: false | { model?: ConvectionModel };
  /** long-wave emissivity of the water surface, 0–1 (default 0.95) */
  radiation?: false | { emissivity?: number };
  /** conduction through walls/floor: U·A·(Tp − T_ground or air) */
  walls?: false | { areaM2: number; uWPerM2K: number; groundTempC?: number };
  /** solar absorptance of the pool, 0–1 (default 0.85, a light pool) */
  solar?: false | { absorptance?: number };
  cover?: CoverOptions;
}

/**
 * A 24-entry mask of the hours of the day listed (all hours when `hours` is undefined and `all`).
 * @throws TypeError / RangeError naming `field` for a non-array or an hour outside 0–23.
 * @example hourMask([22, 23], 'coveredHours', false)[23] // 1
 */
export function hourMask(hours: number[] | undefined, field: string, all: boolean): Uint8Array {
  const m = new Uint8Array(24);
  if (hours === undefined) { m.fill(all ? 1 : 0); return m; }
  if (!Array.isArray(hours)) throw new TypeError(`${field} must be an array of hours 0–23`);
  hours.forEach((h, i) => {
    if (!Number.isInteger(h) || h < 0 || h > 23) throw new RangeError(`${field}[${i}] must be an integer hour 0–23, got ${h}`);
    m[h] = 1;
  });
  return m;
}

/** Per-hour multipliers and switches, resolved once. */
export interface Terms {
  area: number; evap: number; conv: number; convModel: ConvectionModel; rad: number; emis: number;
  wallUA: number; groundC: number | null; solar: number; cover: Uint8Array;
  cEvap: number; cSolar: number; cConv: number; cRad: number; weather: WeatherSeries;
}

/**
 * Validates the loss options and resolves them.
 * @throws TypeError / RangeError naming the field (a negative area or factor; an emissivity or
 *   absorptance outside 0–1, which no surface has).
 * @example resolveTerms({ weather: { airTempC: 20, relativeHumidity: 0.5 }, surfaceAreaM2: 40 }).area // 40
 */
export function resolveTerms(l: LossOptions): Terms {
  const area = requirePositive(l.surfaceAreaM2, 'losses.surfaceAreaM2');
  const weather = normaliseWeather(l.weather);
  const ev = l.evaporation === false ? null : l.evaporation ?? {};
  const cv = l.convection === false ? null : l.convection ?? {};
  const rd = l.radiation === false ? null : l.radiation ?? {};
  const so = l.solar === false ? null : l.solar ?? {};
  const w = l.walls ? l.walls : null;
  const c = l.cover;
  return {
    area,
    evap: ev ? requireNonNegative(ev.activityFactor ?? 1, 'losses.evaporation.activityFactor') * requireNonNegative(ev.correction ?? 1, 'losses.evaporation.correction') : 0,
    conv: cv ? 1 : 0,
    convModel: cv?.model ?? 'pool-guidance',
    rad: rd ? 1 : 0,
    emis: rd ? requireInRange(rd.emissivity ?? 0.95, 'losses.radiation.emissivity', 0, 1) : 0,
    wallUA: w ? requireNonNegative(w.areaM2, 'losses.walls.areaM2') * requireNonNegative(w.uWPerM2K, 'losses.walls.uWPerM2K') : 0,
    groundC: w && w.groundTempC !== undefined ? requireFinite(w.groundTempC, 'losses.walls.groundTempC') : null,
    solar: so ? requireInRange(so.absorptance ?? 0.85, 'losses.solar.absorptance', 0, 1) : 0,
    cover: hourMask(c?.coveredHours, 'losses.cover.coveredHours', false),
    cEvap: requireNonNegative(c?.evaporationFactor ?? 0.1, 'losses.cover.evaporationFactor'),
    cSolar: requireNonNegative(c?.solarFactor ?? 0.8, 'losses.cover.solarFactor'),
    cConv: requireNonNegative(c?.convectionFactor ?? 1, 'losses.cover.convectionFactor'),
    cRad: requireNonNegative(c?.radiationFactor ?? 1, 'losses.cover.radiationFactor'),
    weather,
  };
}

