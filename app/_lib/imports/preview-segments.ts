/**
 * The segmentation preview of a read log as pure functions (the log and the engineer's input in,
 * the preview out): run in the analysis worker threads, so this file and its imports stay free
 * of `server-only`, storage and the ORM. sensor-preview.ts reads and keeps the log, and asks the
 * pool for these.
 */
import { segmentLog, segmentStats, type SteadyCriteria } from '@/analysis/segment';
import { DomainError } from '../server/errors';
import { logCriteria, lowerBound, segmentChannels, type SegmentChannels } from './log-channels';
import { displayPoints } from './display-points';
import type { SensorLog } from './sensor-log';
import type { PreviewPeriod, SegmentPreview, SegmentPreviewInput } from './sensor-preview';

/** Display series of samples `from`..`to` (exclusive): the display points of the stored overview of an imported log. */
function displaySeries(log: SensorLog, from = 0, to = log.n): SegmentPreview['series'] {
  const part = (y: Float64Array) => y.subarray(from, to);
  const points = displayPoints({
    timeS: part(log.timeS), inletTempC: part(log.inletTempC), outletTempC: part(log.outletTempC), flowM3PerS: part(log.flowM3PerS),
    // a collector log's air and sun, drawn as the stored overview draws them
    ambientTempC: log.ambientTempC && part(log.ambientTempC), irradianceWPerM2: log.irradianceWPerM2 && part(log.irradianceWPerM2),
  });
  return { ...points, reduced: points.tS.length < to - from };
}

function period(log: SensorLog, channels: SegmentChannels, a: number, b: number, blockS: number, notes: string[]): PreviewPeriod {
  const { blocks: _b, ...st } = segmentStats(channels, a, b, blockS);
  void _b;
  return { ...st, startLine: log.lines[a], endLine: log.lines[b], startS: log.timeS[a], endS: log.timeS[b], durationS: log.timeS[b] - log.timeS[a], notes };
}

const fmt = (x: number, d = 2) => String(Math.round(x * 10 ** d) / 10 ** d);

/**
 * The preset with the engineer's edits, checked (log-reader `logCriteria`, as the import does).
 * @throws ImportError `bad_criteria` (422) naming the threshold out of range
 */
export function previewCriteria(input: Pick<SegmentPreviewInput, 'preset' | 'criteria'>): SteadyCriteria {
  return logCriteria(input);
}

/**
 * Segments a read log with the preset and edits, measures the engineer's periods, and reduces the
 * series for the plot.
 * @throws DomainError 422 for criteria out of range or a period with fewer than two samples
 */
export function previewSegments(log: SensorLog, input: SegmentPreviewInput): SegmentPreview {
  const criteria = previewCriteria(input);
  if (log.n === 0) throw new DomainError('invalid', 'empty_file', log.rejectedCount ? `No row of the log could be read: ${log.issues[0]?.message ?? 'every row fails'} (line ${log.issues[0]?.line}).` : 'The log holds no samples.');
  const channels = segmentChannels(log);
  const seg = segmentLog(channels, criteria);
  const segments = seg.segments.map((s) => period(log, channels, s.startIndex, s.endIndex, criteria.blockS, []));
  let periods: PreviewPeriod[] | null = null;
  if (input.periods) {
    const transit = criteria.transitTimeS ?? 0;
    const minDur = Math.max(criteria.minDurationS, criteria.minDurationTransits * transit);
    periods = input.periods.map((p, k) => {
      if (!(p.endS > p.startS)) throw new DomainError('invalid', 'bad_period', `Period ${k + 1} ends (${fmt(p.endS / 60)} min) before it starts (${fmt(p.startS / 60)} min).`);
      const a = lowerBound(log.timeS, p.startS);
      const b = lowerBound(log.timeS, p.endS + 1e-9) - 1;
      if (b - a < 1) throw new DomainError('invalid', 'bad_period', `Period ${k + 1} (${fmt(p.startS / 60)}–${fmt(p.endS / 60)} min) holds fewer than two samples.`);
      const notes: string[] = [];
      const inside = seg.segments.some((s) => s.startIndex <= a && b <= s.endIndex);
      if (!inside) notes.push('not wholly inside a steady period found with these criteria');
      const dur = log.timeS[b] - log.timeS[a];
      if (dur < minDur) notes.push(`${fmt(dur / 60)} min long, shorter than the minimum ${fmt(minDur / 60)} min`);
      const st = period(log, channels, a, b, criteria.blockS, notes);
      if (criteria.maxOutletSlopeKPerS !== null && Math.abs(st.outletSlopeKPerS) > criteria.maxOutletSlopeKPerS) {
        notes.push(`the outlet drifts ${fmt(st.outletSlopeKPerS * 60, 3)} K/min (limit ${fmt(criteria.maxOutletSlopeKPerS * 60, 3)} K/min)`);
      }
      return st;
    });
  }
  const d = Array.from({ length: Math.min(log.n - 1, 10_001) }, (_, i) => log.timeS[i + 1] - log.timeS[i]).sort((x, y) => x - y);
  const o = log.timeOrigin;
  return {
    samples: log.n,
    rejectedCount: log.rejectedCount,
    issues: log.issues.slice(0, 200),
    plausibility: log.plausibility,
    notices: log.notices,
    startIso: o.kind === 'datetime' ? new Date(o.epochS * 1000).toISOString() : null,
    durationS: log.timeS[log.n - 1] - log.timeS[0],
    medianIntervalS: d.length ? d[Math.floor(d.length / 2)] : 0,
    criteria,
    segments,
    rejected: seg.rejected.map((r) => ({ startS: r.startTimeS, endS: r.endTimeS, startLine: log.lines[r.startIndex], endLine: log.lines[r.endIndex], reason: r.reason })),
    gaps: seg.gaps.map((x) => ({ afterS: log.timeS[x.afterIndex], gapS: x.gapS, line: log.lines[x.afterIndex + 1] })),
    periods,
    series: viewSeries(log, input.view),
  };
}

/** The plot series of a stretch of the log (the whole log by default), at most 2,000 points. */
function viewSeries(log: SensorLog, view: SegmentPreviewInput['view']): SegmentPreview['series'] {
  if (!view) return displaySeries(log);
  const a = Math.max(0, lowerBound(log.timeS, view.startS) - 1);
  const b = Math.min(log.n, lowerBound(log.timeS, view.endS) + 1);
  if (b - a < 2) throw new DomainError('invalid', 'bad_view', `The log holds no samples between ${fmt(view.startS / 3600)} h and ${fmt(view.endS / 3600)} h.`);
  return displaySeries(log, a, b);
}

/** Only the plot series of `input.view`, for zooming: the cached log is not segmented again. */
export function previewSeries(log: SensorLog, input: SegmentPreviewInput): Pick<SegmentPreview, 'series' | 'samples'> {
  if (log.n === 0) throw new DomainError('invalid', 'empty_file', 'The log holds no samples.');
  return { samples: log.n, series: viewSeries(log, input.view) };
}

