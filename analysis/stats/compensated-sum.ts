/**
 * Sum of an array with Neumaier's improvement of Kahan compensated summation: the error is
 * bounded by about 2ε·Σ|vᵢ| independently of n (A. Neumaier, ZAMM 54 (1974) 39–51).
 *
 * @param v - values (any unit; the result has the same unit)
 * @returns Σ vᵢ (0 for an empty array; NaN or ±Infinity propagate)
 * @example compensatedSum([1e16, 1, -1e16]) // 1
 */
export function compensatedSum(v: ArrayLike<number>): number {
  let sum = 0;
  let c = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    const t = sum + x;
    c += Math.abs(sum) >= Math.abs(x) ? sum - t + x : x - t + sum;
    sum = t;
  }
  return sum + c;
}

/**
 * Compensated sum of the squares of an array (squares formed in double precision).
 * @param v - values
 * @returns Σ vᵢ²
 * @example compensatedSumOfSquares([3, 4]) // 25
 */
export function compensatedSumOfSquares(v: ArrayLike<number>): number {
  let sum = 0;
  let c = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i] * v[i];
    const t = sum + x;
    c += sum >= x ? sum - t + x : x - t + sum;
    sum = t;
  }
  return sum + c;
}
