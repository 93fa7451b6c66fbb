import { describe, expect, test } from 'vitest';
import { checkReading, driftCheck } from '../../../analysis/plan/reading-check';
import { predictRuns } from '../../../analysis/plan/plan-session';

const LPM = 1 / 60000;

describe('a reading against the planned prediction', () => {
  const run = { predictedOutletTempC: 40, piLowC: 38, piHighC: 42, inletSlope: 0.6, planInletTempC: 15 };
  test.each([
    [15, 40, true],
    [15, 42, true],
    [15, 42.01, false],
    [15, 37.9, false],
    // the inlet 5 K warmer moves the prediction by 0.6 × 5 = 3 K
    [20, 44.5, true],
    [20, 40.5, false],
  ])('inlet %s °C, outlet %s °C → inside %s', (inlet, outlet, inside) => {
    const c = checkReading(run, { inletTempC: inlet, outletTempC: outlet });
    expect(c.inside).toBe(inside);
    expect(c.deviationK).toBeCloseTo(outlet - (40 + 0.6 * (inlet - 15)), 12);
    if (!inside) expect(c.message).toMatch(outlet > c.predictedOutletTempC ? /above the predicted/ : /below the predicted/);
  });
  test('a non-finite reading is a RangeError naming it', () => {
    expect(() => checkReading(run, { inletTempC: 15, outletTempC: NaN })).toThrow(/outletTempC/);
  });
  test('the coil\'s inlet sensitivity is 1 − ε = e^(−UA/(ṁ·cp)) (DOMAIN.md §1.2, closed form), exp-inlet\'s 1', () => {
    const f = 6 * LPM;
    const [coil] = predictRuns({ model: 'coil', prior: { values: { Ts: 90, UA: 400 } }, inletTempC: 15 }, [f]);
    const eps = (coil.predictedOutletTempC - 15) / (90 - 15);
    // within 0.02: the model's density and cp follow the inlet too (IAPWS-IF97), which 1 − ε at fixed properties leaves out
    expect(Math.abs(coil.inletSlope - (1 - eps))).toBeLessThan(0.02);
    const [exp] = predictRuns({ model: 'exp-inlet', prior: { values: { A: 40, k: 0.1 / LPM } }, inletTempC: 15 }, [f]);
    expect(exp.inletSlope).toBeCloseTo(1, 9);
    expect(exp.predictedOutletTempC).toBeCloseTo(15 + 40 * Math.exp(-0.6), 9);
  });
});

describe('the drift check of the reference runs', () => {
  // u = 0.5 K per reading: a rise holds two readings (√2·u), a difference of two rises 2u = 1 K, expanded k = 2: 2 K (JCGM 100:2008 §6.3)
  test('one reference: not ready', () => {
    expect(driftCheck([{ inletTempC: 15, outletTempC: 60 }], 0.5).ready).toBe(false);
  });
  test.each([
    [58.5, false],
    [57.9, true],
    [62.1, true],
  ])('first 60 °C, later %s °C at the same inlet (U = 2 K) → drifted %s', (later, drifted) => {
    const d = driftCheck([{ inletTempC: 15, outletTempC: 60 }, { inletTempC: 15, outletTempC: later }], 0.5);
    expect(d.expandedUK).toBeCloseTo(2, 12);
    expect(d.drifted).toBe(drifted);
    expect(d.driftK).toBeCloseTo(later - 60, 12);
  });
  test('with the source temperature the later reference is re-referenced through ε: a warmer tank is no drift', () => {
    // Ts 90, first Tin 15 → Tout 60: ε = 45/75 = 0.6; a tank at 25 °C gives 25 + 0.6·65 = 64 °C
    const d = driftCheck([{ inletTempC: 15, outletTempC: 60 }, { inletTempC: 25, outletTempC: 64 }], 0.5, 90);
    expect(d.driftK).toBeCloseTo(0, 12);
    expect(d.drifted).toBe(false);
    const plain = driftCheck([{ inletTempC: 15, outletTempC: 60 }, { inletTempC: 25, outletTempC: 64 }], 0.5);
    expect(plain.driftK).toBeCloseTo(-6, 12);
  });
  test('the largest drift of several later references is reported', () => {
    const d = driftCheck([{ inletTempC: 15, outletTempC: 60 }, { inletTempC: 15, outletTempC: 59 }, { inletTempC: 15, outletTempC: 55 }], 0.5);
    expect(d.driftsK).toEqual([-1, -5]);
    expect(d.driftK).toBe(-5);
  });
  test('u must be positive', () => {
    expect(() => driftCheck([], 0)).toThrow(RangeError);
  });
});
