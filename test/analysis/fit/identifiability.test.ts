import { describe, expect, test } from 'vitest';
import { fitModel, type FitInput, type FitSuccess } from '../../../analysis/fit';
import { run as runFitCli } from '../../../analysis/cli/fit';
import { readReference, referenceAvailable } from '../../support/reference';

const LPM = 1 / 60000;
const flows = [2, 4, 6, 8, 10, 12, 14, 16, 18, 20].map((l) => l * LPM);
const tin = flows.map(() => 20);
// a fixed, small scatter (K) so the tests do not depend on a generator
const scatter = [0.012, -0.018, 0.006, 0.015, -0.009, -0.004, 0.017, -0.013, 0.002, -0.008];
const unidentified = (fit: FitSuccess) => fit.warnings.filter((w) => w.code === 'not-identifiable').map((w) => w.parameter);
const ok = (r: ReturnType<typeof fitModel>): FitSuccess => {
  if (!r.ok) throw new Error(r.reason);
  return r;
};

// Closed form (DOMAIN.md §1.2): Tout = Ts − (Ts − Tin)·exp(−UA/(ṁ·cp)). When the outlet does not
// change with flow the coil is saturated, exp(−NTU) ≈ 0 at every tested flow, and every UA above
// some value fits equally well: the data bound UA from below only.
describe('flat outlet data cannot determine UA of the coil (closed form, DOMAIN.md §1.2)', () => {
  test.each([
    ['exactly flat', flows.map(() => 45)],
    ['flat with 0.02 K of scatter', flows.map((_, i) => 45 + scatter[i])],
  ])('%s: the fit warns "not identifiable: UA", not a confident UA', (_label, y) => {
    const fit = ok(fitModel({ x: flows, y, model: 'coil', covariates: { Tin: tin } }));
    expect(unidentified(fit)).toEqual(['UA']);
    const w = fit.warnings.find((x) => x.code === 'not-identifiable')!;
    expect(w.message).toMatch(/^not identifiable: UA/);
    // Ts is the flat level, and it is determined
    expect(fit.params.Ts.value).toBeCloseTo(45, 1);
  });
  test('the command line prints the parameter as not identifiable, with no standard error or interval', () => {
    const out = runFitCli({ x: flows, y: flows.map(() => 45), model: 'coil', covariates: { Tin: tin } }) as { params: Record<string, Record<string, unknown>>; warnings: string[] };
    expect(out.params.UA).toMatchObject({ identifiable: false, stdErr: null, ciLow: null, ciHigh: null });
    expect(out.params.Ts).toMatchObject({ identifiable: true });
    expect(typeof out.params.Ts.stdErr).toBe('number');
    expect(out.warnings.some((m) => m.startsWith('not identifiable: UA'))).toBe(true);
  });
});

// Tout = Tinf + A·exp(−k·Q) on data without a trend: A = 0 explains them for any k, and k → ∞
// explains them for any A (common practice: a term the data do not show is not determined).
describe('flat data cannot determine A and k of the exponential approach (common practice)', () => {
  // with scatter the solver does not converge on such data (k runs off), which the fit reports as no-convergence
  test.each([
    ['exactly flat at 30 °C', flows.map(() => 30)],
    ['exactly flat at 52.5 °C', flows.map(() => 52.5)],
  ])('%s', (_label, y) => {
    const fit = ok(fitModel({ x: flows, y, model: 'exp-approach' }));
    expect(unidentified(fit)).toEqual(expect.arrayContaining(['k']));
    expect(unidentified(fit)).not.toContain('Tinf');
  });
});

describe('well-posed fits do not warn', () => {
  // DOMAIN.md §1.3: exact NTU data, Ts 90 °C, Tin 20 °C, UA 500 W/K, 13 flows from 2 to 20 L/min
  const x13 = Array.from({ length: 13 }, (_, i) => (2 + 1.5 * i) * LPM);
  const exact = x13.map((q) => 90 - 70 * Math.exp(-500 / (1000 * q * 4186)));
  const cov = { Tin: x13.map(() => 20), rho: x13.map(() => 1000), cp: x13.map(() => 4186) };
  test.each(['coil', 'exp-inlet', 'exp-approach'])('the DOMAIN.md §1.3 synthetic trials, %s model (computed)', (model) => {
    const fit = ok(fitModel({ x: x13, y: exact, model, covariates: cov }));
    expect(unidentified(fit)).toEqual([]);
    if (model === 'coil') expect(fit.params.UA.value).toBeCloseTo(500, 6);
  });
  test('the same trials with scatter', () => {
    const y = exact.map((v, i) => v + 10 * scatter[i % scatter.length]);
    expect(unidentified(ok(fitModel({ x: x13, y, model: 'coil', covariates: cov })))).toEqual([]);
  });

  interface Dataset { exprJs: string; params: string[]; start1: number[]; start2: number[]; x: number[] | number[][]; y: number[]; predictors?: string[]; responseTransform?: string }
  const index: { name: string; kind: string; file: string }[] = referenceAvailable ? readReference('nist-strd/index.json') : [];
  const cases = index.filter((e) => e.kind === 'nonlinear-least-squares').flatMap((e) => (['start1', 'start2'] as const).map((s) => [e.name, s, e.file] as const));
  test.skipIf(!referenceAvailable).each(cases)('NIST StRD %s from %s: every certified parameter is determined by its data, none is flagged', (_name, startKey, file) => {
    const d = readReference<Dataset>(`nist-strd/${file}`);
    let model = d.exprJs.replace(/Math\.PI/g, 'pi').replace(/Math\./g, '');
    let x = d.x as number[];
    const covariates: Record<string, number[]> = {};
    if (d.predictors) {
      model = model.replace(/\bx1\b/g, 'x');
      x = (d.x as number[][]).map((r) => r[0]);
      covariates.x2 = (d.x as number[][]).map((r) => r[1]);
    }
    const input: FitInput = { x, y: d.responseTransform === 'log' ? d.y.map(Math.log) : d.y, model, covariates, start: Object.fromEntries(d.params.map((k, j) => [k, d[startKey][j]])) };
    expect(unidentified(ok(fitModel(input)))).toEqual([]);
  });
});
