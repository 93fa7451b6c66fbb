/**
 * Double-double ("twofold") arithmetic helpers: a value is hi + lo with |lo| ≤ ½ulp(hi), about 32
 * significant digits. Used to compute residuals accurately: linear least-squares refinement and the
 * extended-precision residuals of nonlinear fits. Example: ddExp([1, 0]) gives e to about 32 digits.
 * Methods: Dekker's splitting and Knuth's two-sum (T. J. Dekker, Numer. Math. 18 (1971) 224–242).
 */
const SPLIT = 134217729; // 2^27 + 1

/**
 * Error-free product: a·b = out[0] + out[1] exactly (no overflow checks; |a|, |b| < 2^996).
 * @param a - factor
 * @param b - factor
 * @param out - receives [hi, lo]
 * @example const t = new Float64Array(2); twoProduct(0.1, 3, t) // t[0] + t[1] is 0.1·3 exactly
 */
export function twoProduct(a: number, b: number, out: Float64Array): void {
  const p = a * b;
  let c = SPLIT * a;
  const ah = c - (c - a);
  const al = a - ah;
  c = SPLIT * b;
  const bh = c - (c - b);
  const bl = b - bh;
  out[0] = p;
  out[1] = ah * bh - p + ah * bl + al * bh + al * bl;
}

/** Accumulator for Σ (aᵢ·bᵢ) with aᵢ, bᵢ given as hi + lo pairs, accurate to about 1e-30 relative. */
export class DotAccumulator {
  private hi = 0;
  private lo = 0;
  private readonly tmp = new Float64Array(2);

  /** Adds a double-double value (hi, lo). */
  addDd(h: number, l: number): void {
    const s = this.hi + h;
    const bb = s - this.hi;
    const err = this.hi - (s - bb) + (h - bb);
    this.lo += err + l;
    this.hi = s;
  }

  /** Adds (ah + al)·(bh + bl), neglecting al·bl. */
  addProduct(ah: number, al: number, bh: number, bl: number): void {
    twoProduct(ah, bh, this.tmp);
    this.addDd(this.tmp[0], this.tmp[1] + (ah * bl + al * bh));
  }

  /** The sum rounded to double. */
  value(): number {
    return this.hi + this.lo;
  }

  reset(): void {
    this.hi = 0;
    this.lo = 0;
  }
}

/** A double-double value [hi, lo]: hi + lo with |lo| ≤ ½ ulp(hi). */
export type Dd = [number, number];

function twoSum(a: number, b: number): Dd {
  const s = a + b;
  const bb = s - a;
  return [s, a - (s - bb) + (b - bb)];
}
function quickTwoSum(a: number, b: number): Dd {
  const s = a + b;
  return [s, b - (s - a)];
}
function twoProd(a: number, b: number): Dd {
  const p = a * b;
  let c = SPLIT * a;
  const ah = c - (c - a);
  const al = a - ah;
  c = SPLIT * b;
  const bh = c - (c - b);
  const bl = b - bh;
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}
/** a + b in double-double (accurate to about 2^-104 relative). */
export function ddAdd(a: Dd, b: Dd): Dd {
  const s = twoSum(a[0], b[0]);
  const t = twoSum(a[1], b[1]);
  let r = quickTwoSum(s[0], s[1] + t[0]);
  r = quickTwoSum(r[0], r[1] + t[1]);
  return r;
}
/** −a. */
export function ddNeg(a: Dd): Dd {
  return [-a[0], -a[1]];
}
/** a·b in double-double. */
export function ddMul(a: Dd, b: Dd): Dd {
  const p = twoProd(a[0], b[0]);
  return quickTwoSum(p[0], p[1] + (a[0] * b[1] + a[1] * b[0]));
}
/** a/b in double-double (three quotient digits). */
export function ddDiv(a: Dd, b: Dd): Dd {
  const q1 = a[0] / b[0];
  const r = ddAdd(a, ddNeg(ddMul([q1, 0], b)));
  const q2 = r[0] / b[0];
  const r2 = ddAdd(r, ddNeg(ddMul([q2, 0], b)));
  const q3 = r2[0] / b[0];
  return ddAdd(quickTwoSum(q1, q2), [q3, 0]);
}
const LN2: Dd = [0.6931471805599453, 2.3190468138462996e-17];
/** 1/n as double-doubles, n = 0..9 */
const INVERSE: Dd[] = Array.from({ length: 10 }, (_, n) => (n === 0 ? [0, 0] : inverseOf(n)));
function inverseOf(n: number): Dd {
  const q = 1 / n;
  const p = twoProd(q, n); // q·n = 1 − e exactly
  return quickTwoSum(q, (1 - p[0] - p[1]) / n);
}
/** e^a in double-double: argument reduction by ln 2 and 2^10, Taylor series, ten squarings. */
export function ddExp(a: Dd): Dd {
  if (a[0] > 709.78) return [Infinity, 0];
  if (a[0] < -745.2) return [0, 0];
  const k = Math.round(a[0] / LN2[0]);
  let r = ddAdd(a, ddNeg(ddMul([k, 0], LN2)));
  r = [r[0] / 1024, r[1] / 1024];
  // s = e^r − 1 by Taylor series (|r| < 3.4e-4, so nine terms reach 1e-32), then
  // (e^r − 1) → (e^{2r} − 1) = s(s + 2), ten times
  let term: Dd = r;
  let s: Dd = r;
  for (let n = 2; n <= 9; n++) {
    term = ddMul(term, ddMul(r, INVERSE[n]));
    s = ddAdd(s, term);
  }
  for (let i = 0; i < 10; i++) s = ddMul(s, ddAdd(s, [2, 0]));
  const one = ddAdd(s, [1, 0]);
  const scale = 2 ** k;
  return Number.isFinite(scale) ? [one[0] * scale, one[1] * scale] : [one[0] * 2 ** (k - 60) * 2 ** 60, 0];
}
/** ln a in double-double: one Newton step on e^y = a from the double logarithm. */
export function ddLog(a: Dd): Dd {
  if (!(a[0] > 0)) return [Math.log(a[0]), 0];
  const y0 = Math.log(a[0]);
  return ddAdd([y0, 0], ddAdd(ddMul(a, ddExp([-y0, 0])), [-1, 0]));
}
/** √a in double-double: one Newton step from the double square root. */
export function ddSqrt(a: Dd): Dd {
  if (!(a[0] > 0)) return [Math.sqrt(a[0]), 0];
  const s0 = Math.sqrt(a[0]);
  return ddAdd([s0, 0], ddDiv(ddAdd(a, ddNeg(twoProd(s0, s0))), [2 * s0, 0]));
}
/** a^k for an integer k, by repeated squaring. */
export function ddPowInt(a: Dd, k: number): Dd {
  let result: Dd = [1, 0];
  let base = a;
  let e = Math.abs(k);
  while (e > 0) {
    if (e & 1) result = ddMul(result, base);
    base = ddMul(base, base);
    e >>= 1;
  }
  return k < 0 ? ddDiv([1, 0], result) : result;
}
/** a^b: integer powers exactly, otherwise e^(b·ln a) (a > 0). */
export function ddPow(a: Dd, b: Dd): Dd {
  if (b[1] === 0 && Number.isInteger(b[0]) && Math.abs(b[0]) <= 64) return ddPowInt(a, b[0]);
  if (!(a[0] > 0)) return [Math.pow(a[0] + a[1], b[0] + b[1]), 0];
  return ddExp(ddMul(b, ddLog(a)));
}
