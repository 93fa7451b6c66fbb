/**
 * The steady-state test of a segmentation preset run on a log as it grows (a live session): the
 * same segmenter (segment-log.ts), read at the latest sample.
 * - `record`: the latest sample ends a steady segment at least as long as the preset asks — read now;
 * - `steady`: the latest samples are steady, but not yet for the preset's minimum duration;
 * - `changed`: a steady stretch ended within the last window and the log is not steady now;
 * - `settling`: not steady (yet), nothing steady just before;
 * - `waiting`: too few samples to judge.
 * Segments that can no longer change (their end lies more than a window and an averaging span
 * before the latest sample: later windows cannot reach back into them) are `final`: a live session
 * turns them into trials once.
 */
import { segmentLog, type SteadySegment } from './segment-log';
import type { LogChannels } from './segment-stats';
import type { SteadyCriteria } from './steady-criteria';

export type LiveState = 'waiting' | 'settling' | 'steady' | 'record' | 'changed';

export interface LiveSteadyState {
  state: LiveState;
  /** how long the latest samples have been steady, s (0 when not) */
  steadyForS: number;
  /** the preset's minimum steady duration, s */
  minDurationS: number;
  /** time of the latest sample, s */
  lastTimeS: number;
  /** steady segments that later samples cannot change, in time order */
  final: SteadySegment[];
  /** the steady segment the latest sample ends, when it is long enough */
  current: SteadySegment | null;
  message: string;
}

const mins = (s: number) => (s >= 120 ? `${(s / 60).toFixed(0)} min` : `${Math.round(s)} s`);

/**
 * @param log the log so far (time s, strictly increasing; inlet, outlet °C; flow m³/s)
 * @param criteria resolved criteria of the preset (resolveCriteria)
 * @throws as segmentLog for malformed channels
 * @example liveSteadyState(log, resolveCriteria('field')).state
 */
export function liveSteadyState(log: LogChannels, criteria: SteadyCriteria): LiveSteadyState {
  const n = log.timeS.length;
  const minDurationS = Math.max(criteria.minDurationS, criteria.minDurationTransits * (criteria.transitTimeS ?? 0));
  if (n < 3) return { state: 'waiting', steadyForS: 0, minDurationS, lastTimeS: n ? log.timeS[n - 1] : 0, final: [], current: null, message: 'Waiting for samples.' };
  const r = segmentLog(log, criteria);
  const last = log.timeS[n - 1];
  const reach = criteria.windowS + criteria.averagingS;
  const final = r.segments.filter((s) => last - s.endTimeS > reach);
  const current = r.segments.find((s) => s.endIndex === n - 1) ?? null;
  const shortRun = r.rejected.find((x) => x.endIndex === n - 1 && /shorter than the minimum/.test(x.reason)) ?? null;
  if (current) {
    return { state: 'record', steadyForS: current.durationS, minDurationS, lastTimeS: last, final, current, message: `Steady for ${mins(current.durationS)} — record.` };
  }
  if (shortRun) {
    const s = shortRun.endTimeS - shortRun.startTimeS;
    return { state: 'steady', steadyForS: s, minDurationS, lastTimeS: last, final, current: null, message: `Steady for ${mins(s)} of the ${mins(minDurationS)} needed — hold the flow.` };
  }
  const lastEnd = Math.max(-Infinity, ...r.segments.map((s) => s.endTimeS), ...r.rejected.map((x) => x.endTimeS));
  const changed = last - lastEnd <= reach;
  return {
    state: changed ? 'changed' : 'settling', steadyForS: 0, minDurationS, lastTimeS: last, final, current: null,
    message: changed ? 'Changed: the readings moved off the steady level.' : 'Settling: not steady yet.',
  };
}
