import 'server-only';
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import { z } from 'zod';
import { DISPLAY_MAX_POINTS, overviewIndices } from '@/analysis/reduce';
import { resolveCriteria, segmentLog, segmentStats, type PresetName, type SegmentStats, type SteadyCriteria } from '@/analysis/segment';
import type { SourceFileRow } from '@/entities';
import { DomainError, HTTP_STATUS } from '../server/errors';
import { ImportError, createSensorLogBuilder, openDelimited, type RowIssue, type SensorLog } from '.';
import { logImportInput } from './sensor-import';
import { getObjectStream } from '../server/storage';

/**
 * The steady periods of a stored sensor log, found before anything is saved: the page shows them
 * on a time-series plot and the engineer accepts, adjusts or drops each one (or takes a rejected
 * run anyway), then starts the import with the periods chosen, as source lines.
 *
 * The whole file is read and checked here (the same row rules as the import), so row errors show
 * before the import starts. A parsed log is kept in memory for a few minutes per process (at most
 * two, about 48 bytes a sample), so changing thresholds or adjusting a period only segments again.
 */

export const segmentPreviewInput = logImportInput.omit({ segments: true }).extend({
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
  /** the log reduced for display (LTTB keeping each bucket's extremes, per channel, merged) */
  series: { tS: number[]; inletTempC: number[]; outletTempC: number[]; flowM3PerS: number[]; reduced: boolean };
}

export interface PreviewProgress {
  bytesDone: number;
  bytesTotal: number;
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
  read(onProgress?: (p: PreviewProgress) => void, signal?: AbortSignal): Promise<SensorLog>;
  /** the log is in the cache: read() resolves at once */
  cached: boolean;
}

/**
 * Opens a stored log for the preview. Faults the engineer can fix (an unreadable file, a mapping
 * that does not fit the header) are thrown here as 422, before any response is sent.
 */
export async function openLog(file: SourceFileRow, input: SegmentPreviewInput): Promise<OpenedLog> {
  const key = cacheKey(file, input);
  const hit = cached(key);
  if (hit) return { cached: true, read: async () => hit };
  let raw: Readable;
  try {
    raw = await getObjectStream(file.storageKey);
  } catch {
    throw new DomainError('not_found', 'not_found', 'The stored file could not be read; upload it again.');
  }
  let bytesDone = 0;
  async function* counted() {
    for await (const chunk of raw) { bytesDone += chunk.length; yield chunk as Uint8Array; }
  }
  const where = { file: file.filename };
  let src: Awaited<ReturnType<typeof openDelimited>>;
  let builder: ReturnType<typeof createSensorLogBuilder>;
  try {
    src = await openDelimited(counted(), { fileName: file.filename });
    // the import's reading path: blocks of text through the fast row path, excluded lines skipped unread
    builder = createSensorLogBuilder(input.mapping, src.header, where, { maxIssues: 200, excludedLines: new Set(input.excludedLines), text: src.dialect, sizeHintBytes: file.sizeBytes });
  } catch (e) {
    raw.destroy();
    throw e;
  }
  return {
    cached: false,
    async read(onProgress, signal) {
      let last = 0;
      try {
        for await (const block of src.blocks()) {
          if (signal?.aborted) throw new DomainError('cancelled', 'cancelled', 'The preview was cancelled.');
          builder.add(block);
          const now = Date.now();
          if (onProgress && now - last > 200) { last = now; onProgress({ bytesDone, bytesTotal: file.sizeBytes }); }
        }
      } catch (e) {
        raw.destroy();
        throw e;
      }
      const log = builder.finish();
      onProgress?.({ bytesDone: file.sizeBytes, bytesTotal: file.sizeBytes });
      remember(key, log);
      return log;
    },
  };
}

const round = (x: number, digits: number) => Number(x.toPrecision(digits));

/**
 * Display series of samples `from`..`to` (exclusive): the channels' shared LTTB-with-extremes
 * indices (analysis/reduce overviewIndices), as the stored overview of an imported log.
 */
function displaySeries(log: SensorLog, from = 0, to = log.n, maxPoints = DISPLAY_MAX_POINTS): SegmentPreview['series'] {
  const n = to - from;
  const part = (y: Float64Array) => y.subarray(from, to);
  const idx = Array.from(overviewIndices(part(log.timeS), [part(log.inletTempC), part(log.outletTempC), part(log.flowM3PerS)], maxPoints), (i) => from + i);
  return {
    tS: idx.map((i) => round(log.timeS[i], 9)),
    inletTempC: idx.map((i) => round(log.inletTempC[i], 6)),
    outletTempC: idx.map((i) => round(log.outletTempC[i], 6)),
    flowM3PerS: idx.map((i) => round(log.flowM3PerS[i], 6)),
    reduced: idx.length < n,
  };
}

/** First index with t[i] >= x. */
function lowerBound(t: ArrayLike<number>, x: number): number {
  let lo = 0, hi = t.length;
  while (lo < hi) { const mid = (lo + hi) >>> 1; if (t[mid] < x) lo = mid + 1; else hi = mid; }
  return lo;
}

function period(log: SensorLog, a: number, b: number, blockS: number, notes: string[]): PreviewPeriod {
  const { blocks: _b, ...st } = segmentStats(log, a, b, blockS);
  void _b;
  return { ...st, startLine: log.lines[a], endLine: log.lines[b], startS: log.timeS[a], endS: log.timeS[b], durationS: log.timeS[b] - log.timeS[a], notes };
}

const fmt = (x: number, d = 2) => String(Math.round(x * 10 ** d) / 10 ** d);

/**
 * The preset with the engineer's edits, checked.
 * @throws DomainError 422 naming the threshold out of range
 */
export function previewCriteria(input: Pick<SegmentPreviewInput, 'preset' | 'criteria'>): SteadyCriteria {
  try {
    return resolveCriteria(input.preset as PresetName, (input.criteria ?? {}) as Partial<SteadyCriteria>);
  } catch (e) {
    if (e instanceof RangeError) throw new DomainError('invalid', 'bad_criteria', `Steady-state criteria: ${e.message}.`);
    throw e;
  }
}

/**
 * Segments a read log with the preset and edits, measures the engineer's periods, and reduces the
 * series for the plot.
 * @throws DomainError 422 for criteria out of range or a period with fewer than two samples
 */
export function previewSegments(log: SensorLog, input: SegmentPreviewInput): SegmentPreview {
  const criteria = previewCriteria(input);
  if (log.n === 0) throw new DomainError('invalid', 'empty_file', log.rejectedCount ? `No row of the log could be read: ${log.issues[0]?.message ?? 'every row fails'} (line ${log.issues[0]?.line}).` : 'The log holds no samples.');
  const channels = { timeS: log.timeS, inletTempC: log.inletTempC, outletTempC: log.outletTempC, flowM3PerS: log.flowM3PerS, ambientTempC: log.ambientTempC };
  const seg = segmentLog(channels, criteria);
  const segments = seg.segments.map((s) => period(log, s.startIndex, s.endIndex, criteria.blockS, []));
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
      const st = period(log, a, b, criteria.blockS, notes);
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
