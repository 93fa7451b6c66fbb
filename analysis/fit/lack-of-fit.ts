import { fSf } from '../stats/distributions';
import type { LackOfFitResult, ReplicateGroup } from './types';

/**
 * Lack-of-fit F test with pure error from replicates (NIST/SEMATECH e-Handbook of Statistical
 * Methods, §4.4.4.3 "How can I test whether the model fits?"): the residual sum of squares splits
 * into pure error, Σ_groups Σ wᵢ(yᵢ − ȳ_g)² with n − g degrees of freedom, and lack of fit,
 * RSS − SS_pe with g − p; F = (SS_lof/df_lof)/(SS_pe/df_pe) against F(df_lof, df_pe).
 *
 * @param y - responses (unit of y)
 * @param weights - weights per point (null: all 1), unit of y⁻²
 * @param rss - weighted residual sum of squares of the fit
 * @param groups - all groups from {@link groupReplicates}, singletons included
 * @param p - number of fitted parameters
 * @returns the test, or `{ ok: false, reason }` when there are no replicates, too few distinct x, or zero pure error
 * @example lackOfFit(y, null, fit.rss, groupReplicates(x, y), 2).pValue
 */
export function lackOfFit(y: ArrayLike<number>, weights: ArrayLike<number> | null, rss: number, groups: ReplicateGroup[], p: number): LackOfFitResult | { ok: false; reason: string } {
  const n = y.length;
  const g = groups.length;
  const dfPe = n - g;
  const dfLof = g - p;
  if (dfPe < 1) return { ok: false, reason: 'no replicates: every x is distinct, so pure error cannot be estimated' };
  if (dfLof < 1) return { ok: false, reason: `only ${g} distinct x groups for ${p} parameters: lack of fit has no degrees of freedom` };
  let ssPe = 0;
  for (const grp of groups) {
    let sw = 0;
    let swy = 0;
    for (const i of grp.indices) {
      const w = weights ? weights[i] : 1;
      sw += w;
      swy += w * y[i];
    }
    const mean = swy / sw;
    for (const i of grp.indices) ssPe += (weights ? weights[i] : 1) * (y[i] - mean) ** 2;
  }
  if (!(ssPe > 0)) return { ok: false, reason: 'the replicates agree exactly: pure error is zero and the F test is undefined' };
  const ssLof = Math.max(0, rss - ssPe);
  const F = ssLof / dfLof / (ssPe / dfPe);
  const pValue = fSf(F, dfLof, dfPe);
  const verdict = pValue < 0.05
    ? `lack of fit is significant (F = ${F.toPrecision(3)}, p = ${pValue.toPrecision(2)}): the model misses real structure beyond the replicate scatter`
    : `no significant lack of fit (F = ${F.toPrecision(3)}, p = ${pValue.toPrecision(2)}): the residuals are consistent with the replicate scatter`;
  return { ok: true, groups: g, pureErrorSS: ssPe, pureErrorDf: dfPe, lackOfFitSS: ssLof, lackOfFitDf: dfLof, F, pValue, verdict };
}
