/**
 * Small symmetric matrices for experimental design: the information matrix M = Σ gᵢ·gᵢᵀ of a
 * design (g = sensitivities of the response to the parameters at one setting), its log-determinant
 * and inverse by Cholesky. Written here rather than with mathjs because the exchange search of
 * d-optimal-design.ts evaluates tens of thousands of 2×2 and 3×3 determinants and mathjs's
 * general `det` costs microseconds each; row-major p×p Float64Arrays, p ≤ a few.
 */

/**
 * M = Σ mᵢ·gᵢ·gᵢᵀ over rows gᵢ (optionally with multiplicities mᵢ).
 * @param rows sensitivity rows, each of length p (unit of y per unit of each parameter)
 * @param p number of parameters
 * @param counts optional multiplicity (or weight) of each row
 * @returns p×p row-major matrix
 * @example informationMatrix([[1, 0], [1, 1]], 2) // [2, 1, 1, 1]
 */
export function informationMatrix(rows: ArrayLike<number>[], p: number, counts?: ArrayLike<number>): Float64Array {
  const m = new Float64Array(p * p);
  rows.forEach((g, k) => addOuter(m, g, counts ? counts[k] : 1));
  return m;
}

/**
 * M += c·g·gᵀ in place (c = −1 removes a run).
 * @example const m = new Float64Array(4); addOuter(m, [1, 2]); // m = [1, 2, 2, 4]
 */
export function addOuter(m: Float64Array, g: ArrayLike<number>, c = 1): void {
  const p = g.length;
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) m[i * p + j] += c * g[i] * g[j];
}

/**
 * Lower Cholesky factor of a symmetric matrix, or null when it is not positive definite to working
 * precision (a pivot below 1e-12 of its diagonal entry: the columns are dependent to about 6 digits).
 */
function cholesky(m: ArrayLike<number>, p: number): Float64Array | null {
  const l = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    let d = m[j * p + j];
    for (let k = 0; k < j; k++) d -= l[j * p + k] ** 2;
    if (!(d > 1e-12 * m[j * p + j]) || !Number.isFinite(d)) return null;
    const ljj = Math.sqrt(d);
    l[j * p + j] = ljj;
    for (let i = j + 1; i < p; i++) {
      let s = m[i * p + j];
      for (let k = 0; k < j; k++) s -= l[i * p + k] * l[j * p + k];
      l[i * p + j] = s / ljj;
    }
  }
  return l;
}

/**
 * log det M, −Infinity when M is singular or not positive definite.
 * @example logDet(Float64Array.of(2, 1, 1, 1), 2) // 0 (det = 1)
 */
export function logDet(m: ArrayLike<number>, p: number): number {
  const l = cholesky(m, p);
  if (!l) return -Infinity;
  let s = 0;
  for (let j = 0; j < p; j++) s += Math.log(l[j * p + j]);
  return 2 * s;
}

/**
 * M⁻¹ of a symmetric positive definite matrix, or null when it is singular.
 * @example symmetricInverse(Float64Array.of(2, 1, 1, 1), 2) // [1, -1, -1, 2]
 */
export function symmetricInverse(m: ArrayLike<number>, p: number): Float64Array | null {
  const l = cholesky(m, p);
  if (!l) return null;
  const inv = new Float64Array(p * p);
  const col = new Float64Array(p);
  for (let c = 0; c < p; c++) {
    // solve L·y = e_c, then Lᵀ·x = y
    for (let i = 0; i < p; i++) {
      let s = i === c ? 1 : 0;
      for (let k = 0; k < i; k++) s -= l[i * p + k] * col[k];
      col[i] = s / l[i * p + i];
    }
    for (let i = p - 1; i >= 0; i--) {
      let s = col[i];
      for (let k = i + 1; k < p; k++) s -= l[k * p + i] * col[k];
      col[i] = s / l[i * p + i];
    }
    for (let i = 0; i < p; i++) inv[i * p + c] = col[i];
  }
  return inv;
}

/**
 * gᵀ·A·g for a p×p row-major A: the variance of a prediction with sensitivities g (A a covariance).
 * @example quadraticForm(Float64Array.of(2, 0, 0, 3), [1, 1]) // 5
 */
export function quadraticForm(a: ArrayLike<number>, g: ArrayLike<number>): number {
  const p = g.length;
  let v = 0;
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) v += g[i] * a[i * p + j] * g[j];
  return v;
}
