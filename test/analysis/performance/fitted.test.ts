import { describe, expect, test } from 'vitest';
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { performanceTable } from '../../../analysis/performance/performance-table';
import { chooseFlow } from '../../../analysis/performance/choose-flow';
import { heaterFromFit } from '../../../analysis/performance/fitted-heater';
import { ntuForCeilingFraction } from '../../../analysis/performance/coil-ntu';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../../../analysis/water/water-properties';

const LPM = 1 / 60000; // m³/s per L/min
const flowsLpm = Array.from({ length: 13 }, (_, i) => 2 + 1.5 * i); // 2 … 20 L/min, as in DOMAIN.md §1.3
const rho20 = waterDensityKgPerM3(20);
const cp20 = waterCpJPerKgK(20);
// a small deterministic ± pattern so the fit has a residual SD (no randomness in tests)
const wiggle = (i: number) => 0.05 * Math.sin(1.7 * i + 0.3);

function coilFit(Ts: number, UA: number): FitSuccess {
  const x = flowsLpm.map((q) => q * LPM);
  const y = x.map((v, i) => Ts - (Ts - 20) * Math.exp(-UA / (rho20 * v * cp20)) + wiggle(i));
  const n = x.length;
  const fit = fitModel({ x, y, model: 'coil', covariates: { Tin: new Array(n).fill(20), rho: new Array(n).fill(rho20), cp: new Array(n).fill(cp20) } });
  if (!fit.ok) throw new Error(fit.reason);
  return fit;
}

function expFit(A: number, kPerLpm: number): FitSuccess {
  const k = kPerLpm / LPM; // s/m³
  const x = flowsLpm.map((q) => q * LPM);
  const y = x.map((v, i) => 20 + A * Math.exp(-k * v) + wiggle(i));
  const fit = fitModel({ x, y, model: 'exp-inlet', covariates: { Tin: new Array(x.length).fill(20) } });
  if (!fit.ok) throw new Error(fit.reason);
  return fit;
}

describe('performance table from a fit', () => {
  const fit = coilFit(90, 500);
  test('coil fit: predicted outlet, ΔT and heat with intervals; extrapolated rows flagged; carries over to any inlet', () => {
    const t = performanceTable(fit, [6 * LPM, 12 * LPM, 40 * LPM], 20);
    expect(t.rows[0].outletTempC).toBeCloseTo(68.8, 0); // DOMAIN.md §1.2 table (ṁ ≈ 0.1 kg/s)
    expect(t.rows[0].outletCiC[0]).toBeLessThan(t.rows[0].outletTempC);
    expect(t.rows[0].outletPiC[1]).toBeGreaterThan(t.rows[0].outletCiC[1]);
    expect(t.rows[0].heatW).toBeCloseTo(rho20 * 6 * LPM * waterCpJPerKgK((20 + t.rows[0].outletTempC) / 2) * t.rows[0].deltaTK, 6);
    expect(t.rows.map((r) => r.extrapolated)).toEqual([false, false, true]);
    expect(t.inletTransferable).toBe(true);
    expect(t.notes.join(' ')).toMatch(/any inlet/);
    expect(t.cautions.map((c) => c.code)).toContain('scald-seconds');
  });
  test('at a warmer inlet the coil predicts a smaller rise (heat ∝ Ts − Tin)', () => {
    const cold = performanceTable(fit, [12 * LPM], 20).rows[0];
    const warm = performanceTable(fit, [12 * LPM], 30).rows[0];
    expect(warm.deltaTK / cold.deltaTK).toBeCloseTo(60 / 70, 2);
  });
  test('empirical fit: a note that it holds only at its inlet temperature', () => {
    const t = performanceTable(expFit(60, 0.1), [10 * LPM], 20);
    expect(t.inletTransferable).toBe(false);
    expect(t.notes.join(' ')).toMatch(/holds only at the inlet temperature it was fitted at \(20\.0 °C\)/);
  });
  test('refuses non-positive flows', () => {
    expect(() => performanceTable(fit, [0], 20)).toThrow(/flowsM3PerS\[0\]/);
  });
});

describe('choosing a flow', () => {
  test('check value #3: exponential fit A 60 K, k 0.1 per L/min → optimum 10 L/min, ΔT 22.07 K, q ≈ 15.4 kW (DOMAIN.md §1.3, computed)', () => {
    const c = chooseFlow(expFit(60, 0.1), 20);
    expect(c.optimum).not.toBeNull();
    expect(c.optimum!.flowM3PerS / LPM).toBeCloseTo(10, 1);
    expect(c.optimum!.heatW / 1000).toBeCloseTo(15.4, 1);
    expect(60 * Math.exp(-1)).toBeCloseTo(22.07, 2);
    expect(c.optimum!.flowU!).toBeGreaterThan(0);
    expect(c.optimum!.flowU! / LPM).toBeLessThan(0.5);
    expect(c.optimumNote).toMatch(/always has one/);
  });
  test('an exponential optimum outside the tested range is not reported', () => {
    const c = chooseFlow(expFit(60, 0.03), 20); // 1/k = 33 L/min, tests end at 20
    expect(c.optimum).toBeNull();
    expect(c.optimumNote).toMatch(/outside the tested flows/);
  });
  test('coil: no optimum; 90 % of the ceiling at NTU 0.2146 (DOMAIN.md §1.2, computed)', () => {
    const fit = coilFit(90, 500);
    const c = chooseFlow(fit, 20);
    expect(c.optimum).toBeNull();
    expect(c.optimumNote).toMatch(/no optimum/);
    const ua = fit.params.UA.value;
    expect(c.ceiling!.flowM3PerS).toBeCloseTo(ua / (ntuForCeilingFraction(0.9) * rho20 * cp20), 9);
    expect(c.ceiling!.heatCeilingW).toBeCloseTo(ua * (fit.params.Ts.value - 20), 6);
    expect(c.ceiling!.flowU!).toBeCloseTo(c.ceiling!.flowM3PerS * (fit.params.UA.stdErr / ua), 9);
    expect(c.ceiling!.extrapolated).toBe(true);
  });
  test('check value #4: UA 400, Ts 150, Tin 20 → minimum flow for 100 °C ≈ 0.1000 kg/s, 60 °C ≈ 0.260 kg/s (§1.6, computed)', () => {
    const fit = coilFit(150, 400);
    const c = chooseFlow(fit, 20, { limits: [{ label: 'boiling', limitC: 100 }, { label: '60', limitC: 60 }, { label: 'hot', limitC: 200 }] });
    const [boil, sixty, above] = c.minimumFlows;
    expect(boil.flowM3PerS! * rho20).toBeCloseTo(0.1, 3);
    expect(sixty.flowM3PerS! * rho20).toBeCloseTo(0.26, 2);
    expect(boil.flowU!).toBeGreaterThan(0);
    expect(boil.conservativeFlowM3PerS!).toBeGreaterThan(boil.flowM3PerS!);
    expect(above.flowM3PerS).toBe(0);
    expect(above.note).toMatch(/stays below/);
  });
  test('the forecast heater from a coil fit is the physical coil', () => {
    const fit = coilFit(90, 500);
    const h = heaterFromFit(fit);
    expect(h.inletTransferable).toBe(true);
    expect(h.outletTempC(6 * LPM, 20)).toBeCloseTo(68.8, 0);
    const e = heaterFromFit(expFit(60, 0.1));
    expect(e.inletTransferable).toBe(false);
    expect(e.outletTempC(10 * LPM, 20)).toBeCloseTo(20 + 60 * Math.exp(-1), 1);
  });
});

describe('empirical fits in the forecast', () => {
  test('with a known source temperature an exponential fit is re-referenced through its effectiveness', () => {
    const h = heaterFromFit(expFit(60, 0.1), { sourceTempC: 90 });
    const atFit = h.outletTempC(10 * LPM, 20);
    const warmer = h.outletTempC(10 * LPM, 30);
    expect(atFit - 20).toBeCloseTo(60 * Math.exp(-1), 1);
    expect((warmer - 30) / (atFit - 20)).toBeCloseTo(60 / 70, 9);
    expect(() => heaterFromFit(expFit(60, 0.1), { sourceTempC: 10 })).toThrow(/sourceTempC/);
  });
});
