import { describe, expect, test } from 'vitest';
import {
  fCdf,
  fQuantile,
  fSf,
  normalCdf,
  normalQuantile,
  normalSf,
  studentTCdf,
  studentTQuantile,
  studentTSf,
} from '../../../analysis/stats/distributions';

// Source: NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2 "Critical values of the Student's t
// distribution" (upper-tail probabilities 0.10 to 0.005; printed to 3 decimals). Rows checked against a
// reproduction of that table read while writing this test. Its 0.001 column is not used: two of its entries
// (318.313 at df 1, 4.143 at df 10) disagree in the third decimal with other published t tables and with the
// closed form tan(π(p − ½)) at df 1 (318.309), which is tested below.
const T_TABLE: [df: number, alpha: number, t: number][] = [
  [1, 0.1, 3.078], [1, 0.05, 6.314], [1, 0.025, 12.706], [1, 0.01, 31.821], [1, 0.005, 63.657],
  [2, 0.025, 4.303], [3, 0.025, 3.182], [4, 0.025, 2.776],
  [5, 0.05, 2.015], [5, 0.025, 2.571], [5, 0.005, 4.032], [6, 0.025, 2.447], [7, 0.025, 2.365],
  [8, 0.025, 2.306], [9, 0.025, 2.262], [10, 0.1, 1.372], [10, 0.05, 1.812], [10, 0.025, 2.228],
  [10, 0.01, 2.764], [15, 0.025, 2.131], [20, 0.025, 2.086], [20, 0.005, 2.845],
  [25, 0.025, 2.06], [30, 0.025, 2.042], [40, 0.025, 2.021], [60, 0.025, 2.0],
  [100, 0.05, 1.66], [100, 0.025, 1.984],
];

// Source: NIST/SEMATECH e-Handbook §1.3.6.7.3 "Upper critical values of the F distribution", 5 % level,
// printed to 3 decimals (ν1 numerator, ν2 denominator); checked against a 4-decimal reproduction.
const F_TABLE: [d1: number, d2: number, f: number][] = [
  [1, 1, 161.448], [2, 1, 199.5], [2, 3, 9.552], [1, 10, 4.965], [5, 10, 3.326], [10, 10, 2.978],
  [3, 20, 3.098], [4, 30, 2.69], [7, 15, 2.707], [10, 100, 1.927],
];

describe('studentTQuantile', () => {
  test.each(T_TABLE)('df %d, upper tail %f gives the tabled %f (±0.0005, 3-decimal table)', (df, alpha, t) => {
    expect(Math.abs(studentTQuantile(1 - alpha, df) - t)).toBeLessThanOrEqual(0.0005 + 1e-12);
  });

  test('is antisymmetric and zero at the median', () => {
    expect(studentTQuantile(0.5, 7)).toBe(0);
    expect(studentTQuantile(0.25, 7)).toBe(-studentTQuantile(0.75, 7)); // 0.25 and 0.75 are exact binary fractions
  });

  test('matches the closed forms for 1 and 2 degrees of freedom to 1e-13 relative (A&S 26.7.3, 26.7.4)', () => {
    for (const p of [0.6, 0.9, 0.975, 0.999, 1 - 1e-9]) {
      const cauchy = 1 / Math.tan(Math.PI * (1 - p)); // tan(π(p − ½)) written without cancellation
      expect(Math.abs(studentTQuantile(p, 1) / cauchy - 1)).toBeLessThan(1e-13);
      const two = (2 * p - 1) / Math.sqrt(2 * p * (1 - p));
      expect(Math.abs(studentTQuantile(p, 2) / two - 1)).toBeLessThan(1e-12);
    }
  });

  test('tends to the normal quantile as df grows and equals it at Infinity', () => {
    expect(studentTQuantile(0.975, Infinity)).toBe(normalQuantile(0.975));
    expect(Math.abs(studentTQuantile(0.975, 1e7) - normalQuantile(0.975))).toBeLessThan(1e-6);
  });

  test('inverts the CDF to 1e-13 relative, also far in the tails and for fractional df', () => {
    for (const df of [0.5, 1.5, 3, 12.5, 250]) {
      for (const p of [1e-10, 0.01, 0.3, 0.51, 0.975, 1 - 1e-10]) {
        const t = studentTQuantile(p, df);
        const back = p < 0.5 ? studentTCdf(t, df) : studentTSf(t, df);
        const target = p < 0.5 ? p : 1 - p;
        expect(Math.abs(back / target - 1)).toBeLessThan(1e-12);
      }
    }
  });

  test('gives ±Infinity at 0 and 1 and throws RangeError on bad input, echoing the value', () => {
    expect(studentTQuantile(1, 5)).toBe(Infinity);
    expect(studentTQuantile(0, 5)).toBe(-Infinity);
    expect(() => studentTQuantile(1.5, 5)).toThrow(/1\.5/);
    expect(() => studentTQuantile(0.9, 0)).toThrow(RangeError);
    expect(() => studentTQuantile(Number.NaN, 3)).toThrow(RangeError);
  });
});

describe('studentTCdf', () => {
  test.each(T_TABLE)('df %d: the upper tail beyond the tabled value is the stated probability (±table rounding)', (df, alpha, t) => {
    // the table rounds t to 3 decimals; bound the tail change by the density times 0.0005
    const dens = 0.5 / Math.sqrt(df); // generous bound of the density beyond the critical value
    expect(Math.abs(studentTSf(t, df) - alpha)).toBeLessThan(dens * 0.0005 + 1e-12);
  });

  test('is the Cauchy CDF for 1 degree of freedom (closed form, A&S 26.7.3)', () => {
    for (const t of [-50, -1, 0, 0.3, 4, 1e6]) {
      expect(Math.abs(studentTCdf(t, 1) - (0.5 + Math.atan(t) / Math.PI))).toBeLessThan(1e-15);
    }
  });
});

describe('F distribution', () => {
  test.each(F_TABLE)('F(%d, %d) upper 5 %% critical value is the tabled %f (±0.0005)', (d1, d2, f) => {
    expect(Math.abs(fQuantile(0.95, d1, d2) - f)).toBeLessThanOrEqual(0.0005 + 1e-9);
  });

  test('F(1, ν) is the square of t(ν) (A&S 26.6.4)', () => {
    for (const [x, nu] of [[4.965, 10], [0.3, 3], [40, 25]]) {
      expect(Math.abs(fSf(x, 1, nu) - 2 * studentTSf(Math.sqrt(x), nu))).toBeLessThan(1e-15);
    }
  });

  test('F(2, ν) survival has the closed form (1 + 2x/ν)^(−ν/2) (A&S 26.6.4)', () => {
    for (const [x, nu] of [[0.5, 4], [3, 10], [25, 7], [1e3, 30]]) {
      const exact = (1 + (2 * x) / nu) ** (-nu / 2);
      expect(Math.abs(fSf(x, 2, nu) / exact - 1)).toBeLessThan(1e-12);
      expect(Math.abs(fCdf(x, 2, nu) + fSf(x, 2, nu) - 1)).toBeLessThan(1e-15);
    }
  });

  test('quantile and CDF invert each other', () => {
    for (const [d1, d2] of [[3, 7], [0.7, 12], [40, 3]]) {
      for (const p of [1e-6, 0.05, 0.5, 0.95, 1 - 1e-8]) {
        const x = fQuantile(p, d1, d2);
        const back = p < 0.5 ? fCdf(x, d1, d2) : fSf(x, d1, d2);
        expect(Math.abs(back / (p < 0.5 ? p : 1 - p) - 1)).toBeLessThan(1e-11);
      }
    }
  });

  test('throws RangeError for bad degrees of freedom', () => {
    expect(() => fSf(1, -1, 3)).toThrow(/-1/);
    expect(() => fCdf(Number.NaN, 1, 3)).toThrow(RangeError);
  });
});

describe('normal distribution', () => {
  // Source: NIST/SEMATECH e-Handbook §1.3.6.7.1, area under the standard normal from 0 to z (5 decimals).
  test.each([
    [0.5, 0.19146], [1.0, 0.34134], [1.96, 0.475], [2.0, 0.47725], [2.58, 0.49506], [3.0, 0.49865], [4.0, 0.49997],
  ])('area from 0 to %f is the tabled %f (±0.000005)', (z, area) => {
    expect(Math.abs(normalCdf(z) - 0.5 - area)).toBeLessThanOrEqual(0.000005 + 1e-12);
  });

  test('quantile inverts the CDF to 1e-14 relative from 1e-300 to 1 − 1e-16', () => {
    for (const p of [1e-300, 1e-50, 1e-10, 0.001, 0.2, 0.5, 0.8, 0.975, 1 - 1e-10]) {
      const z = normalQuantile(p);
      const back = p < 0.5 ? normalCdf(z) : normalSf(z);
      expect(Math.abs(back / (p < 0.5 ? p : 1 - p) - 1)).toBeLessThan(1e-13);
    }
  });

  test('z(0.975) is 1.959963984540054 (the value every statistics text rounds to 1.96; from memory)', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 14);
  });

  test('the far tail keeps relative accuracy: Φ(−20) ≈ 2.7536e-89 (A&S 26.2.12 asymptotic series)', () => {
    const x = 20;
    const asym = (Math.exp(-x * x / 2) / (x * Math.sqrt(2 * Math.PI))) * (1 - 1 / x ** 2 + 3 / x ** 4 - 15 / x ** 6 + 105 / x ** 8);
    expect(Math.abs(normalCdf(-x) / asym - 1)).toBeLessThan(1e-10);
  });

  test('NaN throws RangeError; infinities map to 0 and 1', () => {
    expect(() => normalCdf(Number.NaN)).toThrow(RangeError);
    expect(normalCdf(-Infinity)).toBe(0);
    expect(normalCdf(Infinity)).toBe(1);
    expect(() => normalQuantile(-0.1)).toThrow(/-0\.1/);
  });
});
