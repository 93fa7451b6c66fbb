/*
 * Linear least squares by Householder QR with column pivoting on power-of-two-scaled columns,
 * never by normal equations. `ml-regression-polynomial` was measured against NIST StRD
 * (../shared/STACK.md): Wampler1/4/5 reach LRE 6.5 (bar 7) and Filip LRE 0, so it is not used.
 * Accuracy beyond plain QR comes from Björck's iterative refinement of the augmented system
 * [I A; Aᵀ 0][r; x] = [y; 0] with residuals accumulated in double-double arithmetic
 * (Å. Björck, "Iterative refinement of linear least squares solutions I", BIT 7 (1967) 257–278).
 */
import { DotAccumulator, twoProduct } from './double-double';
import { powerOfTwoScale } from './euclidean-norm';
import { applyQ, applyQt, householderQr } from './householder-qr';

const EPS = 2.220446049250313e-16;

/** Work arrays reused from call to call up to this many entries each (bounded memory; a fresh
 * typed array costs more than the solve of a small problem). The solver runs to its end without
 * yielding and never calls itself, so one set serves every call. */
const KEPT_ENTRIES = 1 << 16;
const pool: Float64Array[] = [];
/** A work array of exactly `length` entries (contents undefined). */
function buffer(slot: number, length: number): Float64Array {
  if (length > KEPT_ENTRIES) return new Float64Array(length);
  let b = pool[slot];
  if (b === undefined || b.length < length) pool[slot] = b = new Float64Array(Math.max(length, 64));
  return b.length === length ? b : b.subarray(0, length);
}

/** Result of {@link linearLeastSquares}. */
export type LinearLeastSquaresResult =
  | { ok: true; coefficients: Float64Array; residuals: Float64Array; rss: number; refinementSteps: number }
  | { ok: false; reason: string };

/**
 * Solves min ‖y − Σⱼ bⱼ·columnⱼ‖₂.
 *
 * @param columns - the design matrix by columns, each of length m (any units)
 * @param y - responses, length m
 * @param options.columnsLo - optional low-order parts of the columns (hi + lo represents each entry to
 *   about 32 digits, e.g. powers of x from {@link polynomialDesign}); used in the refinement residuals
 * @param options.maxSteps - solve-and-refine steps (default 20; 1 is a plain QR solve)
 * @returns coefficients (units of y per unit of each column), residuals y − Xb and their sum of squares,
 *   or `{ ok: false }` when the columns are linearly dependent to working precision or fewer rows than columns
 * @throws RangeError when the column lengths differ from y
 * @example linearLeastSquares([[1, 1, 1], [0, 1, 2]], [1, 3, 5]) // coefficients [1, 2]
 */
export function linearLeastSquares(columns: ArrayLike<number>[], y: ArrayLike<number>, options: { columnsLo?: ArrayLike<number>[]; maxSteps?: number } = {}): LinearLeastSquaresResult {
  const m = y.length;
  const p = columns.length;
  for (const c of columns) if (c.length !== m) throw new RangeError(`linearLeastSquares: a column has ${c.length} rows, y has ${m}`);
  if (p === 0) return { ok: false, reason: 'no columns in the design' };
  if (m < p) return { ok: false, reason: `${m} points cannot determine ${p} coefficients` };
  const lo = options.columnsLo;
  const scale = new Float64Array(p);
  const aHi = buffer(0, m * p);
  const aLo = buffer(1, m * p);
  for (let j = 0; j < p; j++) {
    scale[j] = powerOfTwoScale(columns[j], 0, m); // exact: a power of two
    if (!(scale[j] > 0)) return { ok: false, reason: `column ${j + 1} of the design is ${scale[j] === 0 ? 'all zero' : 'not finite'}` };
    for (let i = 0; i < m; i++) {
      aHi[i + j * m] = columns[j][i] * scale[j];
      aLo[i + j * m] = lo ? lo[j][i] * scale[j] : 0;
    }
  }
  const factored = buffer(2, m * p);
  factored.set(aHi);
  const qr = householderQr(factored, m, p, true);
  const rAbs0 = Math.abs(qr.rdiag[0]);
  for (let k = 0; k < p; k++) {
    if (!(Math.abs(qr.rdiag[k]) > EPS * Math.max(m, p) * rAbs0)) {
      return { ok: false, reason: 'the design columns are linearly dependent (for example all x equal, or too few distinct x for the degree)' };
    }
  }
  const x = new Float64Array(p);
  const r = new Float64Array(m);
  const f = buffer(3, m);
  const g = new Float64Array(p);
  const u = buffer(4, m);
  const z = new Float64Array(p);
  const d = buffer(5, m);
  const acc = new DotAccumulator();
  let steps = 0;
  const maxSteps = options.maxSteps ?? 20;
  for (let it = 0; it < maxSteps; it++) {
    steps = it + 1;
    for (let i = 0; i < m; i++) {
      acc.reset();
      acc.addDd(y[i], 0);
      acc.addDd(-r[i], 0);
      for (let j = 0; j < p; j++) acc.addProduct(-aHi[i + j * m], -aLo[i + j * m], x[j], 0);
      f[i] = acc.value();
    }
    for (let j = 0; j < p; j++) {
      acc.reset();
      for (let i = 0; i < m; i++) acc.addProduct(-aHi[i + j * m], -aLo[i + j * m], r[i], 0);
      g[j] = acc.value();
    }
    // Rᵀ u1 = Pᵀ g (forward substitution)
    for (let k = 0; k < p; k++) {
      let s = g[qr.ipvt[k]];
      for (let i = 0; i < k; i++) s -= qr.a[i + k * m] * u[i];
      u[k] = s / qr.rdiag[k];
    }
    d.set(f);
    applyQt(qr, d);
    for (let k = p - 1; k >= 0; k--) {
      let s = d[k] - u[k];
      for (let j = k + 1; j < p; j++) s -= qr.a[k + j * m] * z[j];
      z[k] = s / qr.rdiag[k];
    }
    for (let i = p; i < m; i++) u[i] = d[i];
    applyQ(qr, u);
    let converged = it > 0;
    for (let k = 0; k < p; k++) {
      const j = qr.ipvt[k];
      x[j] += z[k];
      if (Math.abs(z[k]) > 4 * EPS * Math.abs(x[j])) converged = false;
    }
    for (let i = 0; i < m; i++) r[i] += u[i];
    if (converged) break;
  }
  const coefficients = new Float64Array(p);
  for (let j = 0; j < p; j++) coefficients[j] = x[j] * scale[j];
  let rss = 0;
  for (let i = 0; i < m; i++) rss += r[i] * r[i];
  return { ok: true, coefficients, residuals: r, rss, refinementSteps: steps };
}

/**
 * Columns 1, x, x², …, x^degree (or without the 1) with each power also given as a low-order part,
 * so that hi + lo equals the exact power to about 32 significant digits.
 *
 * @param x - predictor values (unit u)
 * @param degree - polynomial degree, integer ≥ 1
 * @param intercept - include the constant column (default true)
 * @returns `{ columns, columnsLo }` for {@link linearLeastSquares}; column k has unit u^k
 * @throws RangeError when degree is not a positive integer
 * @example polynomialDesign([2, 3], 2).columns // [[1, 1], [2, 3], [4, 9]]
 */
export function polynomialDesign(x: ArrayLike<number>, degree: number, intercept = true): { columns: Float64Array[]; columnsLo: Float64Array[] } {
  if (!Number.isInteger(degree) || degree < 1) throw new RangeError(`polynomialDesign: degree must be a positive integer, got ${degree}`);
  const m = x.length;
  const columns: Float64Array[] = [];
  const columnsLo: Float64Array[] = [];
  let hi: Float64Array = new Float64Array(m).fill(1);
  let lo: Float64Array = new Float64Array(m);
  if (intercept) {
    columns.push(hi);
    columnsLo.push(lo);
  }
  const t = new Float64Array(2);
  const p = new Float64Array(2);
  for (let k = 1; k <= degree; k++) {
    const nh = new Float64Array(m);
    const nl = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      // (hi + lo)·x as a double-double
      twoProduct(hi[i], x[i], p);
      const pr = p[0];
      const err = p[1] + lo[i] * x[i];
      t[0] = pr + err;
      t[1] = err - (t[0] - pr);
      nh[i] = t[0];
      nl[i] = t[1];
    }
    columns.push(nh);
    columnsLo.push(nl);
    hi = nh;
    lo = nl;
  }
  return { columns, columnsLo };
}
