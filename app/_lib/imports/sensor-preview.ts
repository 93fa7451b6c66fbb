import 'server-only';
import { createHash } from 'node:crypto';
import { z } from 'zod';
import { segmentLog, segmentStats, type SegmentStats, type SteadyCriteria } from '@/analysis/segment';
import type { SourceFileRow } from '@/entities';
import type { OverviewPoints } from '@/entities/sensor-overview';
import { DomainError, HTTP_STATUS } from '../server/errors';
import { logCriteria, logReadInput, lowerBound, openLogReader, segmentChannels, type LogProgress, type SegmentChannels } from './log-reader';
import type { RowIssue } from '../rigs/trial-rule';
import { displayPoints } from './sensor-overview';
import type { SensorLog } from './sensor-log';

/**
 * The steady periods of a stored sensor log, found before anything is saved: the page shows them
 * on a time-series plot and the engineer accepts, adjusts or drops each one (or takes a rejected
 * run anyway), then starts the import with the periods chosen, as source lines.
 *
 * The whole file is read and checked here by the import's own reader (log-reader.ts: the same
 * row rules, criteria and segmentation channels), so row errors show before the import starts. A
 * parsed log is kept in memory for a few minutes per process (at most two, about 48 bytes a
 * sample), so changing thresholds or adjusting a period only segments again.
 *
 * Owns: the preview's input, the log cache, measuring the engineer's periods against the criteria,
 * the preview's answer and its stream of JSON lines (a refusal in it carries its HTTP status).
 * May import: log-reader, sensor-overview (the display points), analysis/segment, server/errors.
 * Refusals are `DomainError`s (`ImportError` among them), as everywhere.
 */

export const segmentPreviewInput = logReadInput.extend({
  /** periods the engineer set, seconds from the log's first sample; each is measured and given its source lines */
  periods: z.array(z.object({ startS: z.number().finite().min(0), endS: z.number().finite().min(0) }).strict()).max(2000).optional(),
  /** the stretch of the log to plot, seconds from the first sample (default all of it) */
  view: z.object({ startS: z.number().finite(), endS: z.number().finite() }).strict().optional(),
  /** only the plot series (of `view`): no segmentation */
  seriesOnly: z.boolean().optional(),
});
export type SegmentPreviewInput = z.infer<typeof segmentPreviewInput>;

/** A period of the log with its statistics, in SI (times in s from the first sample). */
export interface PreviewPeriod extends Omit<SegmentStats, 'blocks'> {
  startLine: number;
  endLine: number;
  startS: number;
  endS: number;
  durationS: number;
  /** for engineer-set periods: which criteria it does not meet (empty when it lies inside a steady period found) */
  notes: string[];
}

export interface SegmentPreview {
  samples: number;
  rejectedCount: number;
  /** the first rejected rows, with line and reason */
  issues: RowIssue[];
  plausibility: SensorLog['plausibility'];
  notices: string[];
  /** ISO instant of the first sample when the log is dated, else null */
  startIso: string | null;
  durationS: number;
  medianIntervalS: number;
  criteria: SteadyCriteria;
  segments: PreviewPeriod[];
  rejected: { startS: number; endS: number; startLine: number; endLine: number; reason: string }[];
  gaps: { afterS: number; gapS: number; line: number }[];
  /** the engineer's periods, measured (when asked) */
  periods: PreviewPeriod[] | null;
  /** the log's display points (sensor-overview.ts `displayPoints`), and whether they are fewer than its samples */
  series: OverviewPoints & { reduced: boolean };
}

interface Cached {
  log: SensorLog;
  at: number;
}
const CACHE_TTL_MS = 10 * 60_000;
const CACHE_MAX = 2;
const g = globalThis as typeof globalThis & { __emberlineLogCache?: Map<string, Cached> };
const cache = (g.__emberlineLogCache ??= new Map());

function cacheKey(file: SourceFileRow, input: SegmentPreviewInput): string {
  const h = createHash('sha256');
  h.update(file.id).update(file.sha256).update(JSON.stringify(input.mapping)).update([...input.excludedLines].sort((a, b) => a - b).join(','));
  return h.digest('hex');
}

function cached(key: string): SensorLog | null {
  const now = Date.now();
  for (const [k, v] of cache) if (now - v.at > CACHE_TTL_MS) cache.delete(k);
  const hit = cache.get(key);
  if (!hit) return null;
  hit.at = now;
  return hit.log;
}

function remember(key: string, log: SensorLog) {
  cache.set(key, { log, at: Date.now() });
  while (cache.size > CACHE_MAX) cache.delete(cache.keys().next().value!);
}

/** A log being read: the header is checked and the mapping validated before `read()` is called. */
export interface OpenedLog {
  /** reads the rest, reporting progress; resolves with the whole log (from the cache when it was read lately) */
  read(onProgress?: (p: LogProgress) => void, signal?: AbortSignal): Promise<SensorLog>;
  /** the log is in the cache: read() resolves at once */
  cached: boolean;
}

/**
 * Opens a stored log for the preview. Faults the engineer can fix (an unreadable file, a mapping
 * that does not fit the header: `ImportError`, 422) and a stored file that cannot be fetched
 * (`StoredFileUnreadable`, 404) are thrown here, before any response is sent.
 */
export async function openLog(file: SourceFileRow, input: SegmentPreviewInput): Promise<OpenedLog> {
  const key = cacheKey(file, input);
  const hit = cached(key);
  if (hit) return { cached: true, read: async () => hit };
  // the import's reading path: blocks of text through the fast row path, excluded lines skipped unread
  const reader = await openLogReader(file, input, { maxIssues: 200 });
  return {
    cached: false,
    async read(onProgress, signal) {
      let last = 0;
      // the reader closes the stored file when reading fails or stops early
      for await (const _ of reader.blocks()) {
        if (signal?.aborted) throw new DomainError('cancelled', 'cancelled', 'The preview was cancelled.');
        const now = Date.now();
        if (onProgress && now - last > 200) { last = now; onProgress(reader.progress()); }
      }
      const log = reader.finish();
      onProgress?.({ bytesDone: file.sizeBytes, bytesTotal: file.sizeBytes });
      remember(key, log);
      return log;
    },
  };
}

/** Display series of samples `from`..`to` (exclusive): the display points of the stored overview of an imported log. */
function displaySeries(log: SensorLog, from = 0, to = log.n): SegmentPreview['series'] {
  const part = (y: Float64Array) => y.subarray(from, to);
  const points = displayPoints({ timeS: part(log.timeS), inletTempC: part(log.inletTempC), outletTempC: part(log.outletTempC), flowM3PerS: part(log.flowM3PerS) });
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

/**
 * The preview as a stream of JSON lines: `{"progress":{…}}` while the file is read, then one
 * `{"result":{…}}` or `{"error":{"status","message"}}`. Reading stops when the client goes away.
 */
export function previewStream(opened: OpenedLog, input: SegmentPreviewInput, signal?: AbortSignal): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  const abort = new AbortController();
  signal?.addEventListener('abort', () => abort.abort());
  return new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (o: unknown) => {
        if (!abort.signal.aborted) controller.enqueue(enc.encode(`${JSON.stringify(o)}\n`));
      };
      try {
        const log = await opened.read((p) => send({ progress: p }), abort.signal);
        send({ result: input.seriesOnly ? previewSeries(log, input) : previewSegments(log, input) });
      } catch (e) {
        if (e instanceof DomainError) send({ error: { status: HTTP_STATUS[e.kind], code: e.code, message: e.message } });
        else {
          console.error('sensor-log preview failed:', e);
          send({ error: { status: 500, code: 'internal', message: 'The log could not be read on the server.' } });
        }
      }
      if (!abort.signal.aborted) controller.close();
    },
    cancel() {
      abort.abort();
    },
  });
}
