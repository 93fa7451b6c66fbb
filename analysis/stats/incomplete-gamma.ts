import { logGamma } from './log-gamma';

/**
 * Regularized incomplete gamma functions P(a, x) and Q(a, x) = 1 − P(a, x), each computed without
 * cancellation (the series gives P for x < a + 1, the continued fraction gives Q otherwise).
 *
 * Method: W. H. Press et al., Numerical Recipes, 3rd ed., §6.2 (series and Lentz continued fraction).
 *
 * @param a - shape, > 0
 * @param x - argument, ≥ 0
 * @returns `{ lower: P(a,x), upper: Q(a,x) }`
 * @throws RangeError for a ≤ 0 or x < 0 or non-finite arguments
 * @example incompleteGamma(1, 2).upper // exp(−2) = 0.1353352832366127
 */
export function incompleteGamma(a: number, x: number): { lower: number; upper: number } {
  if (!(a > 0) || !Number.isFinite(a)) throw new RangeError(`incompleteGamma: a must be finite and > 0, got ${a}`);
  if (!(x >= 0)) throw new RangeError(`incompleteGamma: x must be ≥ 0, got ${x}`);
  if (x === 0) return { lower: 0, upper: 1 };
  if (x === Infinity) return { lower: 1, upper: 0 };
  const logFront = -x + a * Math.log(x) - logGamma(a);
  if (x < a + 1) {
    let ap = a;
    let del = 1 / a;
    let sum = del;
    for (let n = 0; n < 100_000; n++) {
      ap += 1;
      del *= x / ap;
      sum += del;
      if (Math.abs(del) < Math.abs(sum) * 1e-17) break;
    }
    const lower = sum * Math.exp(logFront);
    return { lower, upper: 1 - lower };
  }
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 100_000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  const upper = Math.exp(logFront) * h;
  return { lower: 1 - upper, upper };
}
