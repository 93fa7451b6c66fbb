import type { ReplicateGroup, ReplicateTolerance } from './types';

/**
 * Groups points whose x values agree within a tolerance (replicate trials at one flow setting).
 * Points are taken in increasing x; a point joins the current group when it lies within
 * max(absolute, relative·max(|x|, |x₀|)) of the group's first point x₀, else it starts a new group.
 *
 * @param x - predictor per point (e.g. volume flow, m³/s)
 * @param y - response per point (e.g. outlet temperature, °C)
 * @param tolerance - default relative 0.02 and absolute 0
 * @returns every group (singletons too) in increasing x, with mean, SD (n − 1 denominator) and n
 * @throws RangeError for arrays of different lengths or a negative tolerance
 * @example groupReplicates([1, 1.01, 2], [5, 6, 9]).length // 2
 */
export function groupReplicates(x: ArrayLike<number>, y: ArrayLike<number>, tolerance: ReplicateTolerance = {}): ReplicateGroup[] {
  if (x.length !== y.length) throw new RangeError(`groupReplicates: x has ${x.length} values, y has ${y.length}`);
  const rel = tolerance.relative ?? 0.02;
  const abs = tolerance.absolute ?? 0;
  if (!(rel >= 0) || !(abs >= 0)) throw new RangeError(`groupReplicates: tolerances must be ≥ 0 (got relative ${rel}, absolute ${abs})`);
  const order = Array.from({ length: x.length }, (_, i) => i).sort((a, b) => x[a] - x[b]);
  const groups: number[][] = [];
  for (const i of order) {
    const g = groups[groups.length - 1];
    const x0 = g ? x[g[0]] : NaN;
    if (g && Math.abs(x[i] - x0) <= Math.max(abs, rel * Math.max(Math.abs(x[i]), Math.abs(x0)))) g.push(i);
    else groups.push([i]);
  }
  // built by appending, not by map: the statistics read this array in hot code, and map gives a
  // packed or a holey array depending on how far V8 has optimised the caller (a deoptimisation each time)
  const out: ReplicateGroup[] = [];
  for (const indices of groups) {
    const n = indices.length;
    let xm = 0;
    let ym = 0;
    for (const i of indices) {
      xm += x[i] / n;
      ym += y[i] / n;
    }
    let ss = 0;
    for (const i of indices) ss += (y[i] - ym) ** 2;
    out.push({ indices, n, xMean: xm, yMean: ym, ySD: n > 1 ? Math.sqrt(ss / (n - 1)) : null });
  }
  return out;
}
