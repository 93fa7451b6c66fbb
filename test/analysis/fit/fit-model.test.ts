import { describe, expect, test } from 'vitest';
import { fitModel, groupReplicates, lackOfFit, predictAt, runsTest, type FitSuccess } from '../../../analysis/fit';
import { fSf, studentTQuantile } from '../../../analysis/stats/distributions';

const mustFit = (r: ReturnType<typeof fitModel>): FitSuccess => {
  if (!r.ok) throw new Error(r.reason);
  return r;
};

/** Every number anywhere in a value is finite (no NaN or Infinity can reach JSON). */
function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(allFinite);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

// A straight line with known scatter (made up for these tests).
const lx = [1, 2, 3, 4, 5, 6, 7, 8];
const ly = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2, 13.8, 16.1];

describe('bad input never crashes, hangs or returns NaN', () => {
  test.each([
    ['a NaN cell', { x: [1, 2, Number.NaN], y: [1, 2, 3] }, /x\[2\]/],
    ['an infinite cell', { x: [1, 2, 3], y: [1, Infinity, 3] }, /y\[1\]/],
    ['a non-numeric cell', { x: [1, 2, '3'], y: [1, 2, 3] }, /x\[2\].*"3"/],
    ['a null cell', { x: [1, 2, 3], y: [1, null, 3] }, /y\[1\]/],
    ['mismatched lengths', { x: [1, 2, 3], y: [1, 2] }, /2 values but x has 3/],
    ['x not an array', { x: 'abc', y: [1] }, /x must be an array/],
  ])('%s gives ok:false invalid-input naming the cell', (_name, data, reason) => {
    const r = fitModel({ ...(data as { x: number[]; y: number[] }), model: 'poly1' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.code).toBe('invalid-input');
    expect(r.reason).toMatch(reason);
  });

  test('fewer points than parameters gives too-few-points', () => {
    const r = fitModel({ x: [1, 2, 3], y: [1, 2, 3], model: 'poly3' });
    expect(r).toMatchObject({ ok: false, code: 'too-few-points' });
  });

  test('all x equal gives degenerate-x', () => {
    const r = fitModel({ x: [2, 2, 2, 2], y: [1, 2, 3, 4], model: 'poly1' });
    expect(r).toMatchObject({ ok: false, code: 'degenerate-x' });
  });

  test('an unknown symbol is named with its position', () => {
    const r = fitModel({ x: lx, y: ly, model: 'b1*x + offset', start: { b1: 1 } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/unknown symbol "offset" at position 8/);
  });

  test('a syntax error is reported with its character position', () => {
    const r = fitModel({ x: lx, y: ly, model: 'b1*(x + 2', start: { b1: 1 } });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('invalid-expression');
      expect(r.reason).toMatch(/char 10/);
    }
  });

  test('an unknown function is named with its position', () => {
    const r = fitModel({ x: lx, y: ly, model: 'a*frobnicate(x)' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/unknown function "frobnicate" at position 3/);
  });

  test('a model that overflows at the start gives bad-start', () => {
    const r = fitModel({ x: [100, 200, 300, 400], y: [1, 2, 3, 4], model: 'exp(a*x)', start: { a: 10 } });
    expect(r).toMatchObject({ ok: false, code: 'bad-start' });
  });

  test('parameters that cannot be separated give singular, naming one of them', () => {
    const r = fitModel({ x: lx, y: ly, model: 'a*b*x', start: { a: 1, b: 1 } });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('singular');
      expect(r.reason).toMatch(/cannot be separated/);
    }
  });

  test('non-positive weights and bad bounds are rejected', () => {
    expect(fitModel({ x: lx, y: ly, model: 'poly1', weights: lx.map(() => 0) })).toMatchObject({ ok: false, code: 'invalid-input' });
    expect(fitModel({ x: lx, y: ly, model: 'poly1', bounds: { b1: [3, 1] } })).toMatchObject({ ok: false, code: 'invalid-input' });
    expect(fitModel({ x: lx, y: ly, model: 'poly1', bounds: { zz: [0, 1] } })).toMatchObject({ ok: false, code: 'invalid-input' });
  });

  test('values beyond what double precision can square give out-of-range, not NaN', () => {
    expect(fitModel({ x: [1, 2, 3, 4, 5], y: [1e300, -1e300, 1e300, 2, 3], model: 'poly1' })).toMatchObject({ ok: false, code: 'out-of-range' });
    expect(fitModel({ x: [1e-300, 2e-300, 3e-300], y: [1, 2, 3], model: 'poly1' })).toMatchObject({ ok: false, code: 'out-of-range' });
  });

  test('a division by zero at the start gives bad-start', () => {
    expect(fitModel({ x: [1, 2, 3, 4, 5], y: [1, 2, 3, 4, 5], model: 'a/(b - x)', start: { a: 1, b: 3 } })).toMatchObject({ ok: false, code: 'bad-start' });
  });

  test('the power law and the coil refuse x ≤ 0 and say why', () => {
    const r = fitModel({ x: [-1, 2, 3, 4], y: [1, 2, 3, 4], model: 'power' });
    expect(r).toMatchObject({ ok: false, code: 'invalid-input' });
    if (!r.ok) expect(r.reason).toMatch(/x\[0\] = -1.*x > 0/);
    expect(fitModel({ x: [0, 1e-4, 2e-4], y: [50, 40, 30], model: 'coil', covariates: { Tin: [20, 20, 20] } })).toMatchObject({ ok: false, code: 'invalid-input' });
  });

  // The work budget bounds iterations, not seconds; the timeout only guards against a hang on a loaded machine.
  test('an automatic multi-start on 5,000 points ends (work budget) with a usable fit', { timeout: 90_000 }, () => {
    const bx = Array.from({ length: 5000 }, (_, i) => i / 250);
    const by = bx.map((v) => 2 * Math.sin(1.3 * v + 0.4) + 1);
    const r = fitModel({ x: bx, y: by, model: 'a*sin(b*x+c)+d' });
    expect(r.ok).toBe(true);
    if (r.ok) expect(allFinite(r)).toBe(true);
  });

  test('a successful fit holds no NaN or Infinity anywhere and survives JSON', () => {
    const fit = mustFit(fitModel({ x: lx, y: ly, model: 'poly2' }));
    expect(allFinite(fit)).toBe(true);
    expect(JSON.parse(JSON.stringify(fit)).rss).toBe(fit.rss);
  });
});

describe('fit statistics and diagnostics (textbook formulas for a straight line)', () => {
  const fit = mustFit(fitModel({ x: lx, y: ly, model: 'poly1' }));
  const n = lx.length;
  const xm = lx.reduce((a, b) => a + b) / n;
  const sxx = lx.reduce((a, v) => a + (v - xm) ** 2, 0);

  test('leverage is 1/n + (x − x̄)²/Sxx (from memory; any regression text)', () => {
    lx.forEach((v, i) => expect(fit.leverage[i]).toBeCloseTo(1 / n + (v - xm) ** 2 / sxx, 13));
    expect(fit.leverage.reduce((a, b) => a + b)).toBeCloseTo(2, 12);
  });

  test("standardized, studentized residuals and Cook's distance follow their definitions", () => {
    const s = fit.residualSD;
    fit.residuals.forEach((e, i) => {
      const h = fit.leverage[i];
      const r = e / (s * Math.sqrt(1 - h));
      expect(fit.standardizedResiduals[i]).toBeCloseTo(r, 12);
      expect(fit.cooksDistance[i]).toBeCloseTo((r * r * h) / (2 * (1 - h)), 12);
      // externally studentized: refit without point i (Belsley, Kuh & Welsch 1980, eq. 2.2)
      const drop = mustFit(fitModel({ x: lx.filter((_, k) => k !== i), y: ly.filter((_, k) => k !== i), model: 'poly1' }));
      expect(fit.studentizedResiduals[i]).toBeCloseTo(e / (drop.residualSD * Math.sqrt(1 - h)), 10);
    });
  });

  test('R², RMSE and information criteria match their formulas', () => {
    const ym = ly.reduce((a, b) => a + b) / n;
    const sst = ly.reduce((a, v) => a + (v - ym) ** 2, 0);
    expect(fit.r2).toBeCloseTo(1 - fit.rss / sst, 13);
    expect(fit.rmse).toBeCloseTo(Math.sqrt(fit.rss / n), 14);
    const m2ll = n * (Math.log((2 * Math.PI * fit.rss) / n) + 1);
    expect(fit.aic).toBeCloseTo(m2ll + 6, 12);
    expect(fit.aicc).toBeCloseTo(m2ll + 6 + (2 * 3 * 4) / (n - 4), 12);
    expect(fit.bic).toBeCloseTo(m2ll + 3 * Math.log(n), 12);
  });

  test('confidence and prediction intervals at a data point are t·s·√h and t·s·√(1 + h)', () => {
    const t = studentTQuantile(0.975, n - 2);
    const [p] = predictAt(fit, [lx[2]]);
    const h = fit.leverage[2];
    expect(p.ciHigh - p.y).toBeCloseTo(t * fit.residualSD * Math.sqrt(h), 12);
    expect(p.piHigh - p.y).toBeCloseTo(t * fit.residualSD * Math.sqrt(1 + h), 12);
    expect(fit.band.length).toBe(41);
    expect(fit.band.every((b) => !b.extrapolated)).toBe(true);
  });

  test('predictions outside the data are flagged as extrapolated and the band warns', () => {
    expect(predictAt(fit, [0, 4, 9]).map((p) => p.extrapolated)).toEqual([true, false, true]);
    const wide = mustFit(fitModel({ x: lx, y: ly, model: 'poly1', grid: { from: 0, to: 12, points: 13 } }));
    expect(wide.warnings.some((w) => w.code === 'extrapolation')).toBe(true);
    expect(() => predictAt(fit, [Number.NaN])).toThrow(RangeError);
  });

  test('an outlier is flagged by its studentized residual and its influence', () => {
    const y2 = ly.slice();
    y2[5] += 6;
    const f = mustFit(fitModel({ x: lx, y: y2, model: 'poly1' }));
    expect(f.flags.outliers).toContain(5);
    expect(f.flags.influential).toContain(5);
  });

  test('scaling all weights by a constant changes neither estimates nor standard errors', () => {
    const w1 = mustFit(fitModel({ x: lx, y: ly, model: 'poly1', weights: lx.map((v) => 1 / v) }));
    const w2 = mustFit(fitModel({ x: lx, y: ly, model: 'poly1', weights: lx.map((v) => 100 / v) }));
    for (const k of ['b0', 'b1']) {
      expect(w2.params[k].value).toBeCloseTo(w1.params[k].value, 12);
      expect(w2.params[k].stdErr).toBeCloseTo(w1.params[k].stdErr, 12);
    }
  });

  test('strongly correlated parameters are warned about', () => {
    const f = mustFit(fitModel({ x: [10, 10.5, 11, 11.5, 12], y: [1, 2.1, 2.9, 4.2, 5], model: 'poly1' }));
    expect(f.warnings.some((w) => w.code === 'high-correlation')).toBe(true);
  });
});

describe('nonlinear expressions, start values and bounds', () => {
  const ex = [0.5, 1, 1.5, 2, 3, 4, 5, 6];
  const ey = ex.map((v, i) => 3 * Math.exp(-0.7 * v) + [0.01, -0.02, 0.015, -0.01, 0.005, -0.012, 0.008, -0.004][i]);

  test('an expression without start values is fitted from an automatic multi-start, with a warning', () => {
    const f = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)' }));
    expect(f.params.a.value).toBeCloseTo(3, 1);
    expect(f.params.k.value).toBeCloseTo(0.7, 1);
    expect(f.warnings.some((w) => w.code === 'auto-start')).toBe(true);
  });

  test('the same expression from start values gives the same answer and an analytic Jacobian', () => {
    const a = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)' }));
    const b = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)', start: { a: 1, k: 1 } }));
    expect(b.params.a.value).toBeCloseTo(a.params.a.value, 10);
    expect(b.jacobian).toBe('analytic');
    expect(b.converged).toBe(true);
    expect(b.iterations).toBeGreaterThan(0);
  });

  test('a bound that binds puts the parameter on it with a warning', () => {
    const f = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)', start: { a: 1, k: 0.5 }, bounds: { k: [0, 0.5] } }));
    expect(f.params.k.value).toBeCloseTo(0.5, 6);
    expect(f.params.k.atBound).toBe('upper');
    expect(f.warnings.some((w) => w.code === 'at-bound')).toBe(true);
  });

  test('a bound that does not bind leaves the estimate alone', () => {
    const free = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)', start: { a: 1, k: 1 } }));
    const bounded = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-k*x)', start: { a: 1, k: 1 }, bounds: { k: [0, null] } }));
    expect(bounded.params.k.value).toBeCloseTo(free.params.k.value, 8);
    expect(bounded.params.k.atBound).toBe(null);
  });

  test('a function without a symbolic derivative falls back to central differences', () => {
    const f = mustFit(fitModel({ x: ex, y: ey, model: 'a*exp(-abs(k)*x)', start: { a: 1, k: 1 } }));
    expect(f.params.a.value).toBeCloseTo(3, 1);
  });

  test('power and cubic built-ins start themselves', () => {
    const px = [1, 2, 3, 4, 5, 6];
    const p = mustFit(fitModel({ x: px, y: px.map((v) => 2 * v ** 1.5 * (1 + 0.001 * Math.sin(v))), model: 'power' }));
    expect(p.params.b.value).toBeCloseTo(1.5, 2);
    const c = mustFit(fitModel({ x: px, y: px.map((v) => 1 - v + 0.5 * v ** 3 + 0.01 * Math.cos(v)), model: 'poly3' }));
    expect(c.method).toBe('linear-qr');
    expect(c.params.b3.value).toBeCloseTo(0.5, 2);
  });
});

describe('replicates and the pure-error lack-of-fit test (NIST/SEMATECH e-Handbook §4.4.4.3 method)', () => {
  // made-up trials: three replicates at each of five flows, curved response
  const rx = [1, 1, 1.01, 2, 2, 1.99, 3, 3.02, 3, 4, 4, 4, 5, 5, 5.03];
  const noise = [0.05, -0.04, 0.01, -0.03, 0.04, 0.0, 0.02, -0.05, 0.03, -0.01, 0.03, -0.02, 0.04, -0.03, 0.0];
  const curved = rx.map((v, i) => 10 + 3 * v - 0.8 * v * v + noise[i]);

  test('groups x values within the tolerance', () => {
    const g = groupReplicates(rx, curved);
    expect(g.map((x) => x.n)).toEqual([3, 3, 3, 3, 3]);
    expect(groupReplicates(rx, curved, { relative: 0 }).length).toBe(9);
  });

  test('a straight line through curved data shows significant lack of fit; the right degree does not', () => {
    const line = mustFit(fitModel({ x: rx, y: curved, model: 'poly1' }));
    const quad = mustFit(fitModel({ x: rx, y: curved, model: 'poly2' }));
    expect(line.lackOfFit?.ok && line.lackOfFit.pValue).toBeLessThan(0.001);
    expect(quad.lackOfFit?.ok && quad.lackOfFit.pValue).toBeGreaterThan(0.05);
  });

  test('pure error and lack of fit add up to the residual sum of squares, F from the F distribution', () => {
    const line = mustFit(fitModel({ x: rx, y: curved, model: 'poly1' }));
    const lof = line.lackOfFit;
    if (!lof || !lof.ok) throw new Error('no test');
    expect(lof.pureErrorSS + lof.lackOfFitSS).toBeCloseTo(line.rss, 12);
    expect(lof.pureErrorDf + lof.lackOfFitDf).toBe(line.df);
    expect(lof.pValue).toBeCloseTo(fSf(lof.F, lof.lackOfFitDf, lof.pureErrorDf), 14);
  });

  test('without replicates there is no test, and exact replicates say why', () => {
    expect(mustFit(fitModel({ x: lx, y: ly, model: 'poly1' })).lackOfFit).toBe(null);
    const r = lackOfFit([1, 1, 2, 3], null, 0.5, groupReplicates([1, 1, 2, 3], [1, 1, 2, 3]), 2);
    expect(r.ok).toBe(false);
  });
});

describe('runsTest (NIST/SEMATECH e-Handbook §1.3.5.13)', () => {
  test('counts runs and gives the exact probability of so few', () => {
    const r = runsTest([1, 2, 3, 4, 5, 6], [1, 1, 1, -1, -1, -1])!;
    expect(r.runs).toBe(2);
    // exact: 2 of the C(6,3) = 20 arrangements have 2 runs (from the combinatorics)
    expect(r.pValue).toBeCloseTo(2 / 20, 14);
  });

  test('alternating signs have the most runs and a p-value of 1', () => {
    const r = runsTest([1, 2, 3, 4, 5, 6], [1, -1, 1, -1, 1, -1])!;
    expect(r.runs).toBe(6);
    expect(r.pValue).toBeCloseTo(1, 14);
  });

  test('needs at least two residuals of each sign', () => {
    expect(runsTest([1, 2, 3], [1, 1, -1])).toBe(null);
  });
});

describe('model names', () => {
  test('a misspelt built-in is not silently fitted as a constant', () => {
    const r = fitModel({ x: lx, y: ly, model: 'coli' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/neither a built-in .*coil.* nor an expression in x/);
  });

  test('DFFITS follows its definition t·√(h/(1 − h))', () => {
    const f = mustFit(fitModel({ x: lx, y: ly, model: 'poly1' }));
    f.dffits.forEach((d, i) => expect(d).toBeCloseTo((f.studentizedResiduals[i] as number) * Math.sqrt(f.leverage[i] / (1 - f.leverage[i])), 12));
  });
});
