/** `forecast`: recirculating pool heat-up with optional losses. */
import { InputError } from './input-error';
import { recirculatingForecast, type LossOptions } from '../forecast/recirculating-forecast';
import type { WeatherPoint } from '../forecast/weather';
import { coilHeater, fixedRiseHeater, type HeaterModel } from '../performance/heater-model';
import { asObject, optionalQuantity, plainNumber, quantity, type Fields } from '../units/read-fields';

export const help = `recirculating pool forecast: the pool feeds the heater inlet, stepped in time
input: {"poolVolume":"15000 gal","startTemp":"20 degC","hours":24,"flow":"12 L/min",
        "heater":{"model":"coil","sourceTemp":"90 degC","UA":"500 W/K"},"losses":false}
  heater: {"model":"coil","sourceTemp","UA"} | {"model":"fixed-rise","rise":"10 K"}
  optional: "poolMass":"56588 kg" (instead of poolVolume), "volumeTemp":"26 degC" (water temperature the volume
  was measured at, default startTemp), "step":"60 s", "targetTemp":"28 degC", "thermostat":true (heater off at the target), "heaterHours":[8,...,17], "startHour":0
  losses: false | {"surfaceArea":"46.6 m^2", "weather": {"airTemp":"20 degC","relativeHumidity":0.6 | "dewPoint":"12 degC",
           "wind":"1 m/s","solar":"200 W/m^2","cloudCover":0.5,"skyTemp":"5 degC"} or an hourly array of them,
           "evaporation": false | {"activityFactor":1,"correction":0.8}, "convection": false | {"model":"mcadams"},
           "radiation": false | {"emissivity":0.95}, "solar": false | {"absorptance":0.85},
           "walls": {"area":"30 m^2","U":"1.5 W/(m^2 K)","groundTemp":"15 degC"},
           "cover": {"coveredHours":[0,1,2,22,23],"evaporationFactor":0.1,"solarFactor":0.8}}
output: {"finalTemp_degC", "maxTemp_degC", "maxOutletTemp_degC", "hoursToTarget_h", "equilibriumTemp_degC",
         "energy_J": {...}, "evaporated_kg", "series": [{"time_h","temp_degC","outletTemp_degC"}], "cautions"}`;

function readHeater(v: unknown): HeaterModel {
  const h = asObject(v, 'heater');
  if (h.model === 'coil') {
    return coilHeater({ sourceTempC: quantity(h, 'sourceTemp', 'temperature', 'heater'), uaWPerK: quantity(h, 'UA', 'conductance', 'heater') });
  }
  if (h.model === 'fixed-rise') return fixedRiseHeater(quantity(h, 'rise', 'temperatureDifference', 'heater'));
  throw new InputError(`heater.model must be "coil" or "fixed-rise", got ${JSON.stringify(h.model)}`);
}

function readWeather(v: unknown, path: string): WeatherPoint {
  const w = asObject(v, path);
  return {
    airTempC: quantity(w, 'airTemp', 'temperature', path),
    dewPointC: optionalQuantity(w, 'dewPoint', 'temperature', path),
    relativeHumidity: plainNumber(w, 'relativeHumidity', path),
    windMPerS: optionalQuantity(w, 'wind', 'speed', path),
    solarWPerM2: optionalQuantity(w, 'solar', 'irradiance', path),
    cloudCover: plainNumber(w, 'cloudCover', path),
    skyTempC: optionalQuantity(w, 'skyTemp', 'temperature', path),
  };
}

function term<T>(o: Fields, key: string, read: (f: Fields) => T): false | T | undefined {
  const v = o[key];
  if (v === undefined) return undefined;
  if (v === false) return false;
  return read(asObject(v, `losses.${key}`));
}

function readLosses(v: unknown): false | LossOptions {
  if (v === false || v === undefined) return false;
  const l = asObject(v, 'losses');
  const weather = Array.isArray(l.weather) ? l.weather.map((w, i) => readWeather(w, `losses.weather[${i}]`)) : readWeather(l.weather, 'losses.weather');
  const walls = term(l, 'walls', (f) => ({
    areaM2: quantity(f, 'area', 'area', 'losses.walls'), uWPerM2K: quantity(f, 'U', 'heatTransferCoefficient', 'losses.walls'),
    groundTempC: optionalQuantity(f, 'groundTemp', 'temperature', 'losses.walls'),
  }));
  const cover = l.cover === undefined ? undefined : asObject(l.cover, 'losses.cover');
  return {
    surfaceAreaM2: quantity(l, 'surfaceArea', 'area', 'losses'),
    weather,
    evaporation: term(l, 'evaporation', (f) => ({ activityFactor: plainNumber(f, 'activityFactor', 'losses.evaporation'), correction: plainNumber(f, 'correction', 'losses.evaporation') })),
    convection: term(l, 'convection', (f) => {
      if (f.model !== undefined && f.model !== 'mcadams' && f.model !== 'pool-guidance') throw new InputError('losses.convection.model must be "pool-guidance" or "mcadams"');
      return { model: f.model as 'mcadams' | 'pool-guidance' | undefined };
    }),
    radiation: term(l, 'radiation', (f) => ({ emissivity: plainNumber(f, 'emissivity', 'losses.radiation') })),
    solar: term(l, 'solar', (f) => ({ absorptance: plainNumber(f, 'absorptance', 'losses.solar') })),
    walls: walls === undefined ? undefined : walls,
    cover: cover && {
      coveredHours: cover.coveredHours as number[],
      evaporationFactor: plainNumber(cover, 'evaporationFactor', 'losses.cover'),
      solarFactor: plainNumber(cover, 'solarFactor', 'losses.cover'),
      convectionFactor: plainNumber(cover, 'convectionFactor', 'losses.cover'),
      radiationFactor: plainNumber(cover, 'radiationFactor', 'losses.cover'),
    },
  };
}

export function run(input: unknown): unknown {
  try {
    const o = asObject(input, 'input');
    const hours = plainNumber(o, 'hours');
    if (hours === undefined) throw new InputError('hours is required (a number of hours)');
    const stepS = optionalQuantity(o, 'step', 'time');
    const r = recirculatingForecast({
      poolVolumeM3: optionalQuantity(o, 'poolVolume', 'volume'),
      poolMassKg: optionalQuantity(o, 'poolMass', 'mass'),
      volumeTempC: optionalQuantity(o, 'volumeTemp', 'temperature'),
      startTempC: quantity(o, 'startTemp', 'temperature'),
      hours, stepS,
      flowM3PerS: quantity(o, 'flow', 'volumeFlow'),
      heater: readHeater(o.heater),
      heaterHours: o.heaterHours as number[] | undefined,
      startHourOfDay: plainNumber(o, 'startHour'),
      targetTempC: optionalQuantity(o, 'targetTemp', 'temperature'),
      thermostat: o.thermostat === true,
      losses: readLosses(o.losses),
    });
    const series = Array.from(r.timeH, (t, i) => ({ time_h: t, temp_degC: r.tempC[i], outletTemp_degC: r.outletTempC[i] }));
    const e = r.energy;
    return {
      finalTemp_degC: r.finalTempC, maxTemp_degC: r.maxTempC, maxOutletTemp_degC: r.maxOutletTempC, poolMass_kg: r.poolMassKg,
      hoursToTarget_h: r.hoursToTarget, equilibriumTemp_degC: r.equilibriumTempC, equilibriumNote: r.equilibriumNote,
      energy_J: { heater_J: e.heaterJ, solar_J: e.solarJ, evaporation_J: e.evaporationJ, convection_J: e.convectionJ, radiation_J: e.radiationJ, walls_J: e.wallsJ, net_J: e.netJ },
      evaporated_kg: e.evaporatedKg, steps: r.steps, series, cautions: r.cautions,
    };
  } catch (e) {
    if (e instanceof TypeError || e instanceof RangeError) throw new InputError(e.message);
    throw e;
  }
}
