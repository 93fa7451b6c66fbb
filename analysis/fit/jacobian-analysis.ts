import { powerOfTwoScale } from './euclidean-norm';
import { applyQ, householderQr } from './householder-qr';
import { singularValues } from './singular-values';

/** Condition number above which the Jacobian counts as singular (parameters not identifiable). */
export const SINGULAR_CONDITION = 1e14;

/** What the final Jacobian tells about the parameters. */
export interface JacobianAnalysis {
  /** (JᵀJ)⁻¹, n×n, row-major; multiply by s² for the covariance */
  inverse: Float64Array;
  /** hat-matrix diagonal h_ii = ‖row i of Q₁‖², in [0, 1] */
  leverage: Float64Array;
  /** 2-norm condition number of J with unit-norm columns */
  conditionNumber: number;
}

/**
 * Covariance factor, leverage and conditioning from the weighted Jacobian at the solution, by
 * Householder QR with column pivoting on power-of-two-scaled columns (J D P = Q R):
 * (JᵀJ)⁻¹ = D P R⁻¹ R⁻ᵀ Pᵀ D, never by inverting JᵀJ. Condition number from the singular values
 * of R (one-sided Jacobi).
 *
 * @param jac - column-major m×n weighted Jacobian ∂(√w·f)/∂p (copied)
 * @param m - rows (points)
 * @param n - columns (parameters)
 * @returns the analysis, or a reason naming the parameter(s) that cannot be determined
 * @example analyseJacobian(Float64Array.of(1, 1, 1, 0, 1, 2), 3, 2).leverage // [5/6, 1/3, 5/6]
 */
export function analyseJacobian(jac: ArrayLike<number>, m: number, n: number, names: string[] = []): { ok: true; analysis: JacobianAnalysis } | { ok: false; reason: string } {
  const a = new Float64Array(m * n);
  const d = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    d[j] = powerOfTwoScale(jac, j * m, m);
    if (!(d[j] > 0)) {
      return { ok: false, reason: `the model does not depend on parameter ${names[j] ?? j + 1} at the solution (zero or non-finite Jacobian column)` };
    }
    for (let i = 0; i < m; i++) a[i + j * m] = jac[i + j * m] * d[j];
  }
  const qr = householderQr(a, m, n, true);
  const r = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = 0; i <= j; i++) r[i + j * n] = i === j ? qr.rdiag[j] : qr.a[i + j * m];
  const sv = singularValues(r, n, n);
  const conditionNumber = sv[n - 1] > 0 ? sv[0] / sv[n - 1] : Infinity;
  if (!(conditionNumber < SINGULAR_CONDITION)) {
    const k = qr.ipvt[n - 1];
    return { ok: false, reason: `the parameters cannot be separated from the data (Jacobian condition number ${conditionNumber.toExponential(1)}); ${names[k] ?? `parameter ${k + 1}`} is the least determined` };
  }
  // R⁻¹ by back substitution, column by column (upper triangular)
  const rinv = new Float64Array(n * n);
  for (let c = 0; c < n; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let k = i + 1; k <= c; k++) s -= r[i + k * n] * rinv[k + c * n];
      rinv[i + c * n] = s / r[i + i * n];
    }
  }
  const inverse = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = Math.max(i, j); k < n; k++) s += rinv[i + k * n] * rinv[j + k * n];
      const pi = qr.ipvt[i];
      const pj = qr.ipvt[j];
      inverse[pi * n + pj] = s * d[pi] * d[pj];
    }
  }
  const leverage = new Float64Array(m);
  const e = new Float64Array(m);
  for (let k = 0; k < n; k++) {
    e.fill(0);
    e[k] = 1;
    applyQ(qr, e);
    for (let i = 0; i < m; i++) leverage[i] += e[i] * e[i];
  }
  for (let i = 0; i < m; i++) leverage[i] = Math.min(1, leverage[i]);
  return { ok: true, analysis: { inverse, leverage, conditionNumber } };
}
