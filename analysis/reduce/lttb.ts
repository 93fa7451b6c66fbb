/**
 * Largest-triangle-three-buckets downsampling: S. Steinarsson, "Downsampling Time Series for
 * Visual Representation", MSc thesis, University of Iceland, 2013, §4.2. The first and last
 * points are kept; the points between are split into `target − 2` buckets of equal count, and
 * from each bucket the point is kept that makes the largest triangle with the point kept from the
 * bucket before and the mean of the bucket after. One pass, no allocation but the output.
 */
import { allIndices, checkSeries, pick, type Series } from './series-check';

export type { Series } from './series-check';

/** A reduced series: the kept indices (ascending) and their coordinates. */
export interface ReducedSeries {
  indices: Uint32Array;
  x: Float64Array;
  y: Float64Array;
}

/**
 * Runs LTTB over `buckets` buckets between the endpoints and, for each, calls
 * `visit(bucket, from, to, chosen)` with the bucket's index range [from, to) and the kept index,
 * so that variants can read each bucket's own points. Shared with lttb-extremes.ts.
 * @internal
 */
export function lttbBuckets(
  x: Series, y: Series, buckets: number, visit: (bucket: number, from: number, to: number, chosen: number) => void,
): void {
  const n = x.length;
  const every = (n - 2) / buckets;
  let a = 0;
  for (let b = 0; b < buckets; b++) {
    const from = Math.floor(b * every) + 1;
    const to = Math.min(Math.floor((b + 1) * every) + 1, n - 1);
    // mean of the next bucket (the last point for the last bucket)
    const nFrom = to, nTo = b === buckets - 1 ? n : Math.min(Math.floor((b + 2) * every) + 1, n - 1);
    let sx = 0, sy = 0;
    for (let j = nFrom; j < nTo; j++) { sx += x[j]; sy += y[j]; }
    const cnt = nTo - nFrom;
    const mx = sx / cnt, my = sy / cnt;
    const ax = x[a], ay = y[a];
    let best = -1, chosen = from;
    for (let j = from; j < to; j++) {
      // twice the triangle's area; the factor ½ does not change which point wins
      const area = Math.abs((ax - mx) * (y[j] - ay) - (ax - x[j]) * (my - ay));
      if (area > best) { best = area; chosen = j; }
    }
    visit(b, from, to, chosen);
    a = chosen;
  }
}

/**
 * Indices kept by LTTB.
 * @param x abscissae (time s, flow m³/s …), finite and non-decreasing
 * @param y ordinates, finite, same length and any unit
 * @param target number of points to keep, an integer ≥ 2; a series of `target` points or fewer
 *   comes back whole
 * @returns ascending indices, `min(n, target)` of them, first 0 and last n − 1
 * @throws TypeError for a non-finite value; RangeError for unequal lengths, decreasing x, or a
 *   target that is not an integer ≥ 2.
 * @example lttbIndices([0, 1, 2, 3, 4], [0, 5, 0, -5, 0], 3) // Uint32Array [0, 1, 4]: of equal areas the first wins
 */
export function lttbIndices(x: Series, y: Series, target: number): Uint32Array {
  const n = checkSeries(x, y, target, 2);
  if (n <= target) return allIndices(n);
  const out = new Uint32Array(target);
  out[target - 1] = n - 1;
  if (target > 2) lttbBuckets(x, y, target - 2, (b, _f, _t, chosen) => { out[b + 1] = chosen; });
  return out;
}

/**
 * LTTB-reduced copy of a series (see {@link lttbIndices}).
 * @example lttb(timeS, tempC, 2000).y.length // ≤ 2000
 */
export function lttb(x: Series, y: Series, target: number): ReducedSeries {
  return pick(x, y, lttbIndices(x, y, target));
}
