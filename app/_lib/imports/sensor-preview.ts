import 'server-only';
import { createHash } from 'node:crypto';
import { z } from 'zod';
import type { SegmentStats, SteadyCriteria } from '@/analysis/segment';
import type { SourceFileRow } from '@/entities';
import type { OverviewPoints } from '@/entities/sensor-overview';
import { DomainError, HTTP_STATUS } from '../server/errors';
import { logReadInput, openLogReader, type LogProgress } from './log-reader';
import type { RowIssue } from '../rigs/trial-rule';
import { runAnalysis } from '../server/analysis-pool';
import { previewCriteria } from './preview-segments';

export { previewCriteria };
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
        // the segmentation runs in the analysis pool (the log is copied to the worker; the request thread stays free)
        send({ result: await runAnalysis(input.seriesOnly ? 'previewSeries' : 'previewSegments', { log, input }) });
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
