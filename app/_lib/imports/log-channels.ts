/**
 * What segmenting a read log needs and nothing more: the steady-state criteria from a preset and
 * the engineer's edits (`logCriteria`), the channels the segmenter sees (`segmentChannels`) and
 * finding a sample by line or time (`lowerBound`). No `server-only`: the segmentation preview runs
 * in the analysis worker threads (preview-segments.ts). log-reader.ts re-exports these.
 */
import { resolveCriteria, type PresetName, type SteadyCriteria } from '@/analysis/segment';
import { ImportError } from './import-error';
import type { LogReadInput } from './log-reader';

/**
 * The steady-state criteria: the preset with the engineer's edits, checked.
 * @throws ImportError `bad_criteria` naming the threshold out of range (and the file, when given)
 */
export function logCriteria(input: Pick<LogReadInput, 'preset' | 'criteria'>, file?: string): SteadyCriteria {
  try {
    return resolveCriteria(input.preset as PresetName, (input.criteria ?? {}) as Partial<SteadyCriteria>);
  } catch (e) {
    if (e instanceof RangeError) throw new ImportError('bad_criteria', `steady-state criteria: ${e.message}`, file === undefined ? {} : { file });
    throw e;
  }
}

/** The channels a log is segmented on: ambient takes part only when every sample has one. */
export function segmentChannels<T extends ArrayLike<number>>(log: { timeS: T; inletTempC: T; outletTempC: T; flowM3PerS: T; ambientTempC: T | null; irradianceWPerM2?: T | null; windMPerS?: T | null }) {
  let ambientTempC = log.ambientTempC;
  if (ambientTempC) for (let i = 0; i < ambientTempC.length; i++) if (Number.isNaN(ambientTempC[i])) { ambientTempC = null; break; }
  return { timeS: log.timeS, inletTempC: log.inletTempC, outletTempC: log.outletTempC, flowM3PerS: log.flowM3PerS, ambientTempC, collector: { irradianceWPerM2: log.irradianceWPerM2 ?? null, windMPerS: log.windMPerS ?? null } };
}
export type SegmentChannels = ReturnType<typeof segmentChannels<Float64Array>>;

/** First index i with a[i] >= x (a sorted ascending): where a period of lines or seconds starts in a log. */
export function lowerBound(a: ArrayLike<number>, x: number): number {
  let lo = 0, hi = a.length;
  while (lo < hi) { const mid = (lo + hi) >>> 1; if (a[mid] < x) lo = mid + 1; else hi = mid; }
  return lo;
}
