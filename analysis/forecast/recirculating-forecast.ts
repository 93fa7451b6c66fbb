/**
 * Recirculating forecast: a well-mixed pool whose water feeds the heater inlet, stepped in time
 * with explicit Euler (DOMAIN.md §3.3):
 *     M·cp·dTp/dt = ṁ·cp·(Tout(V̇, Tp) − Tp) + Q_solar − Q_evap − Q_conv − Q_rad − Q_walls
 * The heater model gives the outlet from the pool temperature (for the coil, through its
 * effectiveness ε(ṁ): ṁ·cp·(Tout − Tp) = ε·ṁ·cp·(Ts − Tp)); loss terms are in surface-losses.ts.
 * With losses off and a coil the solution is exact: Tp(t) = Ts − (Ts − Tp0)·exp(−ε·ṁ·t/M).
 *
 * Performance: weather is normalised once into typed arrays, the loop allocates nothing, and the
 * trajectory is sampled (hourly by default) into a Float64Array.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import type { HeaterModel } from '../performance/heater-model';
import { fastCpJPerKgK, fastDensityKgPerM3, fastLatentHeatJPerKg } from '../water/property-table';
import { saturationPressureUncheckedPa, saturationTempC } from '../water/saturation-pressure';
import { waterDensityKgPerM3 } from '../water/water-properties';
import {
  deadHeadingCaution, mergeCautions, sourceAboveBoilingCaution, temperatureCautions, type Caution,
} from '../safety/cautions';
import { convectionCoefficient, evaporationWPerM2, skyRadiationWPerM2, STEFAN_BOLTZMANN, type ConvectionModel } from './surface-losses';
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
  radiation?: false | { emissivity?: number };
  /** conduction through walls/floor: U·A·(Tp − T_ground or air) */
  walls?: false | { areaM2: number; uWPerM2K: number; groundTempC?: number };
  solar?: false | { absorptance?: number };
  cover?: CoverOptions;
}

/** Everything the forecast needs, SI. */
export interface ForecastInput {
  /** pool water mass, kg; or give poolVolumeM3 */
  poolMassKg?: number;
  /** pool water volume, m³ (mass = volume × density at `volumeTempC`, default the start temperature) */
  poolVolumeM3?: number;
  volumeTempC?: number;
  startTempC: number;
  hours: number;
  /** time step, s (default 60) */
  stepS?: number;
  /** pump volume flow through the heater, m³/s (0 = heater gets no flow); or give massFlowKgPerS */
  flowM3PerS?: number;
  /** pump mass flow, kg/s (the volume flow then follows the pool density each step) */
  massFlowKgPerS?: number;
  heater: HeaterModel;
  /** hours of the day the heater runs (default all) */
  heaterHours?: number[];
  /** hour of the day at the start (default 0) */
  startHourOfDay?: number;
  /** false for the loss-free case */
  losses: false | LossOptions;
  /** hold cp constant, J/(kg·K) (default: IF97 at the pool temperature each step) */
  fixedCpJPerKgK?: number;
  /** the target temperature for `hoursToTarget`, °C */
  targetTempC?: number;
  /** sampling interval of the trajectory, s (default 3600) */
  sampleEveryS?: number;
}

/** Energy by term over the forecast, J (gains positive, losses positive as losses). */
export interface EnergyBudget {
  heaterJ: number;
  solarJ: number;
  evaporationJ: number;
  convectionJ: number;
  radiationJ: number;
  wallsJ: number;
  /** heater + solar − losses = change of stored energy */
  netJ: number;
  /** water evaporated, kg */
  evaporatedKg: number;
}

/** Forecast result. */
export interface ForecastResult {
  /** sample times, h */
  timeH: Float64Array;
  /** pool temperature at the sample times, °C */
  tempC: Float64Array;
  /** heater outlet temperature at the sample times, °C (NaN-free: the pool temperature when the heater is off) */
  outletTempC: Float64Array;
  finalTempC: number;
  maxTempC: number;
  maxOutletTempC: number;
  poolMassKg: number;
  steps: number;
  energy: EnergyBudget;
  /** first time the pool reaches `targetTempC`, h; null if not reached or no target */
  hoursToTarget: number | null;
  /** where gains balance losses under the period-mean weather, heater duty and cover fraction, °C */
  equilibriumTempC: number | null;
  equilibriumNote: string;
  cautions: Caution[];
}

function hourMask(hours: number[] | undefined, field: string, all: boolean): Uint8Array {
  const m = new Uint8Array(24);
  if (hours === undefined) { m.fill(all ? 1 : 0); return m; }
  if (!Array.isArray(hours)) throw new TypeError(`${field} must be an array of hours 0–23`);
  hours.forEach((h, i) => {
    if (!Number.isInteger(h) || h < 0 || h > 23) throw new RangeError(`${field}[${i}] must be an integer hour 0–23, got ${h}`);
    m[h] = 1;
  });
  return m;
}

/** Internal: per-hour multipliers and switches, resolved once. */
interface Terms {
  area: number; evap: number; conv: number; convModel: ConvectionModel; rad: number; emis: number;
  wallUA: number; groundC: number | null; solar: number; cover: Uint8Array;
  cEvap: number; cSolar: number; cConv: number; cRad: number; weather: WeatherSeries;
}

function resolveTerms(l: LossOptions): Terms {
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
    emis: rd ? requireNonNegative(rd.emissivity ?? 0.95, 'losses.radiation.emissivity') : 0,
    wallUA: w ? requireNonNegative(w.areaM2, 'losses.walls.areaM2') * requireNonNegative(w.uWPerM2K, 'losses.walls.uWPerM2K') : 0,
    groundC: w && w.groundTempC !== undefined ? requireFinite(w.groundTempC, 'losses.walls.groundTempC') : null,
    solar: so ? requireNonNegative(so.absorptance ?? 0.85, 'losses.solar.absorptance') : 0,
    cover: hourMask(c?.coveredHours, 'losses.cover.coveredHours', false),
    cEvap: requireNonNegative(c?.evaporationFactor ?? 0.1, 'losses.cover.evaporationFactor'),
    cSolar: requireNonNegative(c?.solarFactor ?? 0.8, 'losses.cover.solarFactor'),
    cConv: requireNonNegative(c?.convectionFactor ?? 1, 'losses.cover.convectionFactor'),
    cRad: requireNonNegative(c?.radiationFactor ?? 1, 'losses.cover.radiationFactor'),
    weather,
  };
}

/**
 * Runs the forecast.
 * @throws TypeError / RangeError naming the field: missing pool size, non-positive hours or
 *   step, negative flow, start temperature outside 0–100 °C, bad weather rows or schedules.
 * @example recirculatingForecast({ poolMassKg: 56588, startTempC: 20, hours: 24, flowM3PerS: 2e-4,
 *   heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }), losses: false }).finalTempC // ≈ 28.98
 */
export function recirculatingForecast(input: ForecastInput): ForecastResult {
  const T0 = requireFinite(input.startTempC, 'startTempC');
  waterDensityKgPerM3(T0, undefined, 'startTempC');
  let M: number;
  if (input.poolMassKg !== undefined) M = requirePositive(input.poolMassKg, 'poolMassKg');
  else if (input.poolVolumeM3 !== undefined) {
    M = requirePositive(input.poolVolumeM3, 'poolVolumeM3') * waterDensityKgPerM3(input.volumeTempC ?? T0, undefined, 'volumeTempC');
  } else throw new RangeError('give poolMassKg or poolVolumeM3');
  const hours = requirePositive(input.hours, 'hours');
  const dt = requirePositive(input.stepS ?? 60, 'stepS');
  if ((input.flowM3PerS === undefined) === (input.massFlowKgPerS === undefined)) {
    throw new RangeError('give exactly one of flowM3PerS and massFlowKgPerS');
  }
  const massFlow = input.massFlowKgPerS === undefined ? 0 : requireNonNegative(input.massFlowKgPerS, 'massFlowKgPerS');
  const flow = input.flowM3PerS === undefined ? massFlow / fastDensityKgPerM3(T0) : requireNonNegative(input.flowM3PerS, 'flowM3PerS');
  const heater = input.heater;
  if (!heater || typeof heater.outletTempC !== 'function') throw new TypeError('heater must be a heater model with outletTempC(flow, inlet)');
  const heaterOn = hourMask(input.heaterHours, 'heaterHours', true);
  const startHour = input.startHourOfDay ?? 0;
  if (!Number.isInteger(startHour) || startHour < 0 || startHour > 23) throw new RangeError(`startHourOfDay must be an integer 0–23, got ${startHour}`);
  const cpFixed = input.fixedCpJPerKgK === undefined ? 0 : requirePositive(input.fixedCpJPerKgK, 'fixedCpJPerKgK');
  const target = input.targetTempC === undefined ? null : requireFinite(input.targetTempC, 'targetTempC');
  const sampleS = requirePositive(input.sampleEveryS ?? 3600, 'sampleEveryS');
  const terms = input.losses ? resolveTerms(input.losses) : null;

  const steps = Math.ceil((hours * 3600) / dt - 1e-9);
  const stepsPerSample = Math.max(1, Math.round(sampleS / dt));
  const nSamples = Math.floor(steps / stepsPerSample) + 1 + (steps % stepsPerSample ? 1 : 0);
  const timeH = new Float64Array(nSamples), tempC = new Float64Array(nSamples), outC = new Float64Array(nSamples);

  let T = T0, maxT = T0, maxOut = -Infinity;
  let eHeat = 0, eSolar = 0, eEvap = 0, eConv = 0, eRad = 0, eWalls = 0, evapKg = 0;
  let hitH: number | null = target !== null && T0 >= target ? 0 : null;
  let sample = 0;
  const stepsPerHour = 3600 / dt;
  const area = terms ? terms.area : 0;
  const w = terms ? terms.weather : null;
  let lastOut = T0;
  const record = (i: number, tC: number, o: number) => {
    timeH[sample] = (i * dt) / 3600; tempC[sample] = tC; outC[sample] = o; sample++;
  };

  for (let i = 0; i < steps; i++) {
    const h = Math.floor(i / stepsPerHour);
    const hod = (startHour + h) % 24;
    const cp = cpFixed || fastCpJPerKgK(T);
    // heater
    let qHeat = 0, tout = T;
    if (flow > 0 && heaterOn[hod] === 1) {
      const rho = fastDensityKgPerM3(T);
      const vdot = massFlow > 0 ? massFlow / rho : flow;
      tout = heater.outletTempC(vdot, T);
      qHeat = rho * vdot * cp * (tout - T);
      if (tout > maxOut) maxOut = tout;
    }
    lastOut = tout;
    let net = qHeat;
    if (terms !== null && w !== null) {
      const k = h % w.hours;
      const covered = terms.cover[hod] === 1;
      const ta = w.airTempC[k];
      const wind = w.windMPerS[k];
      let qe = 0, qc = 0, qr = 0, qw = 0, qs = 0;
      if (terms.evap > 0) {
        qe = terms.evap * area * evaporationWPerM2(saturationPressureUncheckedPa(T + 273.15), w.vapourPressurePa[k], wind);
        if (covered) qe *= terms.cEvap;
      }
      if (terms.conv > 0) { qc = area * convectionCoefficient(wind, terms.convModel) * (T - ta); if (covered) qc *= terms.cConv; }
      if (terms.rad > 0) { qr = area * skyRadiationWPerM2(T, w.skyTempC[k], terms.emis); if (covered) qr *= terms.cRad; }
      if (terms.wallUA > 0) qw = terms.wallUA * (T - (terms.groundC ?? ta));
      if (terms.solar > 0) { qs = terms.solar * area * w.solarWPerM2[k]; if (covered) qs *= terms.cSolar; }
      net += qs - qe - qc - qr - qw;
      eSolar += qs * dt; eEvap += qe * dt; eConv += qc * dt; eRad += qr * dt; eWalls += qw * dt;
      evapKg += (qe * dt) / fastLatentHeatJPerKg(T);
    }
    eHeat += qHeat * dt;
    if (i % stepsPerSample === 0) record(i, T, tout);
    const Tn = T + (net * dt) / (M * cp);
    if (hitH === null && target !== null && Tn >= target) hitH = ((i + (target - T) / (Tn - T)) * dt) / 3600;
    T = Tn;
    if (T > maxT) maxT = T;
  }
  record(steps, T, lastOut);

  const eq = equilibrium(input, terms, flow, massFlow, heaterOn, cpFixed, startHour, hours);
  const cautions: Caution[][] = [temperatureCautions(maxT, 'pool')];
  if (maxOut > -Infinity) cautions.push(temperatureCautions(maxOut, 'outlet'));
  if (flow === 0 && heaterOn.some((x) => x === 1)) cautions.push([deadHeadingCaution('the forecast (zero pump flow with the heater on)')]);
  if (heater.sourceTempC !== null) {
    const c = sourceAboveBoilingCaution(heater.sourceTempC, saturationTempC(101325));
    if (c) cautions.push([c]);
  }
  return {
    timeH: timeH.subarray(0, sample), tempC: tempC.subarray(0, sample), outletTempC: outC.subarray(0, sample),
    finalTempC: T, maxTempC: maxT, maxOutletTempC: maxOut > -Infinity ? maxOut : T0, poolMassKg: M, steps,
    energy: {
      heaterJ: eHeat, solarJ: eSolar, evaporationJ: eEvap, convectionJ: eConv, radiationJ: eRad, wallsJ: eWalls,
      netJ: eHeat + eSolar - eEvap - eConv - eRad - eWalls, evaporatedKg: evapKg,
    },
    hoursToTarget: hitH, equilibriumTempC: eq.tempC, equilibriumNote: eq.note,
    cautions: mergeCautions(...cautions),
  };
}

/** Net heating rate at pool temperature T under mean conditions, W. */
function equilibrium(
  input: ForecastInput, terms: Terms | null, flow: number, massFlow: number, heaterOn: Uint8Array, cpFixed: number, startHour: number, hours: number,
): { tempC: number | null; note: string } {
  const nH = Math.max(1, Math.ceil(hours));
  const duty = Array.from({ length: nH }, (_, h) => heaterOn[(startHour + h) % 24]).reduce((a, b) => a + b, 0) / nH;
  let ta = 0, pa = 0, wind = 0, sky4 = 0, solar = 0, cov = 0;
  if (terms) {
    const w = terms.weather;
    for (let h = 0; h < nH; h++) {
      const k = h % w.hours;
      ta += w.airTempC[k]; pa += w.vapourPressurePa[k]; wind += w.windMPerS[k]; solar += w.solarWPerM2[k];
      sky4 += (w.skyTempC[k] + 273.15) ** 4;
      cov += terms.cover[(startHour + h) % 24];
    }
    ta /= nH; pa /= nH; wind /= nH; solar /= nH; sky4 /= nH; cov /= nH;
  }
  const net = (T: number): number => {
    const cp = cpFixed || fastCpJPerKgK(T);
    const rho = fastDensityKgPerM3(T);
    const vdot = massFlow > 0 ? massFlow / rho : flow;
    let q = vdot > 0 ? duty * rho * vdot * cp * (input.heater.outletTempC(vdot, T) - T) : 0;
    if (terms) {
      const a = terms.area;
      const f = (c: number) => 1 - cov + cov * c;
      q += terms.solar * a * solar * f(terms.cSolar);
      q -= terms.evap * a * evaporationWPerM2(saturationPressureUncheckedPa(T + 273.15), pa, wind) * f(terms.cEvap);
      q -= terms.conv * a * convectionCoefficient(wind, terms.convModel) * (T - ta) * f(terms.cConv);
      q -= terms.rad * a * terms.emis * STEFAN_BOLTZMANN * ((T + 273.15) ** 4 - sky4) * f(terms.cRad);
      q -= terms.wallUA * (T - (terms.groundC ?? ta));
    }
    return q;
  };
  let lo = 0, hi = 100;
  const nlo = net(lo), nhi = net(hi);
  if (!(nlo > 0)) return { tempC: null, note: 'No equilibrium above 0 °C: losses exceed gains even for water at 0 °C.' };
  if (nhi > 0) return { tempC: null, note: 'No equilibrium below 100 °C: gains exceed losses up to boiling. The water would keep heating; see the cautions.' };
  for (let i = 0; i < 200 && hi - lo > 1e-9; i++) {
    const mid = (lo + hi) / 2;
    if (net(mid) > 0) lo = mid; else hi = mid;
  }
  return { tempC: (lo + hi) / 2, note: 'Equilibrium under the mean weather, heater duty and cover fraction of the forecast period.' };
}
