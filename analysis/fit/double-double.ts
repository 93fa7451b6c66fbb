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
 * @param out - receives hi at out[o], lo at out[o + 1]
 * @param o - offset into out (default 0)
 * @example const t = new Float64Array(2); twoProduct(0.1, 3, t) // t[0] + t[1] is 0.1·3 exactly
 */
export function twoProduct(a: number, b: number, out: Float64Array, o = 0): void {
  const p = a * b;
  let c = SPLIT * a;
  const ah = c - (c - a);
  const al = a - ah;
  c = SPLIT * b;
  const bh = c - (c - b);
  const bl = b - bh;
  out[o] = p;
  out[o + 1] = ah * bh - p + ah * bl + al * bh + al * bl;
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

/*
 * The operations below are written on scalars: each `…To` function takes its operands as (hi, lo)
 * numbers and writes its result to out[o], out[o + 1], so that a hot loop (the extended residuals
 * of every fit) allocates nothing. The array-valued `dd…` functions wrap them for convenience;
 * both give bit-identical results (the same IEEE operations in the same order).
 */

/**
 * (ah + al) + (bh + bl) in double-double (accurate to about 2^-104 relative): two two-sums and two
 * quick renormalisations.
 * @example ddAddTo(1, 0, 1e-20, 0, out, 0) // out = [1, 1e-20]
 */
export function ddAddTo(ah: number, al: number, bh: number, bl: number, out: Float64Array, o: number): void {
  const s = ah + bh;
  const sb = s - ah;
  const se = ah - (s - sb) + (bh - sb);
  const t = al + bl;
  const tb = t - al;
  const te = al - (t - tb) + (bl - tb);
  const u = se + t;
  const r = s + u;
  const re = u - (r - s);
  const v = re + te;
  const h = r + v;
  out[o] = h;
  out[o + 1] = v - (h - r);
}

/**
 * (ah + al)·(bh + bl) in double-double (al·bl neglected).
 * @example ddMulTo(3, 0, 1 / 3, 0, out, 0) // out[0] + out[1] = 3·fl(1/3) exactly
 */
export function ddMulTo(ah: number, al: number, bh: number, bl: number, out: Float64Array, o: number): void {
  const p = ah * bh;
  let c = SPLIT * ah;
  const ahh = c - (c - ah);
  const ahl = ah - ahh;
  c = SPLIT * bh;
  const bhh = c - (c - bh);
  const bhl = bh - bhh;
  const e = ahh * bhh - p + ahh * bhl + ahl * bhh + ahl * bhl;
  const u = e + (ah * bl + al * bh);
  const h = p + u;
  out[o] = h;
  out[o + 1] = u - (h - p);
}

/**
 * (ah + al)/(bh + bl) in double-double (three quotient digits): q1 = a/b, then two corrections from
 * the remainders a − q1·b and r − q2·b (ddMulTo and ddAddTo written out on local variables, the
 * same operations in the same order).
 * @example ddDivTo(1, 0, 3, 0, out, 0) // out ≈ 1/3 to 32 digits
 */
export function ddDivTo(ah: number, al: number, bh: number, bl: number, out: Float64Array, o: number): void {
  let c = SPLIT * bh;
  const yh = c - (c - bh);
  const yl = bh - yh;
  let rh = ah;
  let rl = al;
  let q1 = 0;
  let q2 = 0;
  for (let step = 0; step < 2; step++) {
    // r ← r − q·b with q = r/b: q1 from a, q2 from the first remainder
    const q = rh / bh;
    const p = q * bh;
    c = SPLIT * q;
    const xh = c - (c - q);
    const xl = q - xh;
    const e = xh * yh - p + xh * yl + xl * yh + xl * yl;
    let u = e + (q * bl + 0 * bh);
    const h = p + u;
    const mh = -h;
    const ml = -(u - (h - p));
    const s = rh + mh;
    const sb = s - rh;
    const se = rh - (s - sb) + (mh - sb);
    const t = rl + ml;
    const tb = t - rl;
    const te = rl - (t - tb) + (ml - tb);
    u = se + t;
    const r = s + u;
    const v = u - (r - s) + te;
    rh = r + v;
    rl = v - (rh - r);
    if (step === 0) q1 = q;
    else q2 = q;
  }
  const q3 = rh / bh;
  const qs = q1 + q2;
  ddAddTo(qs, q2 - (qs - q1), q3, 0, out, o);
}

const LN2_HI = 0.6931471805599453;
const LN2_LO = 2.3190468138462996e-17;
/** 1/n as double-doubles (hi at 2n, lo at 2n + 1), n = 0..9 */
const INVERSE = new Float64Array(20);
for (let n = 1; n <= 9; n++) {
  const q = 1 / n;
  twoProduct(q, n, INVERSE, 2 * n); // q·n = 1 − e exactly
  const e = (1 - INVERSE[2 * n] - INVERSE[2 * n + 1]) / n;
  const s = q + e;
  INVERSE[2 * n] = s;
  INVERSE[2 * n + 1] = e - (s - q);
}

/** 2^k for every k the argument reduction of ddExpTo can give (made by `2 ** k` itself, once) */
const POW2_LOW = -1080;
const POW2 = Float64Array.from({ length: 2161 }, (_, i) => 2 ** (i + POW2_LOW));
const pow2 = (k: number): number => (k >= POW2_LOW && k <= -POW2_LOW ? POW2[k - POW2_LOW] : 2 ** k);

/**
 * e^(ah + al) in double-double: argument reduction by ln 2 and 2^10, Taylor series, ten squarings.
 * @example ddExpTo(1, 0, out, 0) // out = e to about 32 digits
 */
export function ddExpTo(ah: number, al: number, out: Float64Array, o: number): void {
  if (ah > 709.78) {
    out[o] = Infinity;
    out[o + 1] = 0;
    return;
  }
  if (ah < -745.2) {
    out[o] = 0;
    out[o + 1] = 0;
    return;
  }
  // ddMulTo and ddAddTo written out on local variables (the same operations in the same order:
  // test/analysis/fit/solvers.test.ts compares this with their composition bit for bit), so the
  // 46 double-double operations of an exponential stay in registers
  const k = Math.round(ah / LN2_HI);
  let p: number, c: number, xh: number, xl: number, yh: number, yl: number, e: number, u: number, h: number;
  let s: number, sb: number, se: number, t: number, tb: number, te: number, q: number, qe: number, v: number;
  // (k, 0)·ln 2
  p = k * LN2_HI; c = SPLIT * k; xh = c - (c - k); xl = k - xh; c = SPLIT * LN2_HI; yh = c - (c - LN2_HI); yl = LN2_HI - yh;
  e = xh * yh - p + xh * yl + xl * yh + xl * yl; u = e + (k * LN2_LO + 0 * LN2_HI); h = p + u;
  const mh = h;
  const ml = u - (h - p);
  // a − k·ln 2
  s = ah + -mh; sb = s - ah; se = ah - (s - sb) + (-mh - sb); t = al + -ml; tb = t - al; te = al - (t - tb) + (-ml - tb);
  u = se + t; q = s + u; qe = u - (q - s); v = qe + te; h = q + v;
  const rh = h / 1024;
  const rl = (v - (h - q)) / 1024;
  // s = e^r − 1 by Taylor series (|r| < 3.4e-4, so nine terms reach 1e-32), then
  // (e^r − 1) → (e^{2r} − 1) = s(s + 2), ten times
  let th = rh;
  let tl = rl;
  let sh = rh;
  let sl = rl;
  for (let n = 2; n <= 9; n++) {
    const ih = INVERSE[2 * n];
    const il = INVERSE[2 * n + 1];
    // f = r·(1/n)
    p = rh * ih; c = SPLIT * rh; xh = c - (c - rh); xl = rh - xh; c = SPLIT * ih; yh = c - (c - ih); yl = ih - yh;
    e = xh * yh - p + xh * yl + xl * yh + xl * yl; u = e + (rh * il + rl * ih); h = p + u;
    const fh = h;
    const fl = u - (h - p);
    // term = term·f
    p = th * fh; c = SPLIT * th; xh = c - (c - th); xl = th - xh; c = SPLIT * fh; yh = c - (c - fh); yl = fh - yh;
    e = xh * yh - p + xh * yl + xl * yh + xl * yl; u = e + (th * fl + tl * fh); h = p + u;
    th = h;
    tl = u - (h - p);
    // s = s + term
    s = sh + th; sb = s - sh; se = sh - (s - sb) + (th - sb); t = sl + tl; tb = t - sl; te = sl - (t - tb) + (tl - tb);
    u = se + t; q = s + u; qe = u - (q - s); v = qe + te; h = q + v;
    sh = h;
    sl = v - (h - q);
  }
  for (let i = 0; i < 10; i++) {
    // g = s + 2
    s = sh + 2; sb = s - sh; se = sh - (s - sb) + (2 - sb); t = sl + 0; tb = t - sl; te = sl - (t - tb) + (0 - tb);
    u = se + t; q = s + u; qe = u - (q - s); v = qe + te; h = q + v;
    const gh = h;
    const gl = v - (h - q);
    // s = s·g
    p = sh * gh; c = SPLIT * sh; xh = c - (c - sh); xl = sh - xh; c = SPLIT * gh; yh = c - (c - gh); yl = gh - yh;
    e = xh * yh - p + xh * yl + xl * yh + xl * yl; u = e + (sh * gl + sl * gh); h = p + u;
    sh = h;
    sl = u - (h - p);
  }
  // e^a = (s + 1)·2^k
  s = sh + 1; sb = s - sh; se = sh - (s - sb) + (1 - sb); t = sl + 0; tb = t - sl; te = sl - (t - tb) + (0 - tb);
  u = se + t; q = s + u; qe = u - (q - s); v = qe + te; h = q + v;
  const oh = h;
  const ol = v - (h - q);
  const scale = pow2(k);
  if (Number.isFinite(scale)) {
    out[o] = oh * scale;
    out[o + 1] = ol * scale;
  } else {
    out[o] = oh * 2 ** (k - 60) * 2 ** 60;
    out[o + 1] = 0;
  }
}

const LOG = new Float64Array(2);
/**
 * ln(ah + al) in double-double: one Newton step on e^y = a from the double logarithm.
 * @example ddLogTo(2, 0, out, 0) // out = ln 2 to about 32 digits
 */
export function ddLogTo(ah: number, al: number, out: Float64Array, o: number): void {
  if (!(ah > 0)) {
    out[o] = Math.log(ah);
    out[o + 1] = 0;
    return;
  }
  const w = LOG;
  const y0 = Math.log(ah);
  ddExpTo(-y0, 0, w, 0);
  ddMulTo(ah, al, w[0], w[1], w, 0);
  ddAddTo(w[0], w[1], -1, 0, w, 0);
  ddAddTo(y0, 0, w[0], w[1], out, o);
}

const SQRT = new Float64Array(2);
/**
 * √(ah + al) in double-double: one Newton step from the double square root.
 * @example ddSqrtTo(2, 0, out, 0) // out = √2 to about 32 digits
 */
export function ddSqrtTo(ah: number, al: number, out: Float64Array, o: number): void {
  if (!(ah > 0)) {
    out[o] = Math.sqrt(ah);
    out[o + 1] = 0;
    return;
  }
  const w = SQRT;
  const s0 = Math.sqrt(ah);
  twoProduct(s0, s0, w, 0);
  ddAddTo(ah, al, -w[0], -w[1], w, 0);
  ddDivTo(w[0], w[1], 2 * s0, 0, w, 0);
  ddAddTo(s0, 0, w[0], w[1], out, o);
}

const POW_INT = new Float64Array(4);
/**
 * (ah + al)^k for an integer k, by repeated squaring.
 * @example ddPowIntTo(3, 0, 2, out, 0) // out = [9, 0]
 */
export function ddPowIntTo(ah: number, al: number, k: number, out: Float64Array, o: number): void {
  const w = POW_INT;
  let rh = 1;
  let rl = 0;
  let bh = ah;
  let bl = al;
  let e = Math.abs(k);
  while (e > 0) {
    if (e & 1) {
      ddMulTo(rh, rl, bh, bl, w, 0);
      rh = w[0];
      rl = w[1];
    }
    ddMulTo(bh, bl, bh, bl, w, 2);
    bh = w[2];
    bl = w[3];
    e >>= 1;
  }
  if (k < 0) ddDivTo(1, 0, rh, rl, out, o);
  else {
    out[o] = rh;
    out[o + 1] = rl;
  }
}

const POW = new Float64Array(2);
/**
 * (ah + al)^(bh + bl): integer powers exactly, otherwise e^(b·ln a) (a > 0).
 * @example ddPowTo(3, 0, 0.7, 0, out, 0) // out = 3^0.7 to about 30 digits
 */
export function ddPowTo(ah: number, al: number, bh: number, bl: number, out: Float64Array, o: number): void {
  if (bl === 0 && Number.isInteger(bh) && Math.abs(bh) <= 64) {
    ddPowIntTo(ah, al, bh, out, o);
    return;
  }
  if (!(ah > 0)) {
    out[o] = Math.pow(ah + al, bh + bl);
    out[o + 1] = 0;
    return;
  }
  const w = POW;
  ddLogTo(ah, al, w, 0);
  ddMulTo(bh, bl, w[0], w[1], w, 0);
  ddExpTo(w[0], w[1], out, o);
}

const RESULT = new Float64Array(2);
const pair = (): Dd => [RESULT[0], RESULT[1]];
/** a + b in double-double (accurate to about 2^-104 relative). */
export function ddAdd(a: Dd, b: Dd): Dd {
  ddAddTo(a[0], a[1], b[0], b[1], RESULT, 0);
  return pair();
}
/** −a. */
export function ddNeg(a: Dd): Dd {
  return [-a[0], -a[1]];
}
/** a·b in double-double. */
export function ddMul(a: Dd, b: Dd): Dd {
  ddMulTo(a[0], a[1], b[0], b[1], RESULT, 0);
  return pair();
}
/** a/b in double-double (three quotient digits). */
export function ddDiv(a: Dd, b: Dd): Dd {
  ddDivTo(a[0], a[1], b[0], b[1], RESULT, 0);
  return pair();
}
/** e^a in double-double: argument reduction by ln 2 and 2^10, Taylor series, ten squarings. */
export function ddExp(a: Dd): Dd {
  ddExpTo(a[0], a[1], RESULT, 0);
  return pair();
}
/** ln a in double-double: one Newton step on e^y = a from the double logarithm. */
export function ddLog(a: Dd): Dd {
  ddLogTo(a[0], a[1], RESULT, 0);
  return pair();
}
/** √a in double-double: one Newton step from the double square root. */
export function ddSqrt(a: Dd): Dd {
  ddSqrtTo(a[0], a[1], RESULT, 0);
  return pair();
}
/** a^k for an integer k, by repeated squaring. */
export function ddPowInt(a: Dd, k: number): Dd {
  ddPowIntTo(a[0], a[1], k, RESULT, 0);
  return pair();
}
/** a^b: integer powers exactly, otherwise e^(b·ln a) (a > 0). */
export function ddPow(a: Dd, b: Dd): Dd {
  ddPowTo(a[0], a[1], b[0], b[1], RESULT, 0);
  return pair();
}
