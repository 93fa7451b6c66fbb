import { extent } from '../stats/extent';
import { logGamma } from '../stats/log-gamma';
import { normalCdf } from '../stats/distributions';

/** Result of the runs test on residual signs. */
export interface RunsTestResult {
  /** number of runs of equal sign, residuals ordered by x */
  runs: number;
  positives: number;
  negatives: number;
  /** expected number of runs under randomness */
  expectedRuns: number;
  /** one-sided p-value for too few runs (the signature of a wrong model shape) */
  pValue: number;
  /** exact (small samples) or normal approximation */
  method: 'exact' | 'normal';
}

const logChoose = (n: number, k: number): number => (k < 0 || k > n ? -Infinity : logGamma(n + 1) - logGamma(k + 1) - logGamma(n - k + 1));

/** P(R = r) for n1 and n2 signs arranged at random (Wald & Wolfowitz 1940). */
function runsProbability(r: number, n1: number, n2: number): number {
  const total = logChoose(n1 + n2, n1);
  if (r % 2 === 0) {
    const k = r / 2;
    return 2 * Math.exp(logChoose(n1 - 1, k - 1) + logChoose(n2 - 1, k - 1) - total);
  }
  const k = (r - 1) / 2;
  return Math.exp(logChoose(n1 - 1, k) + logChoose(n2 - 1, k - 1) - total) + Math.exp(logChoose(n1 - 1, k - 1) + logChoose(n2 - 1, k) - total);
}

/**
 * Wald–Wolfowitz runs test for patterned residuals (NIST/SEMATECH e-Handbook §1.3.5.13, "Runs test
 * for detecting non-randomness"): residuals are ordered by x, zeros dropped, and the number of runs of
 * equal sign is compared with its distribution under randomness; too few runs means systematic
 * curvature. Exact distribution up to 200 signs, normal approximation with continuity correction beyond.
 *
 * @param x - predictor per point (sets the order)
 * @param residuals - residual per point (any unit)
 * @returns the test, or null when fewer than 2 positive or 2 negative residuals remain
 * @throws RangeError for arrays of different lengths
 * @example runsTest([1, 2, 3, 4, 5, 6], [1, 1, 1, -1, -1, -1])?.runs // 2
 */
export function runsTest(x: ArrayLike<number>, residuals: ArrayLike<number>): RunsTestResult | null {
  if (x.length !== residuals.length) throw new RangeError(`runsTest: x has ${x.length} values, residuals ${residuals.length}`);
  const order = Array.from({ length: x.length }, (_, i) => i).sort((a, b) => x[a] - x[b]);
  const [rLo, rHi] = extent(residuals);
  const scale = Math.max(-rLo, rHi);
  const signs = order.map((i) => residuals[i]).filter((e) => Math.abs(e) > 1e-12 * scale).map(Math.sign);
  const n1 = signs.filter((s) => s > 0).length;
  const n2 = signs.length - n1;
  if (n1 < 2 || n2 < 2) return null;
  let runs = 1;
  for (let i = 1; i < signs.length; i++) if (signs[i] !== signs[i - 1]) runs++;
  const N = n1 + n2;
  const expectedRuns = (2 * n1 * n2) / N + 1;
  if (N <= 200) {
    let p = 0;
    for (let r = 2; r <= runs; r++) p += runsProbability(r, n1, n2);
    return { runs, positives: n1, negatives: n2, expectedRuns, pValue: Math.min(1, p), method: 'exact' };
  }
  const variance = (2 * n1 * n2 * (2 * n1 * n2 - N)) / (N * N * (N - 1));
  const z = (runs + 0.5 - expectedRuns) / Math.sqrt(variance);
  return { runs, positives: n1, negatives: n2, expectedRuns, pValue: normalCdf(z), method: 'normal' };
}
