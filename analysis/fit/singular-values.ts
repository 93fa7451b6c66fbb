/**
 * Singular values of a small dense matrix by one-sided Jacobi rotations (Hestenes 1958; see
 * J. Demmel & K. Veselić, SIAM J. Matrix Anal. Appl. 13 (1992) 1204–1245), which computes even the
 * smallest singular values to high relative accuracy.
 *
 * @param a - column-major m×n matrix (copied, not modified)
 * @param m - rows
 * @param n - columns
 * @returns the n singular values in decreasing order (unit of the entries)
 * @example singularValues(Float64Array.of(3, 0, 0, 4), 2, 2) // [4, 3]
 */
export function singularValues(a: ArrayLike<number>, m: number, n: number): number[] {
  const u = Float64Array.from(a);
  for (let sweep = 0; sweep < 60; sweep++) {
    let rotated = false;
    for (let j = 0; j < n - 1; j++) {
      for (let k = j + 1; k < n; k++) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < m; i++) {
          const x = u[i + j * m];
          const y = u[i + k * m];
          alpha += x * x;
          beta += y * y;
          gamma += x * y;
        }
        if (gamma === 0 || Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta)) continue;
        rotated = true;
        const zeta = (beta - alpha) / (2 * gamma);
        const t = Math.sign(zeta || 1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < m; i++) {
          const x = u[i + j * m];
          const y = u[i + k * m];
          u[i + j * m] = c * x - s * y;
          u[i + k * m] = s * x + c * y;
        }
      }
    }
    if (!rotated) break;
  }
  const sv: number[] = [];
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) s = Math.hypot(s, u[i + j * m]);
    sv.push(s);
  }
  return sv.sort((p, q) => q - p);
}
