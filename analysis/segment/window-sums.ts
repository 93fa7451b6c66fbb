/**
 * Prefix sums and trailing moving averages over a time base, the building blocks of the
 * segmenter: any window's mean, variance and least-squares slope in O(1) after an O(n) pass.
 * Values are offset by their first sample before summing, which keeps the cancellation in
 * Σy² − (Σy)²/n small for channels such as temperatures that sit far from zero.
 */

/** Σ of `values[k] − offset` for k < i, at index i (length n + 1). */
export function prefixSums(values: ArrayLike<number>, offset: number): Float64Array {
  const n = values.length;
  const p = new Float64Array(n + 1);
  let s = 0;
  for (let i = 0; i < n; i++) { s += values[i] - offset; p[i + 1] = s; }
  return p;
}

/** Σ of (a[k] − oa)(b[k] − ob) for k < i (length n + 1); a = b gives the sums of squares. */
export function prefixProducts(a: ArrayLike<number>, oa: number, b: ArrayLike<number>, ob: number): Float64Array {
  const n = a.length;
  const p = new Float64Array(n + 1);
  let s = 0;
  for (let i = 0; i < n; i++) { s += (a[i] - oa) * (b[i] - ob); p[i + 1] = s; }
  return p;
}

/**
 * Centred moving average over `spanS` seconds: at i, the mean of the samples with
 * |t[k] − t[i]| ≤ spanS / 2 in i's gap-free span (centred, so a step is not smeared forward
 * into the next plateau). spanS = 0 copies.
 * @param timeS strictly increasing, s
 * @param spanStart index of the first sample of i's gap-free span, per sample
 */
export function centredMean(timeS: ArrayLike<number>, values: ArrayLike<number>, spanS: number, spanStart: Int32Array): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  if (spanS <= 0) { for (let i = 0; i < n; i++) out[i] = values[i]; return out; }
  const half = spanS / 2;
  const off = n > 0 ? values[0] : 0;
  let lo = 0, hi = -1, sum = 0; // window [lo, hi]
  for (let i = 0; i < n; i++) {
    if (spanStart[i] === i) { lo = i; hi = i - 1; sum = 0; } // a new gap-free span starts here
    while (hi + 1 < n && spanStart[hi + 1] === spanStart[i] && timeS[hi + 1] - timeS[i] <= half) { hi++; sum += values[hi] - off; }
    while (timeS[i] - timeS[lo] > half) { sum -= values[lo] - off; lo++; }
    out[i] = sum / (hi - lo + 1) + off;
  }
  return out;
}
