/**
 * Recirculating forecast: a well-mixed pool whose water feeds the heater inlet (DOMAIN.md §3.3):
 *     M·cp·dTp/dt = q_heater(V̇, Tp) + Q_solar − Q_evap − Q_conv − Q_rad − Q_walls
 * The heater model gives the heat from the pool temperature (for the coil through its
 * effectiveness, q = ε·ṁ·cp·(Ts − Tp)); loss terms are in surface-losses.ts.
 *
 * Time stepping: each step linearises the net heat rate about the pool temperature at its start
 * and solves that linear balance exactly over the step (the exponential step of
 * exponential-step.ts). The heater term is therefore stepped exactly: with a constant-source coil
 * and no losses Tₙ₊₁ = Ts − (Ts − Tₙ)·exp(−ε·ṁ·Δt/M), ε at the step's flow, so the loss-free coil
 * forecast is the exact solution Tp(t) = Ts − (Ts − Tp0)·exp(−ε·ṁ·t/M) at any step length (with
 * cp held fixed; with IF97 cp it changes along the way, and ε and cp are taken at the start of
 * each step); a fixed-rise heater adds its constant heat exactly; linear losses (walls, convection)
 * are exact too. Evaporation and sky radiation are not linear in Tp: a step that would move the
 * pool more than MAX_SUBSTEP_CHANGE_K is split into equal sub-steps (at most MAX_SUBSTEPS), each
 * linearised afresh, and whatever the step the result is kept between the coldest and the hottest
 * temperature that drives the pool in that step (air, sky, ground, dew point, the heater's source),
 * which the exact solution never leaves. Step length is therefore a matter of accuracy only, never
 * of stability.
 *
 * Performance: weather is normalised once into typed arrays, the hourly coefficients are
 * resolved once per hour, the loop allocates nothing, and the trajectory is sampled (hourly by
 * default) into a Float64Array.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import type { HeaterModel } from '../performance/heater-model';
import { fastCpJPerKgK, fastDensityKgPerM3, fastLatentHeatJPerKg } from '../water/property-table';
import { saturationPressureAndSlopeUnchecked, saturationTempC } from '../water/saturation-pressure';
import { waterDensityKgPerM3 } from '../water/water-properties';
import {
  deadHeadingCaution, mergeCautions, sourceAboveBoilingCaution, temperatureCautions, type Caution,
} from '../safety/cautions';
import { convectionCoefficient, STEFAN_BOLTZMANN } from './surface-losses';
import { phi1, phi2 } from './exponential-step';
import { hourMask, resolveTerms, type LossOptions } from './loss-terms';
import { equilibriumTempC, holdHoursPerDay } from './equilibrium-temperature';
import { checkForecastWork, FORECAST_LIMITS } from './forecast-limits';

export type { CoverOptions, LossOptions } from './loss-terms';

/** A (sub)step moves the pool by at most this much when the balance is not linear in Tp, K (our choice: evaporation's slope changes about 3 % over 0.5 K). */
export const MAX_SUBSTEP_CHANGE_K = 0.5;
/** Sub-steps of one time step at most (beyond them the exponential step is still stable, only less accurate). */
export const MAX_SUBSTEPS = 64;
/**
 * The heater's dq/dT and cp's slope are taken afresh once the pool has moved this much, K (the
 * property table's spacing; for a coil with fixed cp and ρ the heater's slope is a constant).
 */
const SLOPE_REFRESH_K = 0.05;

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
  /** heater hours per day that hold `targetTempC` under the mean weather and cover (null: cannot, or no target) */
  holdHoursPerDay: number | null;
  holdNote: string | null;
  cautions: Caution[];
}

/**
 * Runs the forecast.
 * @throws TypeError / RangeError naming the field: missing pool size, non-positive hours or
 *   step, more work than {@link FORECAST_LIMITS} allows, negative flow, start temperature outside 0–100 °C, bad weather rows or schedules.
 * @example recirculatingForecast({ poolVolumeM3: 40, startTempC: 18, hours: 24, flowM3PerS: 1.5e-4,
 *   heater: coilHeater({ sourceTempC: 88, uaWPerK: 430 }), losses: false }).finalTempC // ≈ 28.40 (the demo lab's Stovepipe Coil A on a 40 m³ pool)
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
  if (!heater || typeof heater.outletTempC !== 'function' || typeof heater.heatW !== 'function') throw new TypeError('heater must be a heater model with outletTempC(flow, inlet) and heatW(flow, inlet)');
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
  const w = terms ? terms.weather : null;
  const heaterSource = heater.sourceTempC;
  const ps = new Float64Array(2);
  let lastOut = T0;
  const record = (i: number, tC: number, o: number) => {
    timeH[sample] = (i * dt) / 3600; tempC[sample] = tC; outC[sample] = o; sample++;
  };

  // coefficients of the hour (weather rows and the cover are hourly)
  let hourIndex = -1, heaterHour = false;
  let evapK = 0, pa = 0, convK = 0, ta = 0, radK = 0, sky4 = 0, wallUA = 0, ground = 0, qSolar = 0;
  let loHour = Infinity, hiHour = -Infinity;
  // slopes that change slowly with the pool temperature, refreshed when it has moved SLOPE_REFRESH_K
  let heaterSlopeAtC = Number.NaN, heaterSlope = 0, cpSlopeAtC = Number.NaN, cpRelSlope = 0;

  for (let i = 0; i < steps; i++) {
    const hi0 = Math.floor(i / stepsPerHour);
    if (hi0 !== hourIndex) {
      hourIndex = hi0;
      const hod = (startHour + hi0) % 24;
      heaterHour = heaterOn[hod] === 1;
      loHour = Infinity; hiHour = -Infinity;
      if (terms !== null && w !== null) {
        const k = hi0 % w.hours;
        const covered = terms.cover[hod] === 1;
        const a = terms.area;
        ta = w.airTempC[k];
        pa = w.vapourPressurePa[k];
        const wind = w.windMPerS[k];
        evapK = terms.evap > 0 ? terms.evap * a * (0.089 + 0.0782 * wind) * (covered ? terms.cEvap : 1) : 0;
        convK = terms.conv > 0 ? a * convectionCoefficient(wind, terms.convModel) * (covered ? terms.cConv : 1) : 0;
        const sky = w.skyTempC[k] + 273.15;
        sky4 = sky * sky * sky * sky;
        radK = terms.rad > 0 ? a * terms.emis * STEFAN_BOLTZMANN * (covered ? terms.cRad : 1) : 0;
        wallUA = terms.wallUA;
        ground = terms.groundC ?? ta;
        qSolar = terms.solar > 0 ? terms.solar * a * w.solarWPerM2[k] * (covered ? terms.cSolar : 1) : 0;
        // the temperatures that drive the pool this hour: it cannot leave the range they span
        if (evapK > 0) { loHour = Math.min(loHour, w.dewPointC[k]); hiHour = Math.max(hiHour, w.dewPointC[k]); }
        if (convK > 0) { loHour = Math.min(loHour, ta); hiHour = Math.max(hiHour, ta); }
        if (radK > 0) { loHour = Math.min(loHour, sky - 273.15); hiHour = Math.max(hiHour, sky - 273.15); }
        if (wallUA > 0) { loHour = Math.min(loHour, ground); hiHour = Math.max(hiHour, ground); }
        if (qSolar > 0) hiHour = Infinity;
      }
    }
    const heating = flow > 0 && heaterHour && !(thermostat && T >= target!);
    let lo = loHour, hi = hiHour;
    if (heating) {
      if (heaterSource === null) { lo = -Infinity; hi = Infinity; } else { lo = Math.min(lo, heaterSource); hi = Math.max(hi, heaterSource); }
    }
    let tout = T;
    if (heating) {
      const vdot = massFlow > 0 ? massFlow / fastDensityKgPerM3(T) : flow;
      tout = heater.outletTempC(vdot, T);
      if (tout > maxOut) maxOut = tout;
    }
    lastOut = tout;
    if (i % stepsPerSample === 0) record(i, T, tout);

    // integrate the step: the first evaluation decides the number of sub-steps
    let nSub = 0, h = dt, tIn = 0;
    for (let sub = 0; ; ) {
      const cp = cpFixed || fastCpJPerKgK(T);
      const mcp = M * cp;
      // each term's rate (gains positive for the heater and sun, losses positive as losses) and slope d/dT
      let qH = 0, sH = 0;
      if (heating) {
        const vdot = massFlow > 0 ? massFlow / fastDensityKgPerM3(T) : flow;
        qH = heater.heatW(vdot, T);
        if (!(Math.abs(T - heaterSlopeAtC) <= SLOPE_REFRESH_K)) {
          const d = T < 50 ? 0.01 : -0.01;
          const vdot2 = massFlow > 0 ? massFlow / fastDensityKgPerM3(T + d) : flow;
          heaterSlope = (heater.heatW(vdot2, T + d) - qH) / d;
          heaterSlopeAtC = T;
        }
        sH = heaterSlope;
      }
      let qe = 0, se = 0, qc = 0, sc = 0, qr = 0, sr = 0, qw = 0, sw = 0;
      if (terms !== null) {
        if (evapK > 0) {
          saturationPressureAndSlopeUnchecked(T + 273.15, ps);
          qe = evapK * (ps[0] - pa); se = evapK * ps[1];
        }
        if (convK > 0) { qc = convK * (T - ta); sc = convK; }
        if (radK > 0) { const tk = T + 273.15, t3 = tk * tk * tk; qr = radK * (t3 * tk - sky4); sr = 4 * radK * t3; }
        if (wallUA > 0) { qw = wallUA * (T - ground); sw = wallUA; }
      }
      const net = qH + qSolar - qe - qc - qr - qw;
      let slope = sH - se - sc - sr - sw;
      // dT/dt = net/(M·cp(T)): linearise the rate, cp included (with IF97 cp a fixed-rise heater then adds its rise exactly)
      if (!cpFixed && !(Math.abs(T - cpSlopeAtC) <= SLOPE_REFRESH_K)) { cpRelSlope = (fastCpJPerKgK(T + 0.01) - cp) / (0.01 * cp); cpSlopeAtC = T; }
      let rateSlope = cpFixed ? slope : slope - net * cpRelSlope;
      if (rateSlope > 0) { rateSlope = 0; slope = 0; sH = 0; se = 0; sc = 0; sr = 0; sw = 0; } // a self-heating balance: plain Euler, kept in range below
      if (nSub === 0) {
        const dTrial = Math.abs((net * dt * phi1((rateSlope * dt) / mcp)) / mcp);
        nSub = dTrial > MAX_SUBSTEP_CHANGE_K ? Math.min(MAX_SUBSTEPS, Math.ceil(dTrial / MAX_SUBSTEP_CHANGE_K)) : 1;
        h = dt / nSub;
      }
      const z = (rateSlope * h) / mcp;
      const dT = (net * h * phi1(z)) / mcp;
      const D = (net * h * h * phi2(z)) / mcp; // ∫ (T − T₀) dt over the sub-step
      let Tn = T + dT;
      let scale = 1;
      const loS = Math.min(lo, T), hiS = Math.max(hi, T);
      if (Tn < loS || Tn > hiS) {
        const Tc = Tn < loS ? loS : hiS;
        scale = dT !== 0 ? (Tc - T) / dT : 0;
        Tn = Tc;
      }
      eHeat += scale * (qH * h + sH * D);
      eSolar += scale * qSolar * h;
      const de = scale * (qe * h + se * D);
      eEvap += de; eConv += scale * (qc * h + sc * D); eRad += scale * (qr * h + sr * D); eWalls += scale * (qw * h + sw * D);
      if (de !== 0) evapKg += de / fastLatentHeatJPerKg(T);
      if (hitH === null && target !== null && Tn >= target) {
        // the crossing time on the step's exact (linearised) path, else linear interpolation
        let tau = (h * (target - T)) / (Tn - T);
        if (scale === 1 && rateSlope < 0) {
          const Tstar = T - net / rateSlope;
          const r = (target - Tstar) / (T - Tstar);
          if (r > 0 && r <= 1) tau = (Math.log(r) * mcp) / rateSlope;
        }
        hitH = (i * dt + tIn + tau) / 3600;
      }
      T = Tn;
      if (T > maxT) maxT = T;
      tIn += h;
      if (++sub >= nSub) break;
    }
  }
  record(steps, T, lastOut);

  const balance = { heater, terms, flowM3PerS: flow, massFlowKgPerS: massFlow, heaterOn, startHourOfDay: startHour, hours };
  const eq = equilibriumTempC(balance);
  const hold = target !== null && target >= 0 && target <= 100 ? holdHoursPerDay(balance, target) : null;
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
    holdHoursPerDay: hold?.hoursPerDay ?? null, holdNote: hold?.note ?? null,
    cautions: mergeCautions(...cautions),
  };
}
