import { describe, expect, test } from 'vitest';
import {
  collectorEfficiency, collectorOutlet, collectorPowerW, solarCollectorHeater, type CollectorParameters,
} from '../../../analysis/performance/collector-efficiency';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';

// ISO 9806:2017 parameters per gross area of the datasheet in DOMAIN.md §4 (Solar Keymark DS 3663 [16])
const SHEET: CollectorParameters = { areaM2: 2.02, areaBasis: 'gross', peakPowerW: 1480, a1WPerM2K: 3.51, a2WPerM2K2: 0.017 };

describe('collector power curve, ISO 9806 / EN 12975 (DOMAIN.md §4)', () => {
  test('check value #14: P0 1,480 W, A 2.02 m², a1 3.51, a2 0.017, ΔT 30 K → 1,236 W (datasheet 1,235 W) [16]', () => {
    expect(collectorPowerW(SHEET, 30)).toBeCloseTo(1236.4, 1);
    expect(Math.abs(collectorPowerW(SHEET, 30) / 1235 - 1)).toBeLessThan(0.002);
    expect(collectorPowerW(SHEET, 10)).toBeCloseTo(1405.7, 1); // DOMAIN.md §4 (computed)
    expect(collectorPowerW(SHEET, 0)).toBeCloseTo(1480, 9);
  });
  test.each([
    // ΔT K, listed power W — datasheet DS 3663 [16]; DOMAIN.md §4: within ~0.5 % from rounded coefficients (0.61 % at 83 K, computed)
    [10, 1405], [30, 1235], [50, 1037], [70, 812], [83, 651],
  ])('at ΔT %s K the curve is within 0.7 %% of the listed %s W', (dT, listed) => {
    expect(Math.abs(collectorPowerW(SHEET, dT) / listed - 1)).toBeLessThan(0.007);
  });
  test('the η and P0 forms agree: P0 = η0·A·G*, η = P/(A·G) (ISO 9806 [13b], EN 12975 [14])', () => {
    const eta0 = 1480 / (2.02 * 1000);
    const etaForm: CollectorParameters = { areaM2: 2.02, eta0, a1WPerM2K: 3.51, a2WPerM2K2: 0.017 };
    for (const [dT, G] of [[0, 1000], [30, 1000], [20, 600]]) {
      expect(collectorPowerW(etaForm, dT, G)).toBeCloseTo(collectorPowerW(SHEET, dT, G), 9);
      expect(collectorEfficiency(SHEET, dT, G)).toBeCloseTo(eta0 - 3.51 * dT / G - 0.017 * dT * dT / G, 12);
    }
  });
  test('refuses bad parameters, naming the field', () => {
    expect(() => collectorPowerW({ ...SHEET, eta0: 0.7 }, 10)).toThrow(/exactly one of eta0 and peakPowerW/);
    expect(() => collectorPowerW({ ...SHEET, areaM2: 0 }, 10)).toThrow(/areaM2/);
    expect(() => collectorPowerW({ ...SHEET, peakPowerW: 3000 }, 10)).toThrow(/eta0 must be at most 1/);
    expect(() => collectorPowerW({ ...SHEET, a1WPerM2K: -1 }, 10)).toThrow(/a1WPerM2K/);
    expect(() => collectorPowerW(SHEET, Number.NaN)).toThrow(TypeError);
    expect(() => collectorEfficiency(SHEET, 10, 0)).toThrow(/irradianceWPerM2/);
  });
});

describe('collector outlet at a flow (steady balance, Tm = (Tin + Tout)/2)', () => {
  const cond = { inletTempC: 40, ambientTempC: 20, irradianceWPerM2: 900, massFlowKgPerS: 0.03, cpJPerKgK: 4186 };
  test('the heat to the water equals the curve at Tm − Ta', () => {
    const r = collectorOutlet(SHEET, cond);
    expect((cond.inletTempC + r.outletTempC) / 2 - cond.ambientTempC).toBeCloseTo(r.deltaTK, 10);
    expect(r.heatW).toBeCloseTo(collectorPowerW(SHEET, r.deltaTK, 900), 6);
    expect(r.efficiency!).toBeCloseTo(r.heatW / (2.02 * 900), 10);
    expect(r.outletTempC).toBeGreaterThan(cond.inletTempC);
  });
  test('first-order form has the closed form Tout − Tin = 2A(η0·G − a1·(Tin − Ta))/(A·a1 + 2ṁcp) (computed)', () => {
    const p: CollectorParameters = { areaM2: 2, eta0: 0.8, a1WPerM2K: 4, a2WPerM2K2: 0 };
    const C = 0.03 * 4186;
    expect(collectorOutlet(p, cond).outletTempC - 40).toBeCloseTo((2 * 2 * (0.8 * 900 - 4 * 20)) / (2 * 4 + 2 * C), 10);
  });
  test('stagnation: no power at the stagnation temperature, which is above boiling for this glazed collector', () => {
    const r = collectorOutlet(SHEET, { ...cond, irradianceWPerM2: 1000 });
    expect(collectorPowerW(SHEET, r.stagnationTempC - 20, 1000)).toBeCloseTo(0, 6);
    expect(r.stagnationTempC).toBeCloseTo(20 + (-3.51 + Math.sqrt(3.51 ** 2 + 4 * 0.017 * 1480 / 2.02)) / (2 * 0.017), 9);
    expect(r.stagnationTempC).toBeGreaterThan(100);
  });
  test('without sun and above ambient the loop cools the water; efficiency is then undefined', () => {
    const r = collectorOutlet(SHEET, { ...cond, irradianceWPerM2: 0 });
    expect(r.outletTempC).toBeLessThan(40);
    expect(r.heatW).toBeLessThan(0);
    expect(r.efficiency).toBeNull();
  });
  test('a hot outlet carries scald cautions; zero flow is refused', () => {
    const r = collectorOutlet(SHEET, { ...cond, massFlowKgPerS: 0.005 });
    expect(r.cautions.map((c) => c.code)).toContain('scald-seconds');
    expect(() => collectorOutlet(SHEET, { ...cond, massFlowKgPerS: 0 })).toThrow(/massFlowKgPerS/);
  });
});

describe('a solar loop feeding the recirculating forecast (HeaterModel adapter)', () => {
  // an unglazed first-order array: made-up coefficients, for the exact solution only
  const unglazed: CollectorParameters = { areaM2: 2, eta0: 0.85, a1WPerM2K: 15, a2WPerM2K2: 0 };
  const heater = solarCollectorHeater({ collector: unglazed, modules: 10, irradianceWPerM2: 700, ambientTempC: 25, cpJPerKgK: 4186 });
  test('no losses: Tp(t) = Teq − (Teq − Tp0)·exp(−K·t/(M·cp)), Teq = Ta + η0·G/a1 (§3.3 balance, computed)', () => {
    const M = 56588, cp = 4186, Cm = (0.2 * cp) / 10, A = 2;
    const K = (10 * 2 * Cm * A * 15) / (A * 15 + 2 * Cm);
    const Teq = 25 + (0.85 * 700) / 15;
    const r = recirculatingForecast({ poolMassKg: M, startTempC: 20, hours: 24, massFlowKgPerS: 0.2, fixedCpJPerKgK: cp, heater, losses: false });
    for (let i = 0; i < r.timeH.length; i++) {
      expect(Math.abs(r.tempC[i] - (Teq - (Teq - 20) * Math.exp((-K * r.timeH[i] * 3600) / (M * cp))))).toBeLessThan(2e-3);
    }
    expect(r.energy.heaterJ / (M * cp * (r.finalTempC - 20))).toBeCloseTo(1, 9);
  });
  test('the outlet is the module balance at the per-module flow; zero flow gives the stagnation temperature', () => {
    const rho = 1000;
    const h = solarCollectorHeater({ collector: SHEET, modules: 4, irradianceWPerM2: 800, ambientTempC: 25, cpJPerKgK: 4186, densityKgPerM3: rho });
    const direct = collectorOutlet(SHEET, { inletTempC: 28, ambientTempC: 25, irradianceWPerM2: 800, massFlowKgPerS: (rho * 2e-4) / 4, cpJPerKgK: 4186 });
    expect(h.outletTempC(2e-4, 28)).toBeCloseTo(direct.outletTempC, 12);
    expect(h.outletTempC(0, 28)).toBeCloseTo(direct.stagnationTempC, 12);
    expect(h).toMatchObject({ name: 'solar-collector', inletTransferable: true, fittedInletC: null });
  });
  test('a glazed loop that stagnates above boiling raises the above-boiling caution in the forecast (DOMAIN.md §5)', () => {
    const h = solarCollectorHeater({ collector: SHEET, modules: 6, irradianceWPerM2: 900, ambientTempC: 30 });
    const r = recirculatingForecast({ poolMassKg: 20000, startTempC: 24, hours: 6, flowM3PerS: 1e-4, heater: h, losses: false });
    expect(r.finalTempC).toBeGreaterThan(24);
    expect(r.cautions.map((c) => c.code)).toContain('above-boiling-source');
  });
  test('refuses a fractional module count', () => {
    expect(() => solarCollectorHeater({ collector: SHEET, modules: 2.5, irradianceWPerM2: 800, ambientTempC: 25 })).toThrow(/modules/);
  });
});
