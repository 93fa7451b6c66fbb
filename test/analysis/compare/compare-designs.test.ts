import { describe, expect, test } from 'vitest';
import { compareDesigns, type DesignComparison, type DesignData } from '../../../analysis/compare/compare-designs';
import { heatVerdict } from '../../../analysis/compare/compare-verdict';
import { gumBudget } from '../../../analysis/trial/gum-budget';
import { coilPerformance } from '../../../analysis/performance/coil-ntu';
import { heatPerKelvinWPerK } from '../../../analysis/performance/performance-table';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../../../analysis/water/water-properties';
import { run } from '../../../analysis/cli/compare';
import { InputError } from '../../../analysis/units/reading-input';
import { normalStream } from '../../support/seeded-normals';

const LPM = 1 / 60000;
const TIN = 15;
const rho = waterDensityKgPerM3(TIN);
const cp = waterCpJPerKgK(TIN);
const FLOWS = [3, 4, 6, 8, 10, 12, 15, 18, 20, 3, 20];

/** Trials of a constant-source coil (DOMAIN.md §1.2) with seeded Gaussian noise on the outlet. */
function trials(Ts: number, UA: number, z: () => number, noiseK = 0.2): DesignData {
  const x = FLOWS.map((q) => q * LPM);
  return {
    x, y: x.map((f) => coilPerformance({ sourceTempC: Ts, inletTempC: TIN, uaWPerK: UA, massFlowKgPerS: rho * f, cpJPerKgK: cp }).outletTempC + noiseK * z()),
    covariates: { Tin: x.map(() => TIN), rho: x.map(() => rho), cp: x.map(() => cp) },
  };
}
const ok = (r: ReturnType<typeof compareDesigns>): DesignComparison => {
  if (!r.ok) throw new Error(r.reason);
  return r;
};
/** True heat of a coil at the comparison's rule q = ρ(Tin)·V̇·cp(Tm)·(Tout − Tin). */
const trueHeat = (Ts: number, UA: number, flow: number) => {
  const t = coilPerformance({ sourceTempC: Ts, inletTempC: TIN, uaWPerK: UA, massFlowKgPerS: rho * flow, cpJPerKgK: cp }).outletTempC;
  return heatPerKelvinWPerK(flow, TIN, t) * (t - TIN);
};

describe('delta method for a ratio of independent estimates', () => {
  test('textbook: Var(a/b) ≈ (a/b)²(Var a/a² + Var b/b²) (Casella & Berger, "Statistical Inference", 2nd ed., §5.5.4 — from memory): a = 10 ± 0.3, b = 4 ± 0.2 → 2.5 ± 0.14577', () => {
    const g = gumBudget(([a, b]) => a / b, [{ name: 'a', value: 10, u: 0.3 }, { name: 'b', value: 4, u: 0.2 }]);
    expect(g.value).toBe(2.5);
    expect(g.uc).toBeCloseTo(2.5 * Math.sqrt(0.03 ** 2 + 0.05 ** 2), 8);
    expect(g.uc).toBeCloseTo(0.14577, 5);
  });
  test('the comparison\'s UA ratio carries that variance, with Welch–Satterthwaite degrees of freedom ν = u⁴/Σ(cᵢuᵢ)⁴/νᵢ (GUM G.4)', () => {
    const z = normalStream(5);
    const r = ok(compareDesigns({ a: trials(90, 400, z), b: trials(92, 470, z), bootstrap: false }));
    const A = r.fits.a.params.UA, B = r.fits.b.params.UA;
    const ratio = B.value / A.value;
    const relA = A.stdErr / A.value, relB = B.stdErr / B.value;
    expect(r.uaRatio!.value).toBeCloseTo(ratio, 12);
    expect(r.uaRatio!.stdErr).toBeCloseTo(ratio * Math.hypot(relA, relB), 8);
    const nu = (ratio * Math.hypot(relA, relB)) ** 4 / ((ratio * relA) ** 4 / r.fits.a.df + (ratio * relB) ** 4 / r.fits.b.df);
    expect(r.uaRatio!.df!).toBeCloseTo(nu, 4);
    const Ts = r.tsDifferenceK!;
    expect(Ts.value).toBeCloseTo(r.fits.b.params.Ts.value - r.fits.a.params.Ts.value, 12);
    expect(Ts.stdErr).toBeCloseTo(Math.hypot(r.fits.a.params.Ts.stdErr, r.fits.b.params.Ts.stdErr), 8);
  });
});

describe('interval coverage by simulation (seeded; nominal 95 %, tolerance 3σ of a binomial proportion)', () => {
  test('UA ratio, Ts difference and the heat difference at 10 L/min cover the true values at close to 95 % (400 pairs of datasets)', () => {
    const z = normalStream(2024);
    const reps = 400;
    const truth = { ratio: 470 / 400, diff: 2, pct: 100 * (trueHeat(92, 470, 10 * LPM) / trueHeat(90, 400, 10 * LPM) - 1) };
    const hits = { ratio: 0, diff: 0, pct: 0 };
    for (let k = 0; k < reps; k++) {
      const r = ok(compareDesigns({ a: trials(90, 400, z), b: trials(92, 470, z), flowsM3PerS: [10 * LPM], bootstrap: false }));
      const u = r.uaRatio!, d = r.tsDifferenceK!, h = r.heatAt[0].differencePercent;
      if (u.ciLow <= truth.ratio && truth.ratio <= u.ciHigh) hits.ratio++;
      if (d.ciLow <= truth.diff && truth.diff <= d.ciHigh) hits.diff++;
      if (h.ciLow <= truth.pct && truth.pct <= h.ciHigh) hits.pct++;
    }
    const tol = 3 * Math.sqrt((0.95 * 0.05) / reps);
    for (const h of Object.values(hits)) expect(Math.abs(h / reps - 0.95)).toBeLessThan(tol);
  });
});

describe('the bootstrap check and the heat at common conditions', () => {
  const z = normalStream(7);
  const r = ok(compareDesigns({ a: trials(90, 400, z), b: trials(92, 470, z), flowsM3PerS: [5 * LPM, 10 * LPM, 15 * LPM], verdictFlowM3PerS: 10 * LPM, bootstrap: { resamples: 300, seed: 3 } }));
  test('the bootstrap percentile intervals agree with the delta-method ones within a fifth of their width', () => {
    const b = r.bootstrap!;
    for (const [boot, dm] of [[b.uaRatio!, r.uaRatio!], [b.tsDifferenceK!, r.tsDifferenceK!], [b.differencePercent, r.heatAt[1].differencePercent]] as const) {
      const w = dm.ciHigh - dm.ciLow;
      expect(Math.abs(boot.ciLow - dm.ciLow)).toBeLessThan(0.2 * w);
      expect(Math.abs(boot.ciHigh - dm.ciHigh)).toBeLessThan(0.2 * w);
    }
    expect(b.seed).toBe(3);
  });
  test('heat at each flow is the coil\'s q = ρ·V̇·cp·ΔT within its interval, and the verdict is in words', () => {
    for (const h of r.heatAt) {
      expect(h.a.ciLow).toBeLessThan(trueHeat(90, 400, h.flowM3PerS) + 200);
      expect(h.a.ciHigh).toBeGreaterThan(trueHeat(90, 400, h.flowM3PerS) - 200);
      expect(h.differencePercent.value).toBeCloseTo(100 * (h.b.heatW / h.a.heatW - 1), 10);
    }
    expect(r.verdict).toMatch(/^B delivers \d+–\d+ % more heat at 10 L\/min than A\.$/);
    expect(r.verdictFlowM3PerS).toBe(10 * LPM);
    expect(r.notes.join(' ')).toMatch(/UA of B is 1\.1\d\d times that of A/);
  });
});

describe('verdict wording', () => {
  test.each([
    [{ value: 16, ciLow: 14.2, ciHigh: 18.4 }, 'B delivers 14–19 % more heat at 10 L/min than A.'],
    [{ value: -4, ciLow: -5.47, ciHigh: -2.51 }, 'B delivers 2.5–5.5 % less heat at 10 L/min than A.'],
    [{ value: 1, ciLow: -2.04, ciHigh: 3.96 }, 'At 10 L/min there is no difference the data can show between the heat A and B deliver (B against A: −2.1 % to +4.0 %).'],
  ])('%j → %s (ends rounded outwards)', (d, words) => {
    expect(heatVerdict(['A', 'B'], d, 10 * LPM, 'L/min', false)).toBe(words);
  });
  test('the same trials for both designs: no difference the data can show, in heat, UA and Ts', () => {
    const d = trials(90, 400, normalStream(9));
    const r = ok(compareDesigns({ a: d, b: d, bootstrap: false }));
    expect(r.verdict).toMatch(/^At \d+(\.\d+)? L\/min there is no difference the data can show between the heat A and B deliver/);
    expect(r.uaRatio!.value).toBeCloseTo(1, 12);
    expect(r.notes.join(' ')).toMatch(/no difference in conductance UA between A and B/);
    expect(r.notes.join(' ')).toMatch(/no difference in source temperature/);
  });
});

describe('designs fitted with different models, and fits that cannot be done', () => {
  test('a coil against an exponential fit is compared on delivered heat only', () => {
    const z = normalStream(4);
    const r = ok(compareDesigns({ a: trials(90, 400, z), b: { ...trials(92, 470, z), model: 'exp-inlet' }, bootstrap: { resamples: 100 } }));
    expect(r.models).toEqual(['coil', 'exp-inlet']);
    expect(r.uaRatio).toBeNull();
    expect(r.tsDifferenceK).toBeNull();
    expect(r.bootstrap!.uaRatio).toBeNull();
    expect(r.notes.join(' ')).toMatch(/different models \(coil, exp-inlet\)/);
    expect(r.verdict).toMatch(/heat/);
  });
  test('a dataset that cannot be fitted → ok: false naming the design', () => {
    const z = normalStream(4);
    const bad = { x: [1e-4, 1e-4, 1e-4], y: [40, 41, 42], covariates: { Tin: [15, 15, 15] } };
    expect(compareDesigns({ a: trials(90, 400, z), b: bad, labels: ['old coil', 'new coil'] })).toMatchObject({ ok: false, reason: expect.stringMatching(/^new coil: /) });
  });
  test.each([
    [{ a: 5 }, /a must be an object/],
    [{ flowsM3PerS: [0] }, /flowsM3PerS\[0\]/],
    [{ flowsM3PerS: Array(51).fill(1e-4) }, /flowsM3PerS must list/],
    [{ bootstrap: { resamples: 1e6 } }, /bootstrap.resamples/],
    [{ level: 2 }, /level/],
  ])('malformed input %# throws naming the field', (patch, msg) => {
    const z = normalStream(4);
    expect(() => compareDesigns({ a: trials(90, 400, z), b: trials(92, 470, z), ...(patch as object) })).toThrow(msg);
  });
});

describe('compare command', () => {
  const z = normalStream(12);
  const a = trials(90, 400, z), b = trials(92, 470, z);
  const input = { model: 'coil', a: { x: a.x, y: a.y, covariates: { Tin: a.covariates.Tin } }, b: { x: b.x, y: b.y, covariates: { Tin: b.covariates.Tin } }, bootstrap: { resamples: 50 } };
  test('prints the contract fields', () => {
    const r = run(input) as Record<string, any>;
    expect(r.ok).toBe(true);
    for (const k of ['UA_ratio', 'Ts_difference_K']) for (const f of ['value', 'ciLow', 'ciHigh']) expect(typeof r[k][f]).toBe('number');
    expect(r.heatAt.length).toBeGreaterThan(0);
    expect(typeof r.verdict).toBe('string');
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
  });
  test.each([
    [{ ...input, a: { ...input.a, x: [1, 'x'] } }, /a.x\[1\]/],
    [{ ...input, b: { ...input.b, y: [1] } }, /b.y has 1 values/],
    [{ ...input, flows: ['10 kg'] }, /flows\[0\]/],
    [{ ...input, labels: ['only one'] }, /labels/],
    [{ ...input, flowUnit: 'kg' }, /flowUnit/],
  ])('malformed input %# is an InputError', (bad, msg) => {
    expect(() => run(bad)).toThrow(InputError);
    expect(() => run(bad)).toThrow(msg);
  });
});
