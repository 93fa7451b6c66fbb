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

const DIV = new Float64Array(2);
/**
 * (ah + al)/(bh + bl) in double-double (three quotient digits).
 * @example ddDivTo(1, 0, 3, 0, out, 0) // out ≈ 1/3 to 32 digits
 */
export function ddDivTo(ah: number, al: number, bh: number, bl: number, out: Float64Array, o: number): void {
  const w = DIV;
  const q1 = ah / bh;
  ddMulTo(q1, 0, bh, bl, w, 0);
  ddAddTo(ah, al, -w[0], -w[1], w, 0);
  const rh = w[0];
  const rl = w[1];
  const q2 = rh / bh;
  ddMulTo(q2, 0, bh, bl, w, 0);
  ddAddTo(rh, rl, -w[0], -w[1], w, 0);
  const q3 = w[0] / bh;
  const s = q1 + q2;
  ddAddTo(s, q2 - (s - q1), q3, 0, out, o);
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

const EXP = new Float64Array(2);
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
  const w = EXP;
  const k = Math.round(ah / LN2_HI);
  ddMulTo(k, 0, LN2_HI, LN2_LO, w, 0);
  ddAddTo(ah, al, -w[0], -w[1], w, 0);
  const rh = w[0] / 1024;
  const rl = w[1] / 1024;
  // s = e^r − 1 by Taylor series (|r| < 3.4e-4, so nine terms reach 1e-32), then
  // (e^r − 1) → (e^{2r} − 1) = s(s + 2), ten times
  let th = rh;
  let tl = rl;
  let sh = rh;
  let sl = rl;
  for (let n = 2; n <= 9; n++) {
    ddMulTo(rh, rl, INVERSE[2 * n], INVERSE[2 * n + 1], w, 0);
    ddMulTo(th, tl, w[0], w[1], w, 0);
    th = w[0];
    tl = w[1];
    ddAddTo(sh, sl, th, tl, w, 0);
    sh = w[0];
    sl = w[1];
  }
  for (let i = 0; i < 10; i++) {
    ddAddTo(sh, sl, 2, 0, w, 0);
    ddMulTo(sh, sl, w[0], w[1], w, 0);
    sh = w[0];
    sl = w[1];
  }
  ddAddTo(sh, sl, 1, 0, w, 0);
  const scale = pow2(k);
  if (Number.isFinite(scale)) {
    out[o] = w[0] * scale;
    out[o + 1] = w[1] * scale;
  } else {
    out[o] = w[0] * 2 ** (k - 60) * 2 ** 60;
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
