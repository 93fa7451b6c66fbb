/**
 * The forecast's input as people write it — quantities as strings with their units ("40 m^3",
 * "18 degC", "9 L/min"), the heater, the weather and the loss terms — read into the SI
 * `ForecastInput` of {@link recirculatingForecast}. One reader for the command line and the app, so
 * both accept the same fields and tell the same errors (in the user's words, through the
 * `FieldReader`: run it inside `readingInput`).
 * @example readingInput((read) => recirculatingForecast(readForecastInput(read, { poolVolume: '40 m^3', startTemp: '18 degC', hours: 24, flow: '9 L/min', heater: { model: 'coil', sourceTemp: '88 degC', UA: '430 W/K' }, losses: false })))
 */
import { InputError } from '../units/reading-input';
import type { ForecastInput, LossOptions } from './recirculating-forecast';
import type { WeatherPoint } from './weather';
import { coilHeater, fixedRiseHeater, type HeaterModel } from '../performance/heater-model';
import type { FieldReader, Fields } from '../units/read-fields';
import type { QuantityKind } from '../units/parse-quantity';

/** The heater of a forecast: `{ model: 'coil', sourceTemp, UA }` or `{ model: 'fixed-rise', rise }`. */
export function readHeater(read: FieldReader, v: unknown): HeaterModel {
  const h = read.asObject(v, 'heater');
  if (h.model === 'coil') {
    return coilHeater({
      sourceTempC: read.quantity(h, 'sourceTemp', 'temperature', { path: 'heater', as: 'sourceTempC' }),
      uaWPerK: read.quantity(h, 'UA', 'conductance', { path: 'heater', as: 'uaWPerK' }),
    });
  }
  if (h.model === 'fixed-rise') return fixedRiseHeater(read.quantity(h, 'rise', 'temperatureDifference', { path: 'heater', as: 'riseK' }));
  throw new InputError(`heater.model must be "coil" or "fixed-rise", got ${JSON.stringify(h.model)}`);
}

/** One weather row; `as` is the name the forecast gives it (weather[i] or weather). */
export function readWeather(read: FieldReader, v: unknown, path: string, as: string): WeatherPoint {
  const w = read.asObject(v, path);
  const q = (key: string, kind: QuantityKind, si: string) => read.optionalQuantity(w, key, kind, { path, as: `${as}.${si}` });
  return {
    airTempC: read.quantity(w, 'airTemp', 'temperature', { path, as: `${as}.airTempC` }),
    dewPointC: q('dewPoint', 'temperature', 'dewPointC'),
    relativeHumidity: read.plainNumber(w, 'relativeHumidity', { path, as: `${as}.relativeHumidity` }),
    windMPerS: q('wind', 'speed', 'windMPerS'),
    solarWPerM2: q('solar', 'irradiance', 'solarWPerM2'),
    cloudCover: read.plainNumber(w, 'cloudCover', { path, as: `${as}.cloudCover` }),
    skyTempC: q('skyTemp', 'temperature', 'skyTempC'),
  };
}

function term<T>(read: FieldReader, o: Fields, key: string, readTerm: (f: Fields) => T): false | T | undefined {
  const v = o[key];
  if (v === undefined) return undefined;
  if (v === false) return false;
  return readTerm(read.asObject(v, `losses.${key}`));
}

export function readLosses(read: FieldReader, v: unknown): false | LossOptions {
  if (v === false || v === undefined) return false;
  const l = read.asObject(v, 'losses');
  const weather = Array.isArray(l.weather)
    ? l.weather.map((w, i) => readWeather(read, w, `losses.weather[${i}]`, `weather[${i}]`))
    : readWeather(read, l.weather, 'losses.weather', 'weather');
  const walls = term(read, l, 'walls', (f) => ({
    areaM2: read.quantity(f, 'area', 'area', { path: 'losses.walls', as: 'losses.walls.areaM2' }),
    uWPerM2K: read.quantity(f, 'U', 'heatTransferCoefficient', { path: 'losses.walls', as: 'losses.walls.uWPerM2K' }),
    groundTempC: read.optionalQuantity(f, 'groundTemp', 'temperature', { path: 'losses.walls', as: 'losses.walls.groundTempC' }),
  }));
  const cover = l.cover === undefined ? undefined : read.asObject(l.cover, 'losses.cover');
  const plain = (f: Fields, key: string, path: string) => read.plainNumber(f, key, { path });
  return {
    surfaceAreaM2: read.quantity(l, 'surfaceArea', 'area', { path: 'losses', as: 'losses.surfaceAreaM2' }),
    weather,
    evaporation: term(read, l, 'evaporation', (f) => ({ activityFactor: plain(f, 'activityFactor', 'losses.evaporation'), correction: plain(f, 'correction', 'losses.evaporation') })),
    convection: term(read, l, 'convection', (f) => {
      if (f.model !== undefined && f.model !== 'mcadams' && f.model !== 'pool-guidance') throw new InputError('losses.convection.model must be "pool-guidance" or "mcadams"');
      return { model: f.model as 'mcadams' | 'pool-guidance' | undefined };
    }),
    radiation: term(read, l, 'radiation', (f) => ({ emissivity: plain(f, 'emissivity', 'losses.radiation') })),
    solar: term(read, l, 'solar', (f) => ({ absorptance: plain(f, 'absorptance', 'losses.solar') })),
    walls: walls === undefined ? undefined : walls,
    cover: cover && {
      coveredHours: cover.coveredHours as number[],
      evaporationFactor: plain(cover, 'evaporationFactor', 'losses.cover'),
      solarFactor: plain(cover, 'solarFactor', 'losses.cover'),
      convectionFactor: plain(cover, 'convectionFactor', 'losses.cover'),
      radiationFactor: plain(cover, 'radiationFactor', 'losses.cover'),
    },
  };
}

/**
 * @throws InputError (inside `readingInput`) naming the field: a missing horizon, heater or start
 *   temperature, a quantity in the wrong unit…
 */
export function readForecastInput(read: FieldReader, input: unknown): ForecastInput {
  const o = read.asObject(input, 'input');
  const hours = read.plainNumber(o, 'hours');
  if (hours === undefined) throw new InputError('hours is required (a number of hours)');
  const stepS = read.optionalQuantity(o, 'step', 'time', { as: 'stepS' });
  return {
    poolVolumeM3: read.optionalQuantity(o, 'poolVolume', 'volume', { as: 'poolVolumeM3' }),
    poolMassKg: read.optionalQuantity(o, 'poolMass', 'mass', { as: 'poolMassKg' }),
    volumeTempC: read.optionalQuantity(o, 'volumeTemp', 'temperature', { as: 'volumeTempC' }),
    startTempC: read.quantity(o, 'startTemp', 'temperature', { as: 'startTempC' }),
    hours, stepS,
    flowM3PerS: read.quantity(o, 'flow', 'volumeFlow', { as: 'flowM3PerS' }),
    heater: readHeater(read, o.heater),
    heaterHours: o.heaterHours as number[] | undefined,
    startHourOfDay: read.plainNumber(o, 'startHour', { as: 'startHourOfDay' }),
    targetTempC: read.optionalQuantity(o, 'targetTemp', 'temperature', { as: 'targetTempC' }),
    thermostat: o.thermostat === true,
    losses: readLosses(read, o.losses),
  };
}
