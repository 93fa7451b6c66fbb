/** Point reduction for display (issue 7: series longer than 2,000 points are reduced server-side). */
import { lttb, type ReducedSeries } from './lttb';
import { lttbExtremes } from './lttb-extremes';
import { allIndices, checkSeries, pick, type Series } from './series-check';

export { lttb, lttbIndices, type ReducedSeries } from './lttb';
export { lttbExtremes, lttbExtremesIndices } from './lttb-extremes';
export { overviewIndices, overviewIndicesSteps } from './channel-overview';
export type { Series } from './series-check';

/** Display limit of the fit and forecast pages, points per series. */
export const DISPLAY_MAX_POINTS = 2000;

/**
 * A series ready to plot: unchanged when it has at most `maxPoints` points, otherwise reduced
 * with LTTB (Steinarsson 2013), by default keeping every bucket's extremes.
 * @param options.maxPoints most points to return (default 2000, at least 5)
 * @param options.keepExtremes keep each bucket's min and max of y too (default true)
 * @throws as {@link lttb} / {@link lttbExtremes}.
 * @example reduceForDisplay(timeS, tempC).x.length // ≤ 2000
 */
export function reduceForDisplay(
  x: Series, y: Series, options: { maxPoints?: number; keepExtremes?: boolean } = {},
): ReducedSeries & { reduced: boolean } {
  const max = options.maxPoints ?? DISPLAY_MAX_POINTS;
  const n = checkSeries(x, y, max, 5);
  if (n <= max) return { ...pick(x, y, allIndices(n)), reduced: false };
  const r = options.keepExtremes === false ? lttb(x, y, max) : lttbExtremes(x, y, max);
  return { ...r, reduced: true };
}
