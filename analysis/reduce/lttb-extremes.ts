/**
 * LTTB that never loses an extreme: the buckets of Steinarsson's largest-triangle-three-buckets
 * (MSc thesis, University of Iceland, 2013) each contribute their LTTB point *and* their own
 * minimum and maximum of y, so a one-sample spike (a boil-over, a sensor glitch a reviewer must
 * see) survives. Every point lies in a bucket or is an endpoint, so the global minimum and maximum
 * of y are always kept. Up to three points per bucket: `floor((target − 2) / 3)` buckets.
 */
import { lttbBuckets, type ReducedSeries } from './lttb';
import { allIndices, checkSeries, pick, type Series } from './series-check';

/**
 * Indices kept by LTTB plus each bucket's min and max of y.
 * @param x abscissae, finite and non-decreasing
 * @param y ordinates, finite, same length
 * @param target most points to keep, an integer ≥ 5 (two endpoints and one bucket of three);
 *   a series of `target` points or fewer comes back whole
 * @returns ascending distinct indices, at most `target`, with 0, n − 1 and the indices of the
 *   first global minimum and maximum of y among them
 * @throws TypeError for a non-finite value; RangeError for unequal lengths, decreasing x, or a
 *   target that is not an integer ≥ 5.
 * @example lttbExtremesIndices(timeS, tempC, 2000) // the spike at 12:03 is kept
 */
export function lttbExtremesIndices(x: Series, y: Series, target: number): Uint32Array {
  const n = checkSeries(x, y, target, 5);
  if (n <= target) return allIndices(n);
  const buckets = Math.floor((target - 2) / 3);
  const out = new Uint32Array(target);
  let k = 0;
  out[k++] = 0;
  lttbBuckets(x, y, buckets, (_b, from, to, chosen) => {
    let lo = from, hi = from;
    for (let j = from + 1; j < to; j++) {
      if (y[j] < y[lo]) lo = j;
      if (y[j] > y[hi]) hi = j;
    }
    // the three in ascending order, each once
    const a = Math.min(lo, hi, chosen), c = Math.max(lo, hi, chosen);
    const m = lo + hi + chosen - a - c;
    out[k++] = a;
    if (m !== a) out[k++] = m;
    if (c !== m) out[k++] = c;
  });
  out[k++] = n - 1;
  return out.slice(0, k);
}

/**
 * Reduced copy of a series keeping LTTB shape and every bucket's extremes (see
 * {@link lttbExtremesIndices}).
 * @example lttbExtremes(timeS, tempC, 2000).y // includes Math.max(...tempC)
 */
export function lttbExtremes(x: Series, y: Series, target: number): ReducedSeries {
  return pick(x, y, lttbExtremesIndices(x, y, target));
}
