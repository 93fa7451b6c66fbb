/** `forecast`: recirculating pool heat-up with optional losses. */
import { InputError, readingInput } from './input-error';
import { recirculatingForecast, type LossOptions } from '../forecast/recirculating-forecast';
import type { WeatherPoint } from '../forecast/weather';
import { coilHeater, fixedRiseHeater, type HeaterModel } from '../performance/heater-model';
import type { FieldReader, Fields } from '../units/read-fields';
import type { QuantityKind } from '../units/parse-quantity';

export const help = `recirculating pool forecast: the pool feeds the heater inlet, stepped in time
input: {"poolVolume":"40 m^3","startTemp":"18 degC","hours":24,"flow":"9 L/min",
        "heater":{"model":"coil","sourceTemp":"88 degC","UA":"430 W/K"},"losses":false}
  heater: {"model":"coil","sourceTemp","UA"} | {"model":"fixed-rise","rise":"10 K"}
  optional: "poolMass":"40000 kg" (instead of poolVolume), "volumeTemp":"26 degC" (water temperature the volume
  was measured at, default startTemp), "step":"60 s", "targetTemp":"28 degC", "thermostat":true (heater off at the target), "heaterHours":[8,...,17], "startHour":0
  losses: false | {"surfaceArea":"46.6 m^2", "weather": {"airTemp":"20 degC","relativeHumidity":0.6 | "dewPoint":"12 degC",
           "wind":"1 m/s","solar":"200 W/m^2","cloudCover":0.5,"skyTemp":"5 degC"} or an hourly array of them,
           "evaporation": false | {"activityFactor":1,"correction":0.8}, "convection": false | {"model":"mcadams"},
           "radiation": false | {"emissivity":0.95}, "solar": false | {"absorptance":0.85},
           "walls": {"area":"30 m^2","U":"1.5 W/(m^2 K)","groundTemp":"15 degC"},
           "cover": {"coveredHours":[0,1,2,22,23],"evaporationFactor":0.1,"solarFactor":0.8}}
output: {"finalTemp_degC", "maxTemp_degC", "maxOutletTemp_degC", "hoursToTarget_h", "equilibriumTemp_degC",
         "energy_J": {...}, "evaporated_kg", "series": [{"time_h","temp_degC","outletTemp_degC"}], "cautions"}`;

function readHeater(read: FieldReader, v: unknown): HeaterModel {
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
function readWeather(read: FieldReader, v: unknown, path: string, as: string): WeatherPoint {
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

function readLosses(read: FieldReader, v: unknown): false | LossOptions {
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

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    const hours = read.plainNumber(o, 'hours');
    if (hours === undefined) throw new InputError('hours is required (a number of hours)');
    const stepS = read.optionalQuantity(o, 'step', 'time', { as: 'stepS' });
    const r = recirculatingForecast({
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
    });
    const series = Array.from(r.timeH, (t, i) => ({ time_h: t, temp_degC: r.tempC[i], outletTemp_degC: r.outletTempC[i] }));
    const e = r.energy;
    return {
      finalTemp_degC: r.finalTempC, maxTemp_degC: r.maxTempC, maxOutletTemp_degC: r.maxOutletTempC, poolMass_kg: r.poolMassKg,
      hoursToTarget_h: r.hoursToTarget, equilibriumTemp_degC: r.equilibriumTempC, equilibriumNote: r.equilibriumNote,
      energy_J: { heater_J: e.heaterJ, solar_J: e.solarJ, evaporation_J: e.evaporationJ, convection_J: e.convectionJ, radiation_J: e.radiationJ, walls_J: e.wallsJ, net_J: e.netJ },
      evaporated_kg: e.evaporatedKg, steps: r.steps, series, cautions: r.cautions,
    };
  });
}
