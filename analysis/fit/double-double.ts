/**
 * Double-double ("twofold") arithmetic helpers: a value is hi + lo with |lo| ≤ ½ulp(hi), about 32
 * significant digits. Used only to compute residuals accurately during iterative refinement.
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
