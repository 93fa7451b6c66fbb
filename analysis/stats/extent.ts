/**
 * Smallest and largest value of an array in one pass, without spreading it into Math.min/Math.max
 * (which fails with a RangeError for arrays of a few hundred thousand values).
 *
 * @param v - values (any unit), at least one
 * @returns [min, max] in the unit of v (NaN entries are skipped)
 * @throws RangeError for an empty array
 * @example extent([3, 1, 2]) // [1, 3]
 */
export function extent(v: ArrayLike<number>): [number, number] {
  if (v.length === 0) throw new RangeError('extent: the array is empty');
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  return [lo, hi];
}
