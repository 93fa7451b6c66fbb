import { describe, expect, test } from 'vitest';
import { collectorTest } from '../../analysis/performance/collector-test';
import { SOLAR_CURVE, solarPeriods } from '../../fixtures/demo-solar';

describe('demo solar collector generator', () => {
  test('is deterministic: the same periods on every machine', () => {
    expect(solarPeriods()).toEqual(solarPeriods());
  });

  test('the ISO 9806 steady-state fit of its periods covers the invented curve with its 95 % intervals and leaves out the cloudy period', () => {
    const periods = solarPeriods();
    const r = collectorTest({ areaM2: SOLAR_CURVE.areaM2, areaBasis: 'gross', trials: periods.map((p) => ({ ...p, spread: p.segment.collectorSpread })) });
    if (!r.ok) throw new Error(r.reason);
    for (const [e, truth] of [[r.eta0, SOLAR_CURVE.eta0!], [r.a1WPerM2K, SOLAR_CURVE.a1WPerM2K], [r.a2WPerM2K2, SOLAR_CURVE.a2WPerM2K2]] as const) {
      expect(e.ciLow).toBeLessThan(truth);
      expect(e.ciHigh).toBeGreaterThan(truth);
    }
    expect(r.n).toBe(16);
    expect(r.excluded).toEqual([{ index: periods.findIndex((p) => p.irradianceWPerM2 < 800), reasons: [expect.stringMatching(/irradiance varied by 80 W\/m²/)] }]);
  });
});
