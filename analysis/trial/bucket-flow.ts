/**
 * Volume flow from a bucket of known volume and one or more fill times (V̇ = V / t̄), with the
 * Type A statistics of the times (JCGM 100:2008 §4.2: u = s/√n, ν = n − 1).
 */
import { requireFiniteArray, requirePositive } from '../units/guards';

/** Result of a bucket test. */
export interface BucketFlow {
  /** V / t̄, m³/s */
  flowM3PerS: number;
  /** mean fill time, s */
  meanTimeS: number;
  /** sample standard deviation of the fill times, s (0 for a single time) */
  sdTimeS: number;
  /** Type A standard uncertainty of the mean time s/√n, s (0 for a single time) */
  typeAUncertaintyS: number;
  /** degrees of freedom of the Type A part, n − 1 */
  dof: number;
  n: number;
}

/**
 * Flow from bucket volume and fill times. Each time must be positive.
 * @param bucketVolumeM3 m³, > 0
 * @param fillTimesS s, one or more, each > 0
 * @throws TypeError / RangeError naming the field for non-finite, empty or non-positive values.
 * @example bucketFlow(0.02, [79.8, 80.4, 80.1]).flowM3PerS // ≈ 2.497e-4 m³/s = 14.98 L/min (the demo lab's 20 L bucket)
 */
export function bucketFlow(bucketVolumeM3: number, fillTimesS: number[]): BucketFlow {
  const V = requirePositive(bucketVolumeM3, 'bucketVolumeM3');
  const times = requireFiniteArray(fillTimesS, 'fillTimesS');
  times.forEach((t, i) => requirePositive(t, `fillTimesS[${i}]`));
  const n = times.length;
  // Welford's running mean and variance
  let mean = 0, m2 = 0;
  times.forEach((t, i) => {
    const d = t - mean;
    mean += d / (i + 1);
    m2 += d * (t - mean);
  });
  const sd = n > 1 ? Math.sqrt(m2 / (n - 1)) : 0;
  return { flowM3PerS: V / mean, meanTimeS: mean, sdTimeS: sd, typeAUncertaintyS: n > 1 ? sd / Math.sqrt(n) : 0, dof: n - 1, n };
}
