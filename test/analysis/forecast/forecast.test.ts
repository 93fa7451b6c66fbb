import { describe, expect, test } from 'vitest';
import { recirculatingForecast, type ForecastInput } from '../../../analysis/forecast/recirculating-forecast';
import { carrierEvaporationLbPerH, evaporationWPerM2, skyRadiationWPerM2 } from '../../../analysis/forecast/surface-losses';
import { coilHeater, fixedRiseHeater } from '../../../analysis/performance/heater-model';
import { saturationPressurePa } from '../../../analysis/water/saturation-pressure';
import { latentHeatJPerKg } from '../../../analysis/water/latent-heat';
import { convert } from '../../../analysis/units/parse-quantity';

const fToC = (f: number) => (f - 32) / 1.8;

describe('surface terms (DOMAIN.md §3.4)', () => {
  test('check value #10: 800 ft², water 80 °F, dew point 60 °F, still air → 37.1 lb/h IP, 16.9 kg/h SI, 38,850 Btu/h (Carrier/ASHRAE eq. [7]; IAPWS psat)', () => {
    const pw = saturationPressurePa(fToC(80));
    const pa = saturationPressurePa(fToC(60));
    const inHg = (pa0: number) => convert(pa0, 'Pa', 'inHg');
    const lbPerH = carrierEvaporationLbPerH(800, inHg(pw), inHg(pa), 0, 1048);
    expect(lbPerH).toBeCloseTo(37.1, 1);
    expect(lbPerH * 1048).toBeCloseTo(38850, -1);
    const areaM2 = convert(800, 'ft^2', 'm^2');
    const qW = areaM2 * evaporationWPerM2(pw, pa, 0);
    const y = convert(1048, 'Btu/lb', 'J/kg');
    expect(((qW / y) * 3600)).toBeCloseTo(16.9, 1);
    // the SI form (the one the forecast uses) agrees with the IP form within 0.6 % (DOMAIN.md §3.4)
    expect(Math.abs(convert(qW, 'W', 'Btu/h') / (lbPerH * 1048) - 1)).toBeLessThan(0.006);
    expect(latentHeatJPerKg(fToC(80)) / y).toBeCloseTo(1, 3);
  });
  test('at 50 ft/min the IP form gives 45.4 lb/h (DOMAIN.md §3.4, computed)', () => {
    const inHg = (t: number) => convert(saturationPressurePa(fToC(t)), 'Pa', 'inHg');
    expect(carrierEvaporationLbPerH(800, inHg(80), inHg(60), 50, 1048)).toBeCloseTo(45.4, 1);
  });
  test('check value #11: Tw 27 °C to a 0 °C sky, ε 0.95 → 137 W/m²; to a 20 °C sky 39 W/m² ([11b], computed)', () => {
    expect(skyRadiationWPerM2(27, 0)).toBeCloseTo(137, 0);
    expect(skyRadiationWPerM2(27, 20)).toBeCloseTo(39, 0);
  });
});

describe('recirculating forecast without losses, check value #13 (DOMAIN.md §3.3 exact solution, computed)', () => {
  const base: ForecastInput = {
    poolMassKg: 56588, startTempC: 20, hours: 24, massFlowKgPerS: 0.2, fixedCpJPerKgK: 4186,
    heater: coilHeater({ sourceTempC: 90, uaWPerK: 500, cpJPerKgK: 4186 }), losses: false,
  };
  test('60-s Euler steps give 28.98 °C after 24 h', () => {
    const r = recirculatingForecast(base);
    expect(r.finalTempC).toBeCloseTo(28.98, 2);
    expect(r.tempC.length).toBe(25);
    expect(r.timeH[24]).toBe(24);
  });
  test('36.81 °C after 48 h, and the exact exponential with τ = 174.8 h', () => {
    const r = recirculatingForecast({ ...base, hours: 48 });
    expect(r.finalTempC).toBeCloseTo(36.81, 2);
    const eps = 1 - Math.exp(-500 / (0.2 * 4186));
    const tauH = 56588 / (eps * 0.2) / 3600;
    expect(tauH).toBeCloseTo(174.8, 1);
    for (let i = 0; i < r.timeH.length; i++) {
      expect(Math.abs(r.tempC[i] - (90 - 70 * Math.exp(-r.timeH[i] / tauH)))).toBeLessThan(2e-3);
    }
  });
  test('energy closes: heater energy = M·cp·ΔT', () => {
    const r = recirculatingForecast(base);
    expect(r.energy.heaterJ / (56588 * 4186 * (r.finalTempC - 20))).toBeCloseTo(1, 9);
    expect(r.energy.netJ).toBe(r.energy.heaterJ);
  });
  test('with a volume and IF97 properties it stays within 0.03 K of the check (mass and cp differ slightly)', () => {
    const r = recirculatingForecast({ ...base, poolMassKg: undefined, poolVolumeM3: 15000 * 3.785411784e-3, fixedCpJPerKgK: undefined, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }) });
    expect(Math.abs(r.finalTempC - 28.98)).toBeLessThan(0.03);
  });
  test('hours to target and equilibrium at the source temperature', () => {
    const r = recirculatingForecast({ ...base, targetTempC: 25 });
    const eps = 1 - Math.exp(-500 / (0.2 * 4186));
    const exact = (-Math.log(65 / 70) * 56588) / (eps * 0.2) / 3600;
    expect(r.hoursToTarget!).toBeCloseTo(exact, 2);
    expect(r.equilibriumTempC!).toBeCloseTo(90, 6);
  });
});

describe('forecast with losses', () => {
  const weather = { airTempC: 20, relativeHumidity: 0.6, windMPerS: 1, solarWPerM2: 200, cloudCover: 0.5 };
  const pool = { poolMassKg: 56588, startTempC: 25, massFlowKgPerS: 0.2, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }) };
  test('linear loss of 699 W/K to 20 °C air → equilibrium 44.5 °C (DOMAIN.md §3.3, computed)', () => {
    const r = recirculatingForecast({
      ...pool, hours: 24, fixedCpJPerKgK: 4186, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500, cpJPerKgK: 4186 }),
      losses: {
        weather, surfaceAreaM2: 46.6, evaporation: false, convection: false, radiation: false, solar: false,
        walls: { areaM2: 46.6, uWPerM2K: 15 },
      },
    });
    expect(r.equilibriumTempC!).toBeCloseTo(44.5, 1);
  });
  test('the budget by term closes on the stored energy, evaporation is the largest loss (DOMAIN.md §3.4 [5])', () => {
    const r = recirculatingForecast({ ...pool, hours: 72, fixedCpJPerKgK: 4186, losses: { weather, surfaceAreaM2: 46.6 } });
    const stored = 56588 * 4186 * (r.finalTempC - 25);
    expect(r.energy.netJ / stored).toBeCloseTo(1, 6);
    expect(r.energy.evaporationJ).toBeGreaterThan(r.energy.radiationJ);
    expect(r.energy.evaporationJ).toBeGreaterThan(r.energy.convectionJ);
    expect(r.energy.evaporatedKg).toBeGreaterThan(0);
    expect(r.equilibriumTempC!).toBeGreaterThan(20);
    expect(r.equilibriumTempC!).toBeLessThan(90);
  });
  test('a night cover cuts evaporation and leaves a warmer pool', () => {
    const losses = { weather, surfaceAreaM2: 46.6 };
    const open = recirculatingForecast({ ...pool, hours: 48, losses });
    const covered = recirculatingForecast({ ...pool, hours: 48, losses: { ...losses, cover: { coveredHours: [0, 1, 2, 3, 4, 5, 6, 20, 21, 22, 23] } } });
    expect(covered.energy.evaporationJ).toBeLessThan(open.energy.evaporationJ * 0.7);
    expect(covered.finalTempC).toBeGreaterThan(open.finalTempC);
  });
  test('an hourly table repeats; heater hours limit the heating', () => {
    const day = Array.from({ length: 24 }, (_, h) => ({ airTempC: 15 + 8 * Math.sin(((h - 9) / 24) * 2 * Math.PI), dewPointC: 5, windMPerS: 1.5, solarWPerM2: Math.max(0, 800 * Math.sin(((h - 6) / 12) * Math.PI)) }));
    const all = recirculatingForecast({ ...pool, hours: 72, losses: { weather: day, surfaceAreaM2: 46.6 } });
    const some = recirculatingForecast({ ...pool, hours: 72, heaterHours: [10, 11, 12, 13, 14, 15], losses: { weather: day, surfaceAreaM2: 46.6 } });
    expect(some.energy.heaterJ).toBeLessThan(all.energy.heaterJ / 3);
    expect(Number.isFinite(all.finalTempC)).toBe(true);
  });
  test('a spa heated past 40 °C carries the spa caution; a hot source carries the boiling caution', () => {
    const r = recirculatingForecast({
      poolVolumeM3: 1.5, startTempC: 36, hours: 3, flowM3PerS: 1e-4, heater: coilHeater({ sourceTempC: 150, uaWPerK: 300 }), losses: false,
    });
    const codes = r.cautions.map((c) => `${c.code}@${c.where}`);
    expect(codes).toContain('spa-limit@pool');
    expect(codes).toContain('above-boiling-source@source');
    expect(codes).toContain('scald-seconds@outlet');
  });
  test('zero flow with the heater on raises the dead-heading caution', () => {
    const r = recirculatingForecast({ poolVolumeM3: 10, startTempC: 20, hours: 1, flowM3PerS: 0, heater: fixedRiseHeater(5), losses: false });
    expect(r.cautions.map((c) => c.code)).toContain('dead-heading');
    expect(r.finalTempC).toBe(20);
  });
  test.each([
    [{ hours: 0 }, /hours/],
    [{ startTempC: 120 }, /startTempC/],
    [{ poolMassKg: -5 }, /poolMassKg/],
    [{ heaterHours: [25] }, /heaterHours\[0\]/],
    [{ losses: { weather: { airTempC: 20, windMPerS: 1 }, surfaceAreaM2: 10 } }, /dewPointC or relativeHumidity/],
    [{ losses: { weather: { airTempC: 20, relativeHumidity: 1.5 }, surfaceAreaM2: 10 } }, /relativeHumidity/],
  ] as const)('refuses %j naming the field', (patch, msg) => {
    const input = { poolMassKg: 1000, startTempC: 20, hours: 1, flowM3PerS: 1e-4, heater: fixedRiseHeater(5), losses: false, ...patch } as ForecastInput;
    expect(() => recirculatingForecast(input)).toThrow(msg);
  });
});

import { measuredDay } from '../../../analysis/forecast/measured-day';

describe('a measured day', () => {
  test('the residual times M·cp is the unmodelled gain; 1 K on 56,588 kg over a day ≈ 2.74 kW', () => {
    const input: ForecastInput = {
      poolMassKg: 56588, startTempC: 20, hours: 24, massFlowKgPerS: 0.2, fixedCpJPerKgK: 4186,
      heater: coilHeater({ sourceTempC: 90, uaWPerK: 500, cpJPerKgK: 4186 }), losses: false,
    };
    const r = measuredDay(input, 29.98);
    expect(r.residualK).toBeCloseTo(1, 2);
    expect(r.unmodelledGainW).toBeCloseTo((r.residualK * 56588 * 4186) / 86400, 6);
    expect(r.unmodelledGainW / 1000).toBeCloseTo(2.74, 1);
    expect(r.unmodelledGainWPerM2).toBeNull();
  });
});
