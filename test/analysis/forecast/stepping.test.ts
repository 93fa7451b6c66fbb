import { describe, expect, test } from 'vitest';
import { recirculatingForecast, type ForecastInput } from '../../../analysis/forecast/recirculating-forecast';
import { convectionCoefficient, evaporationWPerM2, skyRadiationWPerM2 } from '../../../analysis/forecast/surface-losses';
import { coilHeater, fixedRiseHeater } from '../../../analysis/performance/heater-model';
import { saturationPressurePa } from '../../../analysis/water/saturation-pressure';

// The pool balance of DOMAIN.md §3.3, M·cp·dT/dt = ε·C·(Ts − T) − losses, stepped with steps far
// longer than the time constant of a small tub. Explicit Euler diverged or overshot here. The coil
// holds ρ = 1000 kg/m³ and cp = 4186 J/(kg·K), so ṁ = 1000·V̇ and the closed forms are exact.

const CP = 4186;
const coil = (sourceTempC: number, uaWPerK: number) => coilHeater({ sourceTempC, uaWPerK, cpJPerKgK: CP, densityKgPerM3: 1000 });
const effectiveness = (ua: number, m: number) => -Math.expm1(-ua / (m * CP));

describe('loss-free coil: the exact exponential Tp(t) = Ts − (Ts − Tp0)·exp(−ε·ṁ·t/M) (closed form, DOMAIN.md §3.3)', () => {
  // a 100 kg tub, 1 kg/s through a 500 W/K coil: ε·ṁ·Δt/M ≈ 4 for an hourly step (Euler's factor −3 per step)
  const input: ForecastInput = {
    poolMassKg: 100, startTempC: 15, hours: 48, stepS: 3600, flowM3PerS: 1e-3, fixedCpJPerKgK: CP, heater: coil(60, 500), losses: false,
  };
  test('hourly steps give the closed form at every sample, and never pass the source temperature', () => {
    const r = recirculatingForecast(input);
    const rate = (effectiveness(500, 1) * 1) / 100; // ε·ṁ/M, 1/s
    for (let i = 0; i < r.timeH.length; i++) {
      const exact = 60 - (60 - 15) * Math.exp(-rate * r.timeH[i] * 3600);
      expect(Math.abs(r.tempC[i] - exact)).toBeLessThan(1e-9);
      expect(r.tempC[i]).toBeGreaterThanOrEqual(15);
      expect(r.tempC[i]).toBeLessThanOrEqual(60);
    }
    expect(r.maxTempC).toBeLessThanOrEqual(60);
  });
  test('halving the step changes the final temperature by less than 1e-9 K', () => {
    const a = recirculatingForecast({ ...input, hours: 2 });
    const b = recirculatingForecast({ ...input, hours: 2, stepS: 1800 });
    expect(Math.abs(a.finalTempC - b.finalTempC)).toBeLessThan(1e-9);
  });
  test('hours to a target on the exact path: t = −ln[(Ts − T*)/(Ts − Tp0)]·M/(ε·ṁ)', () => {
    const r = recirculatingForecast({ ...input, hours: 2, targetTempC: 50 });
    const rate = effectiveness(500, 1) / 100;
    expect(r.hoursToTarget!).toBeCloseTo(-Math.log(10 / 45) / rate / 3600, 9);
  });
});

describe('fixed-rise heater: T(t) = Tp0 + ṁ·rise·t/M (closed form, common practice)', () => {
  test('hourly steps in a small tub add the constant heat exactly', () => {
    const r = recirculatingForecast({ poolMassKg: 500, startTempC: 20, hours: 5, stepS: 3600, massFlowKgPerS: 0.01, heater: fixedRiseHeater(4), losses: false });
    for (let i = 0; i < r.timeH.length; i++) expect(r.tempC[i]).toBeCloseTo(20 + (0.01 * 4 * r.timeH[i] * 3600) / 500, 9);
  });
});

describe('coil with a linear loss: the closed form of the linear ODE (DOMAIN.md §3.3, linear loss UA_L)', () => {
  // M·cp·dT/dt = εC·(Ts − T) + UA_L·(Tg − T) → T = Teq + (T0 − Teq)·exp(−(εC + UA_L)·t/(M·cp))
  const M = 1500, m = 0.3, ua = 400, Ts = 70, uaLoss = 150, Tg = 10, T0 = 18;
  const base: ForecastInput = {
    poolMassKg: M, startTempC: T0, hours: 36, stepS: 3600, flowM3PerS: m / 1000, fixedCpJPerKgK: CP, heater: coil(Ts, ua),
    losses: {
      weather: { airTempC: 10, relativeHumidity: 0.5 }, surfaceAreaM2: 3,
      evaporation: false, convection: false, radiation: false, solar: false, walls: { areaM2: 10, uWPerM2K: uaLoss / 10, groundTempC: Tg },
    },
  };
  test('hourly steps match it to 1e-9 K and stay between the ground and the source temperature', () => {
    const eC = effectiveness(ua, m) * m * CP;
    const Teq = (eC * Ts + uaLoss * Tg) / (eC + uaLoss);
    const r = recirculatingForecast(base);
    for (let i = 0; i < r.timeH.length; i++) {
      const exact = Teq + (T0 - Teq) * Math.exp((-(eC + uaLoss) * r.timeH[i] * 3600) / (M * CP));
      expect(Math.abs(r.tempC[i] - exact)).toBeLessThan(1e-9);
    }
    expect(r.equilibriumTempC!).toBeCloseTo(Teq, 6);
    // the energy of each term adds up to the stored energy
    expect(r.energy.netJ / (M * CP * (r.finalTempC - T0))).toBeCloseTo(1, 9);
    expect(r.energy.wallsJ).toBeGreaterThan(0);
  });
  test('the heater hours per day that hold a target: duty·εC·(Ts − T*) = UA_L·(T* − Tg), so h = 24·UA_L·(T* − Tg)/(εC·(Ts − T*)) (closed form)', () => {
    const eC = effectiveness(ua, m) * m * CP;
    const target = 30;
    const r = recirculatingForecast({ ...base, targetTempC: target });
    expect(r.holdHoursPerDay!).toBeCloseTo((24 * uaLoss * (target - Tg)) / (eC * (Ts - target)), 6);
    // above the equilibrium with the heater on all day, no number of hours holds it
    const hot = recirculatingForecast({ ...base, targetTempC: 65 });
    expect(hot.holdHoursPerDay).toBeNull();
    expect(hot.holdNote).toMatch(/Even 24 h a day cannot hold 65 °C/);
    // at or below the ground temperature the losses are gains: no hours
    expect(recirculatingForecast({ ...base, targetTempC: 10 }).holdHoursPerDay).toBe(0);
  });
});

describe('every loss term on, a small tub, steps up to an hour: against RK4 with a 2-s step (high-accuracy ODE solution)', () => {
  const M = 400, area = 2, m = 0.4, ua = 600, Ts = 75, T0 = 12;
  const weather = { airTempC: 18, dewPointC: 8, windMPerS: 2, skyTempC: 2, solarWPerM2: 0 };
  const forecast = (stepS: number) => recirculatingForecast({
    poolMassKg: M, startTempC: T0, hours: 12, stepS, flowM3PerS: m / 1000, fixedCpJPerKgK: CP, heater: coil(Ts, ua),
    losses: { weather, surfaceAreaM2: area, walls: { areaM2: 4, uWPerM2K: 2, groundTempC: 10 } },
  });
  // the same balance written out in the test from the published terms (DOMAIN.md §3.4)
  const pa = saturationPressurePa(weather.dewPointC);
  const h = convectionCoefficient(weather.windMPerS, 'pool-guidance');
  const rate = (T: number) => {
    const heat = effectiveness(ua, m) * m * CP * (Ts - T);
    const loss = area * (evaporationWPerM2(saturationPressurePa(T), pa, weather.windMPerS) + h * (T - weather.airTempC) + skyRadiationWPerM2(T, weather.skyTempC)) + 8 * (T - 10);
    return (heat - loss) / (M * CP);
  };
  const rk4 = (hours: number, dt: number) => {
    let T = T0;
    for (let t = 0; t < hours * 3600 - 1e-9; t += dt) {
      const k1 = rate(T), k2 = rate(T + (dt / 2) * k1), k3 = rate(T + (dt / 2) * k2), k4 = rate(T + dt * k3);
      T += (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    }
    return T;
  };
  const reference = rk4(12, 2);
  test('the reference itself has converged (RK4 at 2 s and 4 s agree to 1e-9 K)', () => {
    expect(Math.abs(rk4(12, 4) - reference)).toBeLessThan(1e-9);
  });
  test.each([3600, 1800, 600, 60])('a %d-s step lands within 0.01 K of the reference', (stepS) => {
    expect(Math.abs(forecast(stepS).finalTempC - reference)).toBeLessThan(0.01);
  });
  test('halving the hourly step changes the final temperature by less than 0.01 K', () => {
    expect(Math.abs(forecast(3600).finalTempC - forecast(1800).finalTempC)).toBeLessThan(0.01);
  });
  test('the temperatures stay between the coldest and the hottest driving temperature (sky 2 °C … source 75 °C)', () => {
    const r = forecast(3600);
    for (const t of r.tempC) {
      expect(t).toBeGreaterThanOrEqual(2);
      expect(t).toBeLessThanOrEqual(75);
    }
  });
});

describe('without the heater a warm tub cools towards its surroundings, never past them (common practice)', () => {
  test('hourly steps, all losses, heater off: between the sky temperature (0 °C) and the start', () => {
    const r = recirculatingForecast({
      poolMassKg: 100, startTempC: 40, hours: 72, stepS: 3600, flowM3PerS: 1e-4, heater: coil(80, 500), heaterHours: [],
      losses: { weather: { airTempC: 15, relativeHumidity: 0.3, windMPerS: 4, skyTempC: 0 }, surfaceAreaM2: 2.5 },
    });
    for (const t of r.tempC) {
      expect(t).toBeGreaterThanOrEqual(0);
      expect(t).toBeLessThanOrEqual(40);
    }
    expect(r.finalTempC).toBeLessThan(20);
  });
});
