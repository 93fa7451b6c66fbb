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
