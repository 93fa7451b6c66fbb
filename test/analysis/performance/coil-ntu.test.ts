import { describe, expect, test } from 'vitest';
import { coilPerformance, minimumMassFlowKgPerS, ntuForCeilingFraction, trialUaWPerK } from '../../../analysis/performance/coil-ntu';

describe('ε-NTU coil in a constant-temperature source (DOMAIN.md §1.2)', () => {
  test.each([
    // ṁ kg/s, NTU, ε, Tout, q — DOMAIN.md §1.2 table (computed), check value #2 is the 0.1 kg/s row
    [0.05, 2.3889, 0.9083, 83.58, 13307],
    [0.1, 1.1945, 0.6971, 68.8, 20427],
    [0.2, 0.5972, 0.4497, 51.48, 26352],
    [0.4, 0.2986, 0.2582, 38.07, 30258],
    [1.0, 0.1194, 0.1126, 27.88, 32990],
  ])('ṁ %s kg/s → NTU %s, ε %s, Tout %s °C, q %s W', (m, ntu, eps, tout, q) => {
    const r = coilPerformance({ sourceTempC: 90, inletTempC: 20, uaWPerK: 500, massFlowKgPerS: m, cpJPerKgK: 4186 });
    expect(r.ntu).toBeCloseTo(ntu, 4);
    expect(r.effectiveness).toBeCloseTo(eps, 4);
    expect(r.outletTempC).toBeCloseTo(tout, 2);
    expect(Math.abs(r.heatW - q)).toBeLessThan(1);
    expect(r.heatCeilingW).toBe(35000);
  });
  test('90 % of the ceiling at N = 0.2146 and 95 % at N = 0.1035 (DOMAIN.md §1.2, computed)', () => {
    expect(ntuForCeilingFraction(0.9)).toBeCloseTo(0.2146, 4);
    expect(ntuForCeilingFraction(0.95)).toBeCloseTo(0.1035, 4);
    expect(() => ntuForCeilingFraction(1)).toThrow(RangeError);
  });
  test('check value #4: UA 400, Ts 150, Tin 20, limit 100 °C → 0.1000 kg/s; 60 °C → 0.260 kg/s (§1.6, computed)', () => {
    const base = { sourceTempC: 150, inletTempC: 20, uaWPerK: 400, cpJPerKgK: 4186 };
    expect(minimumMassFlowKgPerS({ ...base, limitTempC: 100 })).toBeCloseTo(0.1, 4);
    expect(minimumMassFlowKgPerS({ ...base, limitTempC: 60 })).toBeCloseTo(0.26, 3);
    expect(minimumMassFlowKgPerS({ ...base, limitTempC: 160 })).toBe(0);
    expect(() => minimumMassFlowKgPerS({ ...base, limitTempC: 10 })).toThrow(/inletTempC/);
  });
  test('UA per trial inverts the model exactly', () => {
    const r = coilPerformance({ sourceTempC: 90, inletTempC: 20, uaWPerK: 500, massFlowKgPerS: 0.2, cpJPerKgK: 4186 });
    expect(trialUaWPerK({ sourceTempC: 90, inletTempC: 20, outletTempC: r.outletTempC, massFlowKgPerS: 0.2, cpJPerKgK: 4186 })).toBeCloseTo(500, 9);
    expect(() => trialUaWPerK({ sourceTempC: 50, inletTempC: 20, outletTempC: 60, massFlowKgPerS: 0.2, cpJPerKgK: 4186 })).toThrow(/sourceTempC/);
  });
  test('degenerate input', () => {
    expect(() => coilPerformance({ sourceTempC: 90, inletTempC: 20, uaWPerK: 500, massFlowKgPerS: 0, cpJPerKgK: 4186 })).toThrow(/massFlowKgPerS/);
    expect(() => coilPerformance({ sourceTempC: Number.NaN, inletTempC: 20, uaWPerK: 500, massFlowKgPerS: 1, cpJPerKgK: 4186 })).toThrow(TypeError);
  });
});
