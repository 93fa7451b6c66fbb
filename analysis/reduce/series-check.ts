/**
 * Shared argument checks of the point reducers: x and y of equal length, every value finite, x
 * non-decreasing (a time or flow axis), and an integer target count. STYLE.md §10: malformed
 * input throws and echoes the bad value; NaN never reaches the output.
 */

/** Numbers the reducers read: plain arrays or typed arrays. */
export type Series = ArrayLike<number>;

/**
 * @param x abscissae (any unit), finite and non-decreasing
 * @param y ordinates (any unit), finite, same length as x
 * @param target wanted number of points, an integer ≥ `minTarget`
 * @returns the series length
 * @throws TypeError when x or y is not array-like or holds a non-finite value; RangeError for
 *   unequal lengths, a decreasing x, or a target that is not an integer ≥ `minTarget`.
 * @example checkSeries([0, 1, 2], [5, 6, 4], 3, 3) // 3
 */
export function checkSeries(x: Series, y: Series, target: number, minTarget: number): number {
  if (x == null || typeof x.length !== 'number') throw new TypeError(`x must be an array of numbers, got ${String(x)}`);
  if (y == null || typeof y.length !== 'number') throw new TypeError(`y must be an array of numbers, got ${String(y)}`);
  const n = x.length;
  if (y.length !== n) throw new RangeError(`x and y must have the same length, got ${n} and ${y.length}`);
  if (!Number.isInteger(target) || target < minTarget) {
    throw new RangeError(`target must be an integer of at least ${minTarget}, got ${String(target)}`);
  }
  let prev = -Infinity;
  for (let i = 0; i < n; i++) {
    const xi = x[i], yi = y[i];
    if (typeof xi !== 'number' || !Number.isFinite(xi)) throw new TypeError(`x[${i}] must be a finite number, got ${String(xi)}`);
    if (typeof yi !== 'number' || !Number.isFinite(yi)) throw new TypeError(`y[${i}] must be a finite number, got ${String(yi)}`);
    if (xi < prev) throw new RangeError(`x must be non-decreasing, but x[${i}] = ${xi} follows ${prev}`);
    prev = xi;
  }
  return n;
}

/** Indices 0…n−1, for a series already short enough. */
export function allIndices(n: number): Uint32Array {
  const out = new Uint32Array(n);
  for (let i = 0; i < n; i++) out[i] = i;
  return out;
}

/** The points at `indices`, as typed arrays. */
export function pick(x: Series, y: Series, indices: Uint32Array): { indices: Uint32Array; x: Float64Array; y: Float64Array } {
  const px = new Float64Array(indices.length), py = new Float64Array(indices.length);
  for (let k = 0; k < indices.length; k++) { px[k] = x[indices[k]]; py[k] = y[indices[k]]; }
  return { indices, x: px, y: py };
}
