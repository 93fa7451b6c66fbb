/**
 * Sliding-window sums and centred moving averages over a time base, the building blocks of the
 * segmenter: any window's mean, variance and least-squares slope in O(1) per step.
 * Values are offset by their first sample before summing, which keeps the cancellation in
 * Σy² − (Σy)²/n small for channels such as temperatures that sit far from zero.
 */

/**
 * The sum over a sliding window [s, i] of `a[k] − oa`, or of `(a[k] − oa)(b[k] − ob)` when `b` is
 * given, as the difference of two running prefix sums: the head (through sample i) and the tail
 * (through sample s − 1). Each is built by the same additions in the same order as a full array of
 * prefix sums would be, so the window sums are the same numbers bit for bit — without an array of
 * n + 1 doubles per channel (for a million samples, 8 MB each, which are slow to fault in).
 * @example
 *   const w = new SlidingSum(y, y[0]);
 *   for (let i = 0; i < n; i++) { w.add(i); while (…) w.drop(s++); mean = w.sum / (i - s + 1) + y[0]; }
 */
export class SlidingSum {
  private head = 0;
  private tail = 0;
  constructor(
    private readonly a: ArrayLike<number>,
    private readonly oa: number,
    private readonly b: ArrayLike<number> | null = null,
    private readonly ob = 0,
  ) {}
  /** the term of sample k */
  private term(k: number): number {
    return this.b === null ? this.a[k] - this.oa : (this.a[k] - this.oa) * (this.b[k] - this.ob);
  }
  /** adds sample i at the head (i = 0, 1, … in order) */
  add(i: number) { this.head += this.term(i); }
  /** moves the tail past sample s (s = the window's first sample, in order) */
  drop(s: number) { this.tail += this.term(s); }
  /** starts an empty window at the next sample to be added */
  restart() { this.tail = this.head; }
  /** the sum over the window */
  get sum(): number { return this.head - this.tail; }
}

/** The long passes pause (yield) after each slice of this many samples (see segmentLogSteps). */
export const SLICE = 1 << 16;

/**
 * Centred moving average over `spanS` seconds: at i, the mean of the samples with
 * |t[k] − t[i]| ≤ spanS / 2 in i's gap-free span (centred, so a step is not smeared forward
 * into the next plateau). spanS = 0 copies.
 * @param timeS strictly increasing, s
 * @param spanStart index of the first sample of i's gap-free span, per sample
 */
export function centredMean(timeS: ArrayLike<number>, values: ArrayLike<number>, spanS: number, spanStart: Int32Array): Float64Array {
  const steps = centredMeanSteps(timeS, values, spanS, spanStart);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/**
 * `centredMean` in slices of SLICE samples (a generator; its return value is the average). The
 * loop itself is a plain function, which V8 optimises while it runs (it does not replace a
 * generator's frame mid-loop).
 */
export function* centredMeanSteps(timeS: ArrayLike<number>, values: ArrayLike<number>, spanS: number, spanStart: Int32Array): Generator<void, Float64Array, void> {
  const n = values.length;
  const out = new Float64Array(n);
  if (spanS <= 0) { for (let i = 0; i < n; i++) out[i] = values[i]; return out; }
  const w = { half: spanS / 2, off: n > 0 ? values[0] : 0, lo: 0, hi: -1, sum: 0 }; // window [lo, hi]
  for (let from = 0; from < n; from += SLICE) {
    if (from > 0) yield;
    centredMeanSlice(timeS, values, spanStart, out, w, from, Math.min(n, from + SLICE));
  }
  return out;
}

function centredMeanSlice(timeS: ArrayLike<number>, values: ArrayLike<number>, spanStart: Int32Array, out: Float64Array,
  w: { half: number; off: number; lo: number; hi: number; sum: number }, from: number, to: number) {
  const n = values.length, half = w.half, off = w.off;
  let lo = w.lo, hi = w.hi, sum = w.sum;
  for (let i = from; i < to; i++) {
    if (spanStart[i] === i) { lo = i; hi = i - 1; sum = 0; } // a new gap-free span starts here
    while (hi + 1 < n && spanStart[hi + 1] === spanStart[i] && timeS[hi + 1] - timeS[i] <= half) { hi++; sum += values[hi] - off; }
    while (timeS[i] - timeS[lo] > half) { sum -= values[lo] - off; lo++; }
    out[i] = sum / (hi - lo + 1) + off;
  }
  w.lo = lo; w.hi = hi; w.sum = sum;
}
