import { describe, expect, test } from 'vitest';
import { compileModel, levenbergMarquardt, linearLeastSquares, polynomialDesign } from '../../../analysis/fit';
import { ddAddTo, ddDivTo, ddExp, ddExpTo, ddLog, ddMulTo, ddPow, ddSqrt, twoProduct } from '../../../analysis/fit/double-double';
import { powerOfTwoScale } from '../../../analysis/fit/euclidean-norm';
import { applyQ, householderQr } from '../../../analysis/fit/householder-qr';
import { mulberry32 } from '../../../analysis/fit/random';
import { singularValues } from '../../../analysis/fit/singular-values';
import { compensatedSum } from '../../../analysis/stats/compensated-sum';

describe('levenbergMarquardt', () => {
  test('minimises the Rosenbrock function written as residuals (10(x2 − x1²), 1 − x1) from (−1.2, 1) (Moré, Garbow & Hillstrom 1981, problem 1)', () => {
    const res = levenbergMarquardt({
      m: 2, n: 2,
      residuals: (p, out) => { out[0] = 10 * (p[1] - p[0] * p[0]); out[1] = 1 - p[0]; },
      jacobian: (p, _r, out) => { out[0] = -20 * p[0]; out[1] = -1; out[2] = 10; out[3] = 0; },
    }, [-1.2, 1]);
    expect(res.converged).toBe(true);
    expect(res.p[0]).toBeCloseTo(1, 12);
    expect(res.p[1]).toBeCloseTo(1, 12);
    expect(res.rss).toBeLessThan(1e-28);
  });

  test('reports a start where the residuals are not finite (info 0) instead of throwing', () => {
    const res = levenbergMarquardt({ m: 1, n: 1, residuals: (_p, out) => { out[0] = Number.NaN; }, jacobian: () => {} }, [1]);
    expect(res.info).toBe(0);
    expect(res.converged).toBe(false);
  });
});

describe('linear least squares', () => {
  test('solves an exact line and returns residuals at rounding level', () => {
    const r = linearLeastSquares([[1, 1, 1], [0, 1, 2]], [1, 3, 5]);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.coefficients[0]).toBeCloseTo(1, 15);
      expect(r.coefficients[1]).toBeCloseTo(2, 15);
      expect(r.rss).toBeLessThan(1e-30);
    }
  });

  test('refuses linearly dependent columns with a reason', () => {
    const r = linearLeastSquares([[1, 1, 1], [2, 2, 2]], [1, 2, 3]);
    expect(r.ok).toBe(false);
  });

  test('polynomial powers carry their low-order parts (hi + lo = exact power; 3^40 computed exactly)', () => {
    const { columns, columnsLo } = polynomialDesign([3], 40);
    expect(BigInt(columns[40][0]) + BigInt(columnsLo[40][0])).toBe(3n ** 40n);
  });
});

describe('building blocks', () => {
  test('Householder QR reproduces column norms and |R| diagonal in decreasing order with pivoting', () => {
    const qr = householderQr(Float64Array.of(1, 0, 0, 0, 3, 4), 3, 2);
    expect(Math.abs(qr.rdiag[0])).toBeCloseTo(5, 14);
    expect(qr.ipvt[0]).toBe(1);
  });

  test.each([[9, 7], [30, 6], [12, 3], [40, 8]])('Householder QR of a random %i×%i matrix reproduces it: A·P = Q·R (definition of the factorization)', (m, n) => {
    const rand = mulberry32(m * 100 + n);
    const a0 = Float64Array.from({ length: m * n }, () => rand() - 0.5);
    const qr = householderQr(Float64Array.from(a0), m, n, true);
    for (let j = 0; j < n; j++) {
      const col = new Float64Array(m);
      for (let i = 0; i < j; i++) col[i] = qr.a[i + j * m];
      col[j] = qr.rdiag[j];
      applyQ(qr, col);
      const original = qr.ipvt[j];
      for (let i = 0; i < m; i++) expect(Math.abs(col[i] - a0[i + original * m])).toBeLessThan(1e-14);
    }
    for (let j = 1; j < n; j++) expect(Math.abs(qr.rdiag[j])).toBeLessThanOrEqual(Math.abs(qr.rdiag[j - 1]));
  });

  test('Jacobi singular values of a diagonal and a rank-one matrix', () => {
    expect(singularValues(Float64Array.of(3, 0, 0, 4), 2, 2)).toEqual([4, 3]);
    const sv = singularValues(Float64Array.of(1, 2, 2, 4), 2, 2);
    expect(sv[0]).toBeCloseTo(5, 14);
    expect(sv[1]).toBeLessThan(1e-15);
  });

  test('compensated summation keeps what naive summation loses', () => {
    expect(compensatedSum([1e16, 1, -1e16])).toBe(1);
    expect(compensatedSum(Array(10).fill(0.1))).toBe(1);
  });

  test('compileModel derives analytic gradients that match central differences', () => {
    const c = compileModel('b1*exp(-pow(x-b2,2)/pow(b3,2)) + atan(b2/x)/pi', {});
    expect(c.ok).toBe(true);
    if (!c.ok) return;
    const p = [2, 1.5, 0.7];
    const x = [0.3, 1.1, 2.5];
    const g = new Float64Array(9);
    c.model.gradient(p, x, [], g);
    const f1 = new Float64Array(3);
    const f2 = new Float64Array(3);
    for (let j = 0; j < 3; j++) {
      const h = 1e-6;
      const up = p.slice(); up[j] += h;
      const dn = p.slice(); dn[j] -= h;
      c.model.values(up, x, [], f1);
      c.model.values(dn, x, [], f2);
      for (let i = 0; i < 3; i++) expect(g[i + j * 3]).toBeCloseTo((f1[i] - f2[i]) / (2 * h), 7);
    }
  });

  test('compileModel rejects assignments and matrices with a reason', () => {
    expect(compileModel('a = 3*x').ok).toBe(false);
    expect(compileModel('[a, x]').ok).toBe(false);
    expect(compileModel('').ok).toBe(false);
  });
});

describe('power-of-two column scaling', () => {
  // Definition (common practice in MINPACK-style codes): the scale is 2^−round(log2 ‖v‖₂) with ‖v‖₂ the
  // running Math.hypot over the entries; the quick sum-of-squares path must give exactly that scale.
  const byDefinition = (v: number[]): number => {
    let norm = 0;
    for (const e of v) norm = Math.hypot(norm, e);
    if (norm === 0) return 0;
    if (!Number.isFinite(norm)) return Number.NaN;
    return 2 ** -Math.round(Math.log2(norm));
  };

  test('(3, 4) has norm 5, so the scale is 1/4 (closed form)', () => {
    expect(powerOfTwoScale(Float64Array.of(3, 4), 0, 2)).toBe(0.25);
    expect(powerOfTwoScale(Float64Array.of(9, 3, 4, 9), 1, 2)).toBe(0.25);
  });

  test('agrees with the running-hypot definition on random columns of every magnitude, near rounding ties too', () => {
    const rand = mulberry32(99);
    for (let t = 0; t < 3000; t++) {
      const m = 1 + Math.floor(rand() * 300);
      const magnitude = 10 ** (640 * rand() - 320);
      let v = Array.from({ length: m }, () => (rand() - 0.5) * magnitude);
      if (t % 3 === 0) {
        // scale the column so that log2 of its norm sits within 1e-9..1e-5 of a tie (k + 1/2)
        const k = Math.round(40 * rand() - 20);
        let norm = 0;
        for (const e of v) norm = Math.hypot(norm, e);
        const target = 2 ** (k + 0.5 + (rand() < 0.5 ? -1 : 1) * 10 ** (-9 + 4 * rand()));
        v = v.map((e) => (e / norm) * target);
      }
      expect(powerOfTwoScale(Float64Array.from(v), 0, m), `column ${t}`).toBe(byDefinition(v));
    }
  });

  test('gives 0 for an all-zero column and NaN for a non-finite entry', () => {
    expect(powerOfTwoScale(new Float64Array(5), 0, 5)).toBe(0);
    expect(powerOfTwoScale(Float64Array.of(1, Number.NaN), 0, 2)).toBeNaN();
    expect(powerOfTwoScale(Float64Array.of(1, Infinity), 0, 2)).toBeNaN();
    expect(powerOfTwoScale(Float64Array.of(1e-320, 0), 0, 2)).toBe(byDefinition([1e-320, 0]));
  });
});

describe('compileModel without generated code', () => {
  // Generated code shares subexpressions and writes squares as products; the closure evaluator works
  // node by node with Math.pow. Both must agree bit for bit (Math.pow(a, 2) = a·a in fdlibm's pow).
  test.each([
    ['b1*exp(-b2*x)+b3*exp(-pow(x-b4,2)/pow(b5,2))', [90, 0.01, 100, 110, 25], [1, 50, 113.5, 240]],
    ['(b1+b2*x+b3*x^2)/(1+b4*x+b5*x^2)', [1.6, -0.1, 0.002, -0.0015, 0.00002], [9.65, 45.4, 76.2, 78.8]],
    ['b1 - b2*x - atan(b3/(x-b4))/pi + square(x/b2)', [0.2, -6e-6, 1200, -181], [-4868.68, -1515.12, 899.3]],
  ])('%s: values and gradient bit-identical', (expr, p, x) => {
    const a = compileModel(expr, {});
    const b = compileModel(expr, { generatedCode: false });
    if (!a.ok || !b.ok) throw new Error('compile failed');
    const n = p.length;
    const va = new Float64Array(x.length);
    const vb = new Float64Array(x.length);
    a.model.values(p, x, [], va);
    b.model.values(p, x, [], vb);
    expect(Array.from(va)).toEqual(Array.from(vb));
    const ga = new Float64Array(x.length * n);
    const gb = new Float64Array(x.length * n);
    a.model.gradient(p, x, [], ga);
    b.model.gradient(p, x, [], gb);
    expect(Array.from(ga)).toEqual(Array.from(gb));
  });

  test('the closure evaluator gives the same values and gradients as the generated code', () => {
    const expr = 'Ts - (Ts - Tin) * exp(-UA / (rho * x * cp)) + square(x) * sec(UA/1000) + log(x, 10)';
    const opts = { parameters: ['Ts', 'UA'], covariates: ['Tin', 'rho', 'cp'] };
    const a = compileModel(expr, opts);
    const b = compileModel(expr, { ...opts, generatedCode: false });
    if (!a.ok || !b.ok) throw new Error('compile failed');
    const p = [90, 500];
    const x = [1e-4, 2e-4, 3e-4];
    const cov = [[20, 21, 22], [998, 997, 996], [4186, 4185, 4184]];
    const va = new Float64Array(3);
    const vb = new Float64Array(3);
    a.model.values(p, x, cov, va);
    b.model.values(p, x, cov, vb);
    expect(Array.from(vb)).toEqual(Array.from(va));
    const ga = new Float64Array(6);
    const gb = new Float64Array(6);
    a.model.gradient(p, x, cov, ga);
    b.model.gradient(p, x, cov, gb);
    for (let i = 0; i < 6; i++) expect(gb[i]).toBeCloseTo(ga[i], 12);
  });
});

describe('double-double arithmetic', () => {
  // reference digits computed with mpmath 1.3.0 at 60 digits (hi, lo = nearest doubles of the value and its remainder)
  test.each([
    ['e', () => ddExp([1, 0]), 2.718281828459045, 1.4456468917292502e-16],
    ['ln 2', () => ddLog([2, 0]), 0.6931471805599453, 2.3190468138462996e-17],
    ['√2', () => ddSqrt([2, 0]), 1.4142135623730951, -9.667293313452913e-17],
    ['exp(−7.3)', () => ddExp([-7.3, 0]), 0.0006755387751938444, -2.9077504938462766e-20],
    ['3^0.7', () => ddPow([3, 0], [0.7, 0]), 2.157669279974593, -1.2965239737890466e-16],
    ['exp(1.15)', () => ddExp([1.15, 0]), 3.158192909689767, 1.662657093459028e-16],
  ])('%s to about 30 digits', (_n, f, hi, lo) => {
    const [h, l] = f();
    expect(h).toBe(hi);
    expect(Math.abs(l - lo)).toBeLessThan(1e-30 * Math.abs(hi));
  });

  // ddExpTo and ddDivTo write the products and sums out on local variables; they must be exactly the
  // composition of ddMulTo and ddAddTo they stand for (the algorithms as stated in their TSDoc).
  const w = new Float64Array(2);
  const composedDiv = (ah: number, al: number, bh: number, bl: number): number[] => {
    const q1 = ah / bh;
    ddMulTo(q1, 0, bh, bl, w, 0);
    ddAddTo(ah, al, -w[0], -w[1], w, 0);
    const [rh, rl] = w;
    const q2 = rh / bh;
    ddMulTo(q2, 0, bh, bl, w, 0);
    ddAddTo(rh, rl, -w[0], -w[1], w, 0);
    const q3 = w[0] / bh;
    const s = q1 + q2;
    ddAddTo(s, q2 - (s - q1), q3, 0, w, 0);
    return [w[0], w[1]];
  };
  const inverse = (n: number): number[] => {
    const q = 1 / n;
    twoProduct(q, n, w); // q·n = 1 − e exactly
    const e = (1 - w[0] - w[1]) / n;
    const s = q + e;
    return [s, e - (s - q)];
  };
  const composedExp = (ah: number, al: number): number[] => {
    if (ah > 709.78) return [Infinity, 0];
    if (ah < -745.2) return [0, 0];
    const k = Math.round(ah / 0.6931471805599453);
    ddMulTo(k, 0, 0.6931471805599453, 2.3190468138462996e-17, w, 0);
    ddAddTo(ah, al, -w[0], -w[1], w, 0);
    const rh = w[0] / 1024;
    const rl = w[1] / 1024;
    let [th, tl, sh, sl] = [rh, rl, rh, rl];
    for (let n = 2; n <= 9; n++) {
      const [ih, il] = inverse(n);
      ddMulTo(rh, rl, ih, il, w, 0);
      ddMulTo(th, tl, w[0], w[1], w, 0);
      [th, tl] = w;
      ddAddTo(sh, sl, th, tl, w, 0);
      [sh, sl] = w;
    }
    for (let i = 0; i < 10; i++) {
      ddAddTo(sh, sl, 2, 0, w, 0);
      ddMulTo(sh, sl, w[0], w[1], w, 0);
      [sh, sl] = w;
    }
    ddAddTo(sh, sl, 1, 0, w, 0);
    const scale = 2 ** k;
    return Number.isFinite(scale) ? [w[0] * scale, w[1] * scale] : [w[0] * 2 ** (k - 60) * 2 ** 60, 0];
  };

  test('the written-out exponential and quotient are bit for bit the compositions of ddMulTo and ddAddTo', () => {
    const rand = mulberry32(5);
    const out = new Float64Array(2);
    for (let t = 0; t < 20000; t++) {
      const ah = t < 10000 ? (rand() - 0.5) * 1500 : (rand() - 0.5) * 40;
      const al = (rand() - 0.5) * 2.2e-16 * Math.abs(ah);
      ddExpTo(ah, al, out, 0);
      expect([out[0], out[1]], `exp(${ah} + ${al})`).toEqual(composedExp(ah, al));
      const bh = (rand() - 0.5) * 10 ** (20 * rand() - 10);
      const bl = (rand() - 0.5) * 2.2e-16 * Math.abs(bh);
      ddDivTo(ah, al, bh, bl, out, 0);
      expect([out[0], out[1]], `(${ah} + ${al})/(${bh} + ${bl})`).toEqual(composedDiv(ah, al, bh, bl));
    }
  });
});
