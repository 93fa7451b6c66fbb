import { describe, expect, test } from 'vitest';
import { coilOutletC, generateTrials, rigPlans, seededRandom } from '../../fixtures/demo-lab';

describe('demo lab generator', () => {
  // DOMAIN.md §8 check value #2 (ε-NTU with Cr → 0, computed): Ts 90 °C, Tin 20 °C, UA 500 W/K,
  // ṁ 0.1 kg/s, cp 4186 J/(kg·K) → Tout 68.80 °C.
  test('uses the constant-source coil model of the published check value', () => {
    expect(coilOutletC(90, 20, 500, 0.1, 4186)).toBeCloseTo(68.8, 2);
    // DOMAIN.md §1.2 worked table (computed): ṁ 0.4 kg/s → 38.07 °C.
    expect(coilOutletC(90, 20, 500, 0.4, 4186)).toBeCloseTo(38.07, 2);
  });

  test('is deterministic: the same seed gives the same trials', () => {
    expect(generateTrials(rigPlans[0])).toEqual(generateTrials(rigPlans[0]));
    expect(seededRandom(1).uniform()).toBe(seededRandom(1).uniform());
  });

  test.each(rigPlans.map((p) => [p.name, p] as const))('%s: trials are physically plausible', (_name, plan) => {
    const trials = generateTrials(plan);
    expect(trials.length).toBeGreaterThanOrEqual(12);
    for (const t of trials) {
      expect(t.outletTempC).toBeGreaterThan(t.inletTempC);
      expect(t.outletTempC).toBeLessThan(plan.sourceC);
      expect(Math.min(...t.fillTimesS)).toBeGreaterThan(30); // fills ≥ 30 s keep timing error small (common practice)
      expect(t.flowM3PerS).toBeCloseTo(t.bucketVolumeM3 / (t.fillTimesS.reduce((a, b) => a + b) / t.fillTimesS.length), 12);
    }
    expect(trials.filter((t) => t.isReference).length).toBeGreaterThanOrEqual(2);
  });
});
