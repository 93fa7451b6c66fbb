/**
 * Statistics of one steady segment: means and sample SDs (Welford), the least-squares slopes of
 * the temperatures, and standard errors from block means (DOMAIN.md §2.3: 1 Hz samples are
 * autocorrelated, so the standard error comes from the spread of e.g. 30-s block means).
 */

/** One value per channel; ambient is null when the log has none. */
export interface ChannelValues {
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
  ambientTempC: number | null;
}

export interface SegmentStats {
  n: number;
  mean: ChannelValues;
  /** sample standard deviation (n − 1) */
  sd: ChannelValues;
  /** SD of the block means / √(number of blocks); null with fewer than two full blocks */
  blockStdError: ChannelValues | null;
  blocks: number;
  /** least-squares slope of the outlet temperature over the segment, K/s */
  outletSlopeKPerS: number;
  /** least-squares slope of the inlet temperature over the segment, K/s */
  inletSlopeKPerS: number;
}

export interface LogChannels {
  timeS: ArrayLike<number>;
  inletTempC: ArrayLike<number>;
  outletTempC: ArrayLike<number>;
  flowM3PerS: ArrayLike<number>;
  ambientTempC?: ArrayLike<number> | null;
}

function welford(x: ArrayLike<number>, a: number, b: number): [number, number] {
  let mean = 0, m2 = 0, k = 0;
  for (let i = a; i <= b; i++) { k++; const d = x[i] - mean; mean += d / k; m2 += d * (x[i] - mean); }
  return [mean, k > 1 ? Math.sqrt(m2 / (k - 1)) : 0];
}

function slope(t: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number): number {
  const n = b - a + 1;
  if (n < 2) return 0;
  let mt = 0, my = 0;
  for (let i = a; i <= b; i++) { mt += t[i]; my += y[i]; }
  mt /= n; my /= n;
  let sxy = 0, sxx = 0;
  for (let i = a; i <= b; i++) { const dt = t[i] - mt; sxy += dt * (y[i] - my); sxx += dt * dt; }
  return sxx > 0 ? sxy / sxx : 0;
}

/**
 * Means of consecutive blocks of `blockS` seconds from t[a] (block k holds the samples with
 * ⌊(t − t[a]) / blockS⌋ = k). The last block counts only when it has at least 90 % of the
 * average number of samples of the others.
 */
export function blockMeans(t: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number, blockS: number): number[] {
  const sums: number[] = [];
  const counts: number[] = [];
  const t0 = t[a];
  for (let i = a; i <= b; i++) {
    const k = Math.floor((t[i] - t0) / blockS);
    while (sums.length <= k) { sums.push(0); counts.push(0); }
    sums[k] += y[i]; counts[k]++;
  }
  const out: number[] = [];
  const full = counts.length - 1;
  let others = 0, m = 0;
  for (let k = 0; k < full; k++) if (counts[k]) { out.push(sums[k] / counts[k]); others += counts[k]; m++; }
  if (counts[full] && (m === 0 || counts[full] >= 0.9 * (others / m))) out.push(sums[full] / counts[full]);
  return out;
}

function se(means: number[]): number {
  const [, sd] = welford(means, 0, means.length - 1);
  return sd / Math.sqrt(means.length);
}

/** Statistics of samples a..b (inclusive). */
export function segmentStats(log: LogChannels, a: number, b: number, blockS: number): SegmentStats {
  const amb = log.ambientTempC ?? null;
  const [mi, si] = welford(log.inletTempC, a, b);
  const [mo, so] = welford(log.outletTempC, a, b);
  const [mq, sq] = welford(log.flowM3PerS, a, b);
  const [ma, sa] = amb ? welford(amb, a, b) : [NaN, NaN];
  const bi = blockMeans(log.timeS, log.inletTempC, a, b, blockS);
  let blockStdError: ChannelValues | null = null;
  if (bi.length >= 2) {
    blockStdError = {
      inletTempC: se(bi),
      outletTempC: se(blockMeans(log.timeS, log.outletTempC, a, b, blockS)),
      flowM3PerS: se(blockMeans(log.timeS, log.flowM3PerS, a, b, blockS)),
      ambientTempC: amb ? se(blockMeans(log.timeS, amb, a, b, blockS)) : null,
    };
  }
  return {
    n: b - a + 1,
    mean: { inletTempC: mi, outletTempC: mo, flowM3PerS: mq, ambientTempC: amb ? ma : null },
    sd: { inletTempC: si, outletTempC: so, flowM3PerS: sq, ambientTempC: amb ? sa : null },
    blockStdError,
    blocks: bi.length,
    outletSlopeKPerS: slope(log.timeS, log.outletTempC, a, b),
    inletSlopeKPerS: slope(log.timeS, log.inletTempC, a, b),
  };
}
