/**
 * Euclidean norm of `v[offset .. offset+length)` with scaling, so that neither overflow nor underflow
 * occurs for entries of any representable magnitude (the idea of MINPACK's `enorm`: J. J. Moré,
 * B. S. Garbow, K. E. Hillstrom, User Guide for MINPACK-1, ANL-80-74, 1980).
 *
 * @param v - vector (any unit; the result has the same unit)
 * @param offset - first index, default 0
 * @param length - number of entries, default to the end of v
 * @returns ‖v‖₂, ≥ 0 (NaN when an entry is NaN, Infinity when one is infinite)
 * @example euclideanNorm(Float64Array.of(3, 4)) // 5
 */
export function euclideanNorm(v: ArrayLike<number>, offset = 0, length = v.length - offset): number {
  let scale = 0;
  for (let i = offset; i < offset + length; i++) {
    const a = Math.abs(v[i]);
    if (a !== a) return NaN; // a NaN entry must not pass as a zero norm
    if (a > scale) scale = a;
  }
  if (scale === 0 || !Number.isFinite(scale)) return scale;
  let sum = 0;
  for (let i = offset; i < offset + length; i++) {
    const t = v[i] / scale;
    sum += t * t;
  }
  return scale * Math.sqrt(sum);
}

/**
 * 2^−round(log2 ‖v‖₂) for `v[offset .. offset+length)`: the power of two that brings a column to
 * about unit norm, an exact scaling (used before the QR factorizations). ‖v‖₂ is by definition the
 * running Math.hypot over the entries, which never overflows; as only its binary exponent is used,
 * a plain sum of squares decides whenever log2 of its root is clearly away from a rounding tie:
 * both norms are within 10·length ulps of the true one (Higham, Accuracy and Stability of Numerical
 * Algorithms, 2nd ed., §3.1), which moves log2 by less than 1e-8 for up to 10⁷ entries, against a
 * margin of 1e-6. Otherwise (near a tie, near the ends of the double range, zero or non-finite
 * entries) the running hypot itself is computed, so the scale is always the one of that norm.
 *
 * @param v - vector (any unit)
 * @param offset - first index
 * @param length - number of entries
 * @returns the scale (1/unit), 0 when every entry is zero, NaN when an entry is not finite
 * @example powerOfTwoScale(Float64Array.of(3, 4), 0, 2) // 0.25 (‖v‖ = 5, log2 5 ≈ 2.32)
 */
export function powerOfTwoScale(v: ArrayLike<number>, offset: number, length: number): number {
  let sum = 0;
  for (let i = offset; i < offset + length; i++) sum += v[i] * v[i];
  if (sum > 1e-290 && sum < 1e290 && length <= 1e7) {
    const l = Math.log2(Math.sqrt(sum));
    const k = Math.round(l);
    if (Math.abs(l - k) < 0.5 - 1e-6) return 2 ** -k;
  }
  let norm = 0;
  for (let i = offset; i < offset + length; i++) norm = Math.hypot(norm, v[i]);
  if (norm === 0) return 0;
  if (!Number.isFinite(norm)) return Number.NaN;
  return 2 ** -Math.round(Math.log2(norm));
}
