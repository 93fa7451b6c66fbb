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
import { convectionCoefficient, evaporationWPerM2, skyRadiationWPerM2 } from './surface-losses';
import { hourMask, resolveTerms, type LossOptions } from './loss-terms';
import { equilibriumTempC } from './equilibrium-temperature';
import { checkForecastWork, FORECAST_LIMITS } from './forecast-limits';

export type { CoverOptions, LossOptions } from './loss-terms';

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
  /** with a target: the heater stops while the pool is at or above it, as a thermostat would (default false) */
  thermostat?: boolean;
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

/**
 * Runs the forecast.
 * @throws TypeError / RangeError naming the field: missing pool size, non-positive hours or
 *   step, more work than {@link FORECAST_LIMITS} allows, negative flow, start temperature outside 0–100 °C, bad weather rows or schedules.
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
  if (input.thermostat && target === null) throw new RangeError('thermostat: needs a targetTempC to switch at');
  const thermostat = input.thermostat === true;
  const sampleS = requirePositive(input.sampleEveryS ?? 3600, 'sampleEveryS');
  checkForecastWork(hours, dt, sampleS);
  if (input.losses && Array.isArray(input.losses.weather) && input.losses.weather.length > FORECAST_LIMITS.maxWeatherRows) {
    throw new RangeError(`losses.weather has ${input.losses.weather.length} rows; at most ${FORECAST_LIMITS.maxWeatherRows} (a leap year of hours) are allowed`);
  }
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
    if (flow > 0 && heaterOn[hod] === 1 && !(thermostat && T >= target!)) {
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

  const eq = equilibriumTempC({ heater, terms, flowM3PerS: flow, massFlowKgPerS: massFlow, heaterOn, fixedCpJPerKgK: cpFixed, startHourOfDay: startHour, hours });
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
