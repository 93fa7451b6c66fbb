import { describe, expect, test } from 'vitest';
import { bootstrapDerived, compareModels, fitModel, heatOptimum, predictAt } from '../../../analysis/fit';
import { trialWaterProperties } from '../../../analysis/water/trial-water';

// DOMAIN.md §1.3 demonstration (computed): exact constant-source coil data, Ts = 90 °C, Tin = 20 °C,
// UA = 500 W/K, cp = 4186 J/(kg·K), 13 evenly spaced flows from 2 to 20 L/min, 1 kg/L for this check.
const LPM = 1 / 60000; // m³/s per L/min
const flowsLpm = Array.from({ length: 13 }, (_, k) => 2 + 1.5 * k);
const x = flowsLpm.map((q) => q * LPM);
const Tin = x.map(() => 20);
const rho = x.map(() => 1000);
const cp = x.map(() => 4186);
const y = x.map((v) => 90 - (90 - 20) * Math.exp(-500 / (1000 * v * 4186)));
const covariates = { Tin, rho, cp };

describe('coil model (effectiveness–NTU, Cr → 0)', () => {
  const fit = fitModel({ x, y, model: 'coil', covariates });

  test('fits exact trials back to UA and Ts within 1e-6 relative (issue physics check; DOMAIN.md §1.3 data)', () => {
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(Math.abs(fit.params.UA.value / 500 - 1)).toBeLessThan(1e-6);
    expect(Math.abs(fit.params.Ts.value / 90 - 1)).toBeLessThan(1e-6);
    expect(fit.jacobian).toBe('analytic');
  });

  test('starts automatically: no start values needed', () => {
    expect(fit.ok && fit.stoppingReason.length > 0).toBe(true);
  });

  test('reproduces DOMAIN.md §8 check 2: Tout 68.80 °C at ṁ = 0.1 kg/s (ε-NTU, computed)', () => {
    if (!fit.ok) throw new Error('fit failed');
    const [p] = predictAt(fit, [0.1 / 1000], { Tin: [20], rho: [1000], cp: [4186] });
    expect(p.y).toBeCloseTo(68.8, 2);
    expect(p.extrapolated).toBe(false);
  });

  test('has no interior heat optimum: heat keeps rising with flow (DOMAIN.md §1.2)', () => {
    if (!fit.ok) throw new Error('fit failed');
    const h = heatOptimum(fit);
    expect(h.interior).toBe(false);
    expect(h.flowM3PerS).toBeCloseTo(20 * LPM, 12);
  });

  test('takes IF97 water at the documented temperatures only when rho and cp are absent (ρ at the outlet, cp at the mean), and says so', () => {
    const f = fitModel({ x, y, model: 'coil', covariates: { Tin } });
    expect(f.ok).toBe(true);
    if (!f.ok) return;
    const water = y.map((t) => trialWaterProperties(20, t));
    const same = fitModel({ x, y, model: 'coil', covariates: { Tin, rho: water.map((w) => w.densityKgPerM3), cp: water.map((w) => w.cpJPerKgK) } });
    expect(same.ok && same.params.UA.value).toBeCloseTo(f.params.UA.value, 9);
    expect(f.warnings.filter((w) => w.code === 'default-property').map((w) => w.message).join(' ')).toMatch(/IAPWS-IF97 density at each outlet.*IAPWS-IF97 cp at the mean/);
    const g = fitModel({ x, y, model: 'coil', covariates: { Tin, rho: rho.map(() => 994), cp } });
    expect(g.ok && g.warnings.some((w) => w.code === 'default-property')).toBe(false);
    if (g.ok) expect(g.params.UA.value).toBeCloseTo(500 * 0.994, 6);
  });
});

describe('exponential toward the inlet on coil data (DOMAIN.md §1.3, computed values)', () => {
  const fit = fitModel({ x, y, model: 'exp-inlet', covariates });

  test('gives A ≈ 76.43 K and k ≈ 0.0710 per L/min with systematic residuals up to 2.6 K', () => {
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(fit.params.A.value).toBeCloseTo(76.43, 2);
    expect(fit.params.k.value * LPM).toBeCloseTo(0.071, 4);
    expect(Math.max(...fit.residuals.map(Math.abs))).toBeCloseTo(2.6, 1);
  });

  test('places the false heat optimum near 14.1 L/min (Q* = 1/k)', () => {
    if (!fit.ok) throw new Error('fit failed');
    const h = heatOptimum(fit);
    expect(h.interior).toBe(true);
    expect(h.flowM3PerS / LPM).toBeCloseTo(14.1, 1);
    expect(h.flowM3PerS).toBeCloseTo(1 / fit.params.k.value, 9);
  });

  test('the three-parameter exponential approach fits better, max residual 0.83 K, asymptote 34.0 °C above the inlet', () => {
    const a = fitModel({ x, y, model: 'exp-approach', covariates });
    expect(a.ok).toBe(true);
    if (!a.ok) return;
    expect(Math.max(...a.residuals.map(Math.abs))).toBeCloseTo(0.83, 2);
    expect(a.params.Tinf.value).toBeCloseTo(34.0, 1);
    expect(a.warnings.some((w) => w.code === 'unphysical')).toBe(true);
  });
});

describe('compareModels on the coil trials', () => {
  const cmp = compareModels({ x, y, covariates, measurementSD: 0.1 }, ['exp-inlet', 'coil', 'exp-approach']);

  test('ranks the coil first by AICc', () => {
    expect(cmp.best).toBe('coil');
    expect(cmp.ranking[0].deltaAicc).toBe(0);
    const weights = cmp.ranking.map((r) => r.akaikeWeight ?? 0);
    expect(weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
  });

  test('the runs test detects the patterned residuals of the exponential toward the inlet', () => {
    const e = cmp.ranking.find((r) => r.label === 'exp-inlet')!;
    expect(e.patterned).toBe(true);
    expect(e.runs!.runs).toBe(3);
    expect(e.runs!.pValue).toBeLessThan(0.05);
    expect(cmp.verdict).toMatch(/exp-inlet shows patterned residuals/);
    expect(e.sdRatio!).toBeGreaterThan(2);
  });

  test('a model that cannot be fitted is listed last with its reason', () => {
    const c = compareModels({ x, y, covariates }, ['coil', 'a*exp(-b*x) + c*bogus(x)']);
    expect(c.ranking[1].ok).toBe(false);
    expect(c.ranking[1].reason).toMatch(/bogus/);
  });
});

describe('bootstrapDerived', () => {
  const fit = fitModel({ x, y, model: 'exp-inlet', covariates });
  if (!fit.ok) throw new Error('fit failed');
  const flowOfMaxHeat = (c: Parameters<Parameters<typeof bootstrapDerived>[1]>[0]) => {
    const h = heatOptimum(c);
    return h.interior ? h.flowM3PerS / LPM : null;
  };

  test('gives a seeded, reproducible percentile interval around the optimum flow', () => {
    const a = bootstrapDerived(fit, flowOfMaxHeat, { resamples: 200, seed: 7 });
    const b = bootstrapDerived(fit, flowOfMaxHeat, { resamples: 200, seed: 7 });
    expect(a).toEqual(b);
    expect(a.ok).toBe(true);
    if (!a.ok) return;
    expect(a.estimate).toBeCloseTo(14.08, 2);
    expect(a.ciLow).toBeLessThan(14.08);
    expect(a.ciHigh).toBeGreaterThan(14.08);
    expect(a.defined).toBe(200);
  });

  test('says so when the quantity is undefined in most resamples', () => {
    const r = bootstrapDerived(fit, () => null, { resamples: 20 });
    expect(r.ok).toBe(false);
    expect(() => bootstrapDerived(fit, () => 1, { resamples: 3 })).toThrow(RangeError);
  });
});

describe('start values for built-ins', () => {
  test('a partial start overrides only the given parameter; the rule supplies the rest', () => {
    const f = fitModel({ x, y, model: 'coil', covariates, start: { UA: 300 } });
    expect(f.ok).toBe(true);
    if (f.ok) expect(f.params.UA.value).toBeCloseTo(500, 6);
  });

  test('a start key that is not a parameter of the built-in is rejected', () => {
    expect(fitModel({ x, y, model: 'coil', covariates, start: { Q: 1 } })).toMatchObject({ ok: false, code: 'invalid-input' });
  });

  test('exp-inlet without Tin says which covariate is missing', () => {
    const r = fitModel({ x, y, model: 'exp-inlet' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/Tin/);
  });
});
