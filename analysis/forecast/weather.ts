/**
 * Weather for the forecast: one set of constants, or an hourly table (row 0 = the first hour of
 * the forecast; a table shorter than the forecast repeats, so a 24-row "typical day" serves a
 * season). Each row is normalised once into typed arrays the time loop reads without allocating.
 */
import { requireFinite, requireInRange, requireNonNegative } from '../units/guards';
import { saturationPressureUncheckedPa, saturationTempUncheckedC } from '../water/saturation-pressure';

/**
 * Vapour pressure over liquid water at a dew point, Pa. Dew points are defined over liquid water
 * (WMO convention); below 0 °C IF97 Eq. (30) is extrapolated over supercooled water, where the
 * pressures are small enough that its few-percent error does not matter here.
 */
function vapourPressureAtPa(tempC: number): number {
  return saturationPressureUncheckedPa(tempC + 273.15);
}

/** Weather for one hour. Give humidity as a dew point or a relative humidity. */
export interface WeatherPoint {
  /** air temperature, °C */
  airTempC: number;
  /** dew point, °C */
  dewPointC?: number;
  /** relative humidity, 0–1 */
  relativeHumidity?: number;
  /** air speed over the water surface, m/s (lower than a 10 m weather-station wind) */
  windMPerS?: number;
  /** global horizontal irradiance, W/m² (default 0) */
  solarWPerM2?: number;
  /** effective sky temperature, °C; default from cloud cover */
  skyTempC?: number;
  /** cloud cover, 0 (clear) – 1 (overcast); default 0.5 */
  cloudCover?: number;
}

/** Normalised hourly weather. */
export interface WeatherSeries {
  hours: number;
  airTempC: Float64Array;
  vapourPressurePa: Float64Array;
  windMPerS: Float64Array;
  solarWPerM2: Float64Array;
  skyTempC: Float64Array;
  /** the temperature at which evaporation stops (saturation at the air's vapour pressure), °C; −Infinity for dry air */
  dewPointC: Float64Array;
}

/**
 * Sky temperature when none is given: Ta (overcast) down to Ta − 20 K (clear), interpolated
 * linearly in cloud cover. The range is DOMAIN.md §3.4 (after Kalogirou); the linear
 * interpolation is our simplification.
 * @example defaultSkyTempC(20, 0) // 0
 */
export function defaultSkyTempC(airTempC: number, cloudCover: number): number {
  return airTempC - 20 * (1 - cloudCover);
}

/**
 * Validates and normalises weather.
 * @throws TypeError / RangeError naming the row and field (missing humidity, RH outside 0–1,
 *   negative wind or irradiance, dew point above the air temperature).
 * @example normaliseWeather({ airTempC: 20, relativeHumidity: 0.6, windMPerS: 1 }).hours // 1
 */
export function normaliseWeather(weather: WeatherPoint | WeatherPoint[]): WeatherSeries {
  const rows = Array.isArray(weather) ? weather : [weather];
  if (rows.length === 0) throw new RangeError('weather must have at least one row');
  const n = rows.length;
  const s: WeatherSeries = {
    hours: n,
    airTempC: new Float64Array(n), vapourPressurePa: new Float64Array(n), windMPerS: new Float64Array(n),
    solarWPerM2: new Float64Array(n), skyTempC: new Float64Array(n), dewPointC: new Float64Array(n),
  };
  rows.forEach((w, i) => {
    const f = Array.isArray(weather) ? `weather[${i}]` : 'weather';
    if (w == null || typeof w !== 'object') throw new TypeError(`${f} must be an object, got ${String(w)}`);
    const ta = requireInRange(w.airTempC, `${f}.airTempC`, -60, 60);
    let pa: number;
    if (w.dewPointC !== undefined) {
      const td = requireFinite(w.dewPointC, `${f}.dewPointC`);
      if (td > ta + 1e-9) throw new RangeError(`${f}.dewPointC (${td}) must not exceed ${f}.airTempC (${ta})`);
      pa = vapourPressureAtPa(td);
    } else if (w.relativeHumidity !== undefined) {
      const rh = requireInRange(w.relativeHumidity, `${f}.relativeHumidity`, 0, 1);
      pa = rh * vapourPressureAtPa(ta);
    } else {
      throw new RangeError(`${f} needs dewPointC or relativeHumidity`);
    }
    const cloud = requireInRange(w.cloudCover ?? 0.5, `${f}.cloudCover`, 0, 1);
    s.airTempC[i] = ta;
    s.vapourPressurePa[i] = pa;
    const dew = saturationTempUncheckedC(pa);
    s.dewPointC[i] = Number.isFinite(dew) ? dew : -Infinity;
    s.windMPerS[i] = requireNonNegative(w.windMPerS ?? 0, `${f}.windMPerS`);
    s.solarWPerM2[i] = requireNonNegative(w.solarWPerM2 ?? 0, `${f}.solarWPerM2`);
    s.skyTempC[i] = w.skyTempC !== undefined ? requireInRange(w.skyTempC, `${f}.skyTempC`, -100, 60) : defaultSkyTempC(ta, cloud);
  });
  return s;
}
