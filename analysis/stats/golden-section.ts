/**
 * Golden-section search for the maximum of a unimodal function on [lo, hi] (J. Kiefer, "Sequential
 * minimax search for a maximum", Proc. AMS 4 (1953); any numerical-methods text): the bracket shrinks
 * by (√5 − 1)/2 per evaluation. The one copy used by the heat optimum, the flow choice and the
 * design search.
 * @param f the function to maximise
 * @param lo lower end of the bracket
 * @param hi upper end, > lo
 * @param options.maxIterations at most this many shrinks (default 100)
 * @param options.relTol stop when hi − lo ≤ relTol·|hi| (default 1e-12)
 * @returns the midpoint of the final bracket
 * @example goldenSectionMax((x) => -(x - 2) ** 2, 0, 5) // ≈ 2
 */
export function goldenSectionMax(f: (x: number) => number, lo: number, hi: number, options: { maxIterations?: number; relTol?: number } = {}): number {
  const maxIterations = options.maxIterations ?? 100;
  const relTol = options.relTol ?? 1e-12;
  const g = (Math.sqrt(5) - 1) / 2;
  let c = hi - g * (hi - lo);
  let d = lo + g * (hi - lo);
  let fc = f(c);
  let fd = f(d);
  for (let it = 0; it < maxIterations && hi - lo > relTol * Math.abs(hi); it++) {
    if (fc > fd) {
      hi = d; d = c; fd = fc; c = hi - g * (hi - lo); fc = f(c);
    } else {
      lo = c; c = d; fc = fd; d = lo + g * (hi - lo); fd = f(d);
    }
  }
  return (lo + hi) / 2;
}
