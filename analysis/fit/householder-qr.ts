import { euclideanNorm } from './euclidean-norm';

const EPS = 2.220446049250313e-16;
/** the original column norms of the pivoting safeguard, shared by every call */
let partialNorms = new Float64Array(16);

/** Householder QR factorization of an m×n matrix, with the reflectors kept in place. */
export interface HouseholderQr {
  /** rows, columns */
  m: number;
  n: number;
  /**
   * Column-major m×n storage: on and below the diagonal of column j (rows j..m−1) the Householder
   * vector v_j (scaled so that v_j[j] = π_j), strictly above the diagonal the upper part of R.
   */
  a: Float64Array;
  /** diagonal of R (the diagonal entries in `a` hold the reflector's π instead) */
  rdiag: Float64Array;
  /** column norms of the input matrix, in input column order */
  acnorm: Float64Array;
  /** permutation: column j of R corresponds to input column ipvt[j] */
  ipvt: Int32Array;
}

/**
 * Householder QR with optional column pivoting, A·P = Q·R, for an m×n matrix stored column-major
 * (entry (i, j) at `a[i + j*m]`). The input array is overwritten and kept in the result.
 *
 * Method: MINPACK `qrfac` (Moré, Garbow & Hillstrom, ANL-80-74, 1980): at each step the remaining
 * column of largest norm is brought forward, and the partial column norms are downdated with the
 * safeguard that recomputes them when cancellation would make them inaccurate. Never forms AᵀA.
 *
 * @param a - column-major matrix, length m·n (any unit per column)
 * @param m - rows, ≥ 1
 * @param n - columns, ≥ 1
 * @param pivot - use column pivoting (default true)
 * @param reuse - an earlier factorization with the same n whose arrays are overwritten and returned
 *   (iterations factor a new matrix each step without allocating)
 * @returns the factorization; `rdiag` has non-increasing magnitude when pivoting
 * @throws RangeError when `a.length !== m*n`
 * @example householderQr(Float64Array.of(3, 4), 2, 1).rdiag[0] // −5
 */
export function householderQr(a: Float64Array, m: number, n: number, pivot = true, reuse?: HouseholderQr): HouseholderQr {
  if (a.length !== m * n) throw new RangeError(`householderQr: expected ${m * n} entries, got ${a.length}`);
  const fresh = reuse === undefined || reuse.n !== n;
  const out: HouseholderQr = fresh ? { m, n, a, rdiag: new Float64Array(n), acnorm: new Float64Array(n), ipvt: new Int32Array(n) } : reuse;
  out.m = m;
  out.a = a;
  const { rdiag, acnorm, ipvt } = out;
  if (partialNorms.length < n) partialNorms = new Float64Array(n);
  const wa = partialNorms; // work space only (the function runs to its end without yielding)
  for (let j = 0; j < n; j++) {
    acnorm[j] = euclideanNorm(a, j * m, m);
    rdiag[j] = acnorm[j];
    wa[j] = rdiag[j];
    ipvt[j] = j;
  }
  const minmn = Math.min(m, n);
  for (let j = 0; j < minmn; j++) {
    const cj = j * m;
    if (pivot) {
      let kmax = j;
      for (let k = j; k < n; k++) if (rdiag[k] > rdiag[kmax]) kmax = k;
      if (kmax !== j) {
        const ck = kmax * m;
        for (let i = 0; i < m; i++) {
          const t = a[cj + i];
          a[cj + i] = a[ck + i];
          a[ck + i] = t;
        }
        rdiag[kmax] = rdiag[j];
        wa[kmax] = wa[j];
        const t = ipvt[j];
        ipvt[j] = ipvt[kmax];
        ipvt[kmax] = t;
      }
    }
    let ajnorm = euclideanNorm(a, cj + j, m - j);
    if (ajnorm !== 0) {
      if (a[cj + j] < 0) ajnorm = -ajnorm;
      for (let i = j; i < m; i++) a[cj + i] /= ajnorm;
      a[cj + j] += 1;
      // the reflector applied to the remaining columns four (then two, then one) at a time: each
      // column gets exactly the operations of one at a time (its own sum, in the same order, then
      // its own update), but the independent sums overlap in the processor instead of waiting on
      // each other, and each entry of the reflector is loaded once for all of them
      const pj = a[cj + j];
      let k = j + 1;
      for (; k + 3 < n; k += 4) {
        const c0 = k * m;
        const c1 = c0 + m;
        const c2 = c1 + m;
        const c3 = c2 + m;
        let s0 = 0;
        let s1 = 0;
        let s2 = 0;
        let s3 = 0;
        for (let i = j; i < m; i++) {
          const v = a[cj + i];
          s0 += v * a[c0 + i];
          s1 += v * a[c1 + i];
          s2 += v * a[c2 + i];
          s3 += v * a[c3 + i];
        }
        const t0 = s0 / pj;
        const t1 = s1 / pj;
        const t2 = s2 / pj;
        const t3 = s3 / pj;
        for (let i = j; i < m; i++) {
          const v = a[cj + i];
          a[c0 + i] -= t0 * v;
          a[c1 + i] -= t1 * v;
          a[c2 + i] -= t2 * v;
          a[c3 + i] -= t3 * v;
        }
        if (pivot) for (let q = k; q < k + 4; q++) downdateNorm(a, m, j, q, rdiag, wa);
      }
      for (; k + 1 < n; k += 2) {
        const c0 = k * m;
        const c1 = c0 + m;
        let s0 = 0;
        let s1 = 0;
        for (let i = j; i < m; i++) {
          const v = a[cj + i];
          s0 += v * a[c0 + i];
          s1 += v * a[c1 + i];
        }
        const t0 = s0 / pj;
        const t1 = s1 / pj;
        for (let i = j; i < m; i++) {
          const v = a[cj + i];
          a[c0 + i] -= t0 * v;
          a[c1 + i] -= t1 * v;
        }
        if (pivot) {
          downdateNorm(a, m, j, k, rdiag, wa);
          downdateNorm(a, m, j, k + 1, rdiag, wa);
        }
      }
      if (k < n) {
        const ck = k * m;
        let sum = 0;
        for (let i = j; i < m; i++) sum += a[cj + i] * a[ck + i];
        const temp = sum / pj;
        for (let i = j; i < m; i++) a[ck + i] -= temp * a[cj + i];
        if (pivot) downdateNorm(a, m, j, k, rdiag, wa);
      }
    }
    rdiag[j] = -ajnorm;
  }
  return out;
}

/** MINPACK's update of the norm of column k below row j after step j, recomputed when cancellation threatens it. */
function downdateNorm(a: Float64Array, m: number, j: number, k: number, rdiag: Float64Array, wa: Float64Array): void {
  if (rdiag[k] === 0) return;
  const t = a[k * m + j] / rdiag[k];
  rdiag[k] *= Math.sqrt(Math.max(0, 1 - t * t));
  if (0.05 * (rdiag[k] / wa[k]) ** 2 <= EPS) {
    rdiag[k] = euclideanNorm(a, k * m + j + 1, m - j - 1);
    wa[k] = rdiag[k];
  }
}

/**
 * Applies Qᵀ of a factorization to a vector of length m, in place (v ← Qᵀv).
 * @param qr - factorization from {@link householderQr}
 * @param v - vector of length m, overwritten
 * @example applyQt(qr, r) // the first n entries are then Qᵀr restricted to the column space
 */
export function applyQt(qr: HouseholderQr, v: Float64Array): void {
  const { m, n, a } = qr;
  for (let j = 0; j < Math.min(m, n); j++) {
    const cj = j * m;
    const pj = a[cj + j];
    if (pj === 0) continue;
    let sum = 0;
    for (let i = j; i < m; i++) sum += a[cj + i] * v[i];
    const temp = -sum / pj;
    for (let i = j; i < m; i++) v[i] += temp * a[cj + i];
  }
}

/**
 * Applies Q of a factorization to a vector of length m, in place (v ← Qv).
 * @param qr - factorization from {@link householderQr}
 * @param v - vector of length m, overwritten
 * @example applyQ(qr, e) // a column of Q when e is a unit vector
 */
export function applyQ(qr: HouseholderQr, v: Float64Array): void {
  const { m, n, a } = qr;
  for (let j = Math.min(m, n) - 1; j >= 0; j--) {
    const cj = j * m;
    const pj = a[cj + j];
    if (pj === 0) continue;
    let sum = 0;
    for (let i = j; i < m; i++) sum += a[cj + i] * v[i];
    const temp = -sum / pj;
    for (let i = j; i < m; i++) v[i] += temp * a[cj + i];
  }
}
