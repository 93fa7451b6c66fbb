import { euclideanNorm } from './euclidean-norm';

const DWARF = Number.MIN_VALUE * 2 ** 52; // smallest normalised double, as MINPACK's dpmpar(2)

/**
 * Solves the damped least-squares subproblem of one Levenberg–Marquardt step: given A·P = Q·R and
 * qtb = (Qᵀb)[0..n), finds x minimising ‖A x − b‖² + ‖√par·D x‖² where S, the factor of
 * RᵀR + par·D², comes out of a Givens elimination of D against R.
 *
 * Method: MINPACK `qrsolv` (Moré, Garbow & Hillstrom, ANL-80-74). `r` is column-major with leading
 * dimension ld; its strict lower triangle is overwritten with Sᵀ, its upper triangle is kept.
 * Internal to {@link levenbergMarquardt}; arrays are work space of length n.
 * @example qrSolve(n, fjac, m, ipvt, d, qtf, step, sdiag, work)
 */
export function qrSolve(n: number, r: Float64Array, ld: number, ipvt: Int32Array, diag: Float64Array, qtb: Float64Array, x: Float64Array, sdiag: Float64Array, wa: Float64Array): void {
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) r[i + j * ld] = r[j + i * ld];
    x[j] = r[j + j * ld];
    wa[j] = qtb[j];
  }
  for (let j = 0; j < n; j++) {
    const l = ipvt[j];
    if (diag[l] !== 0) {
      for (let k = j; k < n; k++) sdiag[k] = 0;
      sdiag[j] = diag[l];
      let qtbpj = 0;
      for (let k = j; k < n; k++) {
        if (sdiag[k] === 0) continue;
        const rkk = r[k + k * ld];
        let cos: number;
        let sin: number;
        if (Math.abs(rkk) < Math.abs(sdiag[k])) {
          const cotan = rkk / sdiag[k];
          sin = 0.5 / Math.sqrt(0.25 + 0.25 * cotan * cotan);
          cos = sin * cotan;
        } else {
          const tan = sdiag[k] / rkk;
          cos = 0.5 / Math.sqrt(0.25 + 0.25 * tan * tan);
          sin = cos * tan;
        }
        r[k + k * ld] = cos * rkk + sin * sdiag[k];
        const temp = cos * wa[k] + sin * qtbpj;
        qtbpj = -sin * wa[k] + cos * qtbpj;
        wa[k] = temp;
        for (let i = k + 1; i < n; i++) {
          const rik = r[i + k * ld];
          const t = cos * rik + sin * sdiag[i];
          sdiag[i] = -sin * rik + cos * sdiag[i];
          r[i + k * ld] = t;
        }
      }
    }
    sdiag[j] = r[j + j * ld];
    r[j + j * ld] = x[j];
  }
  let nsing = n;
  for (let j = 0; j < n; j++) {
    if (sdiag[j] === 0 && nsing === n) nsing = j;
    if (nsing < n) wa[j] = 0;
  }
  for (let j = nsing - 1; j >= 0; j--) {
    let sum = 0;
    for (let i = j + 1; i < nsing; i++) sum += r[i + j * ld] * wa[i];
    wa[j] = (wa[j] - sum) / sdiag[j];
  }
  for (let j = 0; j < n; j++) x[ipvt[j]] = wa[j];
}

/**
 * Finds the Levenberg–Marquardt parameter par ≥ 0 such that the damped Gauss–Newton step x
 * satisfies ‖D x‖ ≈ delta (within 10 %), or par = 0 when the Gauss–Newton step is already inside
 * the trust region. Returns par; x holds the step (to be subtracted), sdiag the diagonal of S.
 *
 * Method: MINPACK `lmpar` (J. J. Moré, "The Levenberg–Marquardt algorithm: implementation and
 * theory", Numerical Analysis, Lecture Notes in Mathematics 630, Springer 1978, pp. 105–116).
 * Internal to {@link levenbergMarquardt}; units are those of the scaled step D·x.
 * @example par = lmParameter(n, fjac, m, ipvt, diag, qtf, delta, par, step, sdiag, w1, w2)
 */
export function lmParameter(n: number, r: Float64Array, ld: number, ipvt: Int32Array, diag: Float64Array, qtb: Float64Array, delta: number, parIn: number, x: Float64Array, sdiag: Float64Array, wa1: Float64Array, wa2: Float64Array): number {
  let par = parIn;
  let nsing = n;
  for (let j = 0; j < n; j++) {
    wa1[j] = qtb[j];
    if (r[j + j * ld] === 0 && nsing === n) nsing = j;
    if (nsing < n) wa1[j] = 0;
  }
  for (let k = nsing - 1; k >= 0; k--) {
    wa1[k] /= r[k + k * ld];
    const temp = wa1[k];
    for (let i = 0; i < k; i++) wa1[i] -= r[i + k * ld] * temp;
  }
  for (let j = 0; j < n; j++) x[ipvt[j]] = wa1[j];
  for (let j = 0; j < n; j++) wa2[j] = diag[j] * x[j];
  let dxnorm = euclideanNorm(wa2, 0, n);
  let fp = dxnorm - delta;
  if (fp <= 0.1 * delta) return 0;

  let parl = 0;
  if (nsing === n) {
    for (let j = 0; j < n; j++) {
      const l = ipvt[j];
      wa1[j] = diag[l] * (wa2[l] / dxnorm);
    }
    for (let j = 0; j < n; j++) {
      let sum = 0;
      for (let i = 0; i < j; i++) sum += r[i + j * ld] * wa1[i];
      wa1[j] = (wa1[j] - sum) / r[j + j * ld];
    }
    const temp = euclideanNorm(wa1, 0, n);
    parl = fp / delta / temp / temp;
  }
  for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let i = 0; i <= j; i++) sum += r[i + j * ld] * qtb[i];
    wa1[j] = sum / diag[ipvt[j]];
  }
  const gnorm = euclideanNorm(wa1, 0, n);
  let paru = gnorm / delta;
  if (paru === 0) paru = DWARF / Math.min(delta, 0.1);
  par = Math.max(par, parl);
  par = Math.min(par, paru);
  if (par === 0) par = gnorm / dxnorm;

  for (let iter = 1; ; iter++) {
    if (par === 0) par = Math.max(DWARF, 0.001 * paru);
    const sq = Math.sqrt(par);
    for (let j = 0; j < n; j++) wa1[j] = sq * diag[j];
    qrSolve(n, r, ld, ipvt, wa1, qtb, x, sdiag, wa2);
    for (let j = 0; j < n; j++) wa2[j] = diag[j] * x[j];
    dxnorm = euclideanNorm(wa2, 0, n);
    const fpOld = fp;
    fp = dxnorm - delta;
    if (Math.abs(fp) <= 0.1 * delta || (parl === 0 && fp <= fpOld && fpOld < 0) || iter === 10) return par;
    for (let j = 0; j < n; j++) {
      const l = ipvt[j];
      wa1[j] = diag[l] * (wa2[l] / dxnorm);
    }
    for (let j = 0; j < n; j++) {
      wa1[j] /= sdiag[j];
      const temp = wa1[j];
      for (let i = j + 1; i < n; i++) wa1[i] -= r[i + j * ld] * temp;
    }
    const temp = euclideanNorm(wa1, 0, n);
    const parc = fp / delta / temp / temp;
    if (fp > 0) parl = Math.max(parl, par);
    if (fp < 0) paru = Math.min(paru, par);
    par = Math.max(parl, par + parc);
  }
}
