/**
 * A display overview of a log with several channels on one time base (inlet, outlet, flow…):
 * the union of each channel's LTTB-with-extremes indices (lttb-extremes.ts, after Steinarsson
 * 2013), so that every channel keeps its own shape, each bucket's minimum and maximum, and the
 * endpoints, while all channels share the kept sample times and can be drawn as unbroken lines.
 * The budget is split evenly between the channels, so the union never exceeds `maxPoints`.
 * Missing readings (NaN) are skipped by that channel's reducer and stay missing.
 */
import { lttbExtremesIndices } from './lttb-extremes';
import { allIndices, checkSeries, type Series } from './series-check';

/**
 * Indices of the samples to keep for display.
 * @param timeS sample times, s, finite and non-decreasing
 * @param channels the channels, each as long as `timeS` (any unit; NaN = no reading); null entries
 *   (a channel the log lacks) are ignored
 * @param maxPoints most samples to keep, an integer ≥ 2 + 5 × (number of channels)
 * @returns ascending distinct indices, at most `maxPoints`, with 0 and n − 1 and, for every channel,
 *   the first index of its global minimum and of its global maximum among them
 * @throws TypeError for a non-finite time or a channel that is not array-like; RangeError for a
 *   channel of another length, decreasing time, or a budget too small for the channels.
 * @example overviewIndices(timeS, [inletC, outletC, flowM3PerS], 2000).length // ≤ 2000
 */
export function overviewIndices(timeS: Series, channels: readonly (Series | null | undefined)[], maxPoints: number): Uint32Array {
  const steps = overviewIndicesSteps(timeS, channels, maxPoints);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/**
 * {@link overviewIndices} one channel at a time: the generator yields after each channel and
 * returns the indices, so a caller can let other work run in between (the import does, while
 * PostgreSQL takes its last rows).
 * @throws as {@link overviewIndices}, at the first step
 */
export function* overviewIndicesSteps(timeS: Series, channels: readonly (Series | null | undefined)[], maxPoints: number): Generator<void, Uint32Array, void> {
  // the time base checked on its own (as both coordinates: no copy); each channel is checked by its reducer
  const n = checkSeries(timeS, timeS, Math.max(2, maxPoints | 0), 2);
  const present = channels.filter((c): c is Series => c != null);
  present.forEach((c, k) => {
    if (typeof c.length !== 'number') throw new TypeError(`channel ${k} must be an array of numbers`);
    if (c.length !== n) throw new RangeError(`channel ${k} has ${c.length} samples but timeS has ${n}`);
  });
  if (!Number.isInteger(maxPoints) || maxPoints < 2 + 5 * Math.max(1, present.length)) {
    throw new RangeError(`maxPoints must be an integer of at least ${2 + 5 * Math.max(1, present.length)} for ${present.length} channel(s), got ${String(maxPoints)}`);
  }
  if (n <= maxPoints) return allIndices(n);
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[n - 1] = 1;
  const perChannel = Math.floor((maxPoints - 2) / Math.max(1, present.length));
  for (const y of present) {
    let m = 0;
    for (let i = 0; i < n; i++) if (Number.isFinite(y[i])) m++;
    if (m === n) {
      for (const j of lttbExtremesIndices(timeS, y, perChannel)) keep[j] = 1;
      yield;
      continue;
    }
    if (m === 0) continue;
    // a channel with missing readings: its finite samples, compacted, and where each came from
    const from = new Uint32Array(m);
    for (let i = 0, k = 0; i < n; i++) if (Number.isFinite(y[i])) from[k++] = i;
    const xs = new Float64Array(m), ys = new Float64Array(m);
    for (let j = 0; j < m; j++) { xs[j] = timeS[from[j]]; ys[j] = y[from[j]]; }
    for (const j of lttbExtremesIndices(xs, ys, perChannel)) keep[from[j]] = 1;
    yield;
  }
  let count = 0;
  for (let i = 0; i < n; i++) count += keep[i];
  const out = new Uint32Array(count);
  for (let i = 0, k = 0; i < n; i++) if (keep[i]) out[k++] = i;
  return out;
}
