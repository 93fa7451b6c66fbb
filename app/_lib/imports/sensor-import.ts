import 'server-only';
import { setImmediate } from 'node:timers/promises';
import { z } from 'zod';
import { segmentLog, segmentLogSteps, type SegmentationResult, type SteadyCriteria } from '@/analysis/segment';
import { pgPool } from '../server/pg-pool';
import { SampleCopy } from './copy-writer';
import { ImportError } from './import-error';
import { logCriteria, logReadInput, openLogReader, segmentChannels, type SegmentChannels } from './log-reader';
import { insertLogTrials, trialPeriods, type LogPeriod } from './log-trials';
import type { RowIssue } from '../rigs/trial-rule';
import { buildOverviewAsync, insertOverview, type OverviewData } from './sensor-overview';
import type { SensorLog } from './sensor-log';

/**
 * Sensor-log import: one stored log into the database in a single transaction on one
 * connection, so a bad row halfway through, a database error or a cancellation leaves nothing.
 * The steps are modules of their own; this one runs them in order and holds the transaction:
 * the log reader (log-reader.ts) streams the file in blocks of rows, converted to SI and checked
 * row by row; each block's samples go to `sensor_sample` through the COPY writer (copy-writer.ts)
 * while the next is read (PostgreSQL ingests on the other core); when the rows are all sent, the
 * log is segmented in slices while PostgreSQL works through the last of them, its periods become
 * trials through the one trial rule (log-trials.ts), and the display overview
 * (sensor-overview.ts) is built and stored beside them.
 * Memory stays bounded: one text chunk and one block of rows at a time, a fixed pool of COPY
 * buffers, plus the channels as Float64Arrays for the segmenter (about 44 bytes a sample).
 *
 * Owns: the import's input (`logImportInput`), its transaction (the source file locked FOR UPDATE,
 * the rig FOR KEY SHARE, the file marked imported), the order of the steps and progress with
 * cancellation. May import: server/pg-pool, log-reader, copy-writer, log-trials, sensor-overview,
 * import-error, analysis/segment; sensor-log and rigs/trial-rule for types. It does not know about jobs (jobs/ calls it) or HTTP.
 */

/** The import of a stored log: how to read it, and the periods the engineer accepted. */
export const logImportInput = logReadInput
  .extend({
    /** the periods the engineer accepted (source lines, inclusive); all steady segments when absent */
    segments: z.array(z.object({ startLine: z.number().int().positive(), endLine: z.number().int().positive() }).strict()).max(10_000).optional(),
  })
  .strict();
export type LogImportInput = z.infer<typeof logImportInput>;

export interface SensorImportTarget {
  fileId: string;
  rigId: string;
  labId: string;
  filename: string;
  storageKey: string;
  sizeBytes: number;
  /** when a log has only elapsed or clock times, sample times count from the upload's day / instant */
  uploadedAt: Date;
}

export interface ImportProgress {
  bytesDone: number;
  bytesTotal: number;
  rowsDone: number;
}

export interface SensorImportOptions {
  /** Called between batches (at most every `progressMs`); return true to cancel (everything is rolled back). */
  onProgress?: (p: ImportProgress) => Promise<boolean | void> | boolean | void;
  progressMs?: number;
  /** The file's bytes; object storage by default (the benchmark reads a local file). */
  open?: () => Promise<AsyncIterable<Uint8Array>>;
  batchSize?: number;
  /** Told when a phase ends: `parsed` (every row read and sent), `copied`, `segmented`, `trials`, `committed` (for the benchmark's trace). */
  onPhase?: (phase: 'parsed' | 'copied' | 'segmented' | 'trials' | 'committed') => void;
}

export interface SensorImportResult {
  samples: number;
  trials: number;
  excludedRows: number;
  /** rows that could not be read and were left out (skipInvalidRows) */
  skippedRows: number;
  segmentsFound: number;
  rejectedRuns: number;
  gaps: number;
  criteria: SteadyCriteria;
  plausibility: SensorLog['plausibility'];
  notices: string[];
}

/** Thrown when the import was cancelled between batches; nothing was written. */
export class ImportCancelled extends Error {
  constructor() {
    super('The import was cancelled; nothing was written.');
    this.name = 'ImportCancelled';
  }
}

/** Thrown when the file has already been imported. */
export class AlreadyImported extends Error {}

function rowError(issue: RowIssue, file: string): ImportError {
  return new ImportError('unreadable', `${issue.message}; nothing was imported (fix the file or exclude the line)`, { file, line: issue.line, column: issue.column });
}

/** A PostgreSQL error (it carries a five-character SQLSTATE). */
const isDatabaseError = (e: unknown) => e instanceof Error && 'code' in e && typeof (e as { code?: unknown }).code === 'string' && /^[0-9A-Z]{5}$/.test((e as { code: string }).code);

/**
 * Imports one stored sensor log in a single transaction.
 * @throws ImportError for an unreadable file, a bad mapping or criteria, or a row or period that
 *   fails (with its line); ImportCancelled when `onProgress` asks to stop; AlreadyImported;
 *   StoredFileUnreadable (log-reader) when the stored bytes cannot be fetched; any database
 *   error. In every case nothing of the file is stored.
 */
export async function importSensorLog(target: SensorImportTarget, input: LogImportInput, options: SensorImportOptions = {}): Promise<SensorImportResult> {
  const file = target.filename;
  const criteria = logCriteria(input, file);
  const progressMs = options.progressMs ?? 500;
  // the file's header is read and the mapping checked before anything is written; excluded lines
  // are left out before they are read, and any other rejected row refuses the whole import
  const reader = await openLogReader(target, input, { maxIssues: 1, batchSize: options.batchSize, open: options.open });
  const client = await pgPool().connect().catch((e: unknown) => {
    reader.close();
    throw e;
  });
  let broken = false;
  try {
    await client.query('BEGIN');
    const locked = await client.query<{ state: string }>('SELECT state FROM source_file WHERE id = $1 FOR UPDATE', [target.fileId]);
    if (!locked.rows.length) throw new ImportError('unreadable', 'the uploaded file no longer exists', { file });
    if (locked.rows[0].state === 'imported') throw new AlreadyImported(`"${file}" has already been imported.`);
    // sensor_sample has no foreign keys (migration sensor_sample_storage): this lock keeps the rig
    // from going away before we commit, as the per-row key checks did
    const rig = await client.query('SELECT 1 FROM rig WHERE id = $1 FOR KEY SHARE', [target.rigId]);
    if (!rig.rows.length) throw new ImportError('unreadable', 'the rig no longer exists', { file });

    const dayStart = Math.floor(target.uploadedAt.getTime() / 86_400_000) * 86_400;
    const uploadedS = target.uploadedAt.getTime() / 1000;
    const { fileId, rigId } = target;
    let lastReport = Date.now();
    let written = 0; // samples encoded for COPY so far
    let epochBase = NaN; // epoch s of time zero of the builder's timeS
    let t0Epoch = NaN; // epoch s of the first sample
    let seg: SegmentationResult | undefined;

    const report = async (force = false) => {
      if (!options.onProgress) return;
      const now = Date.now();
      if (!force && now - lastReport < progressMs) return;
      lastReport = now;
      if (await options.onProgress({ ...reader.progress(), rowsDone: written })) throw new ImportCancelled();
    };

    // a collector log's samples keep the sun too (irradiance and wind columns)
    const sun = input.mapping.columns.some((c) => c.field === 'irradiance' || c.field === 'wind');
    const copy = new SampleCopy(client, fileId, rigId, sun);
    let log: SensorLog;
    let channels: SegmentChannels;
    let periods: LogPeriod[] = [];
    let overview: OverviewData | undefined;
    try {
      for await (const s of reader.blocks()) {
        if (s.rejectedCount && !input.skipInvalidRows) throw rowError(s.issues[0], file);
        if (Number.isNaN(epochBase) && s.n > 0) {
          const o = s.origin!;
          epochBase = o.kind === 'datetime' ? o.epochS : o.kind === 'elapsed' ? uploadedS + o.seconds : dayStart;
          t0Epoch = epochBase + s.timeS[0];
        }
        await copy.write(s, written, s.n, epochBase);
        written = s.n;
        await report();
      }
      options.onPhase?.('parsed');
      copy.end();
      // PostgreSQL is still working through the rows in the pool and the socket: segment meanwhile,
      // in slices, so that the event loop keeps handing the pooled buffers on between them
      log = reader.finish();
      channels = segmentChannels(log);
      if (log.n > 0) {
        const steps = segmentLogSteps(channels, criteria);
        for (let r = steps.next(); ; r = steps.next()) {
          if (r.done) { seg = r.value; break; }
          await setImmediate();
        }
        // also while PostgreSQL works: the periods that become trials and the display overview of
        // the log with them (built a channel at a time, so the pooled buffers keep moving)
        periods = trialPeriods(log.lines, channels, seg!, criteria, input.segments, file, log.notices);
        overview = await buildOverviewAsync({ ...channels, ambientTempC: log.ambientTempC, irradianceWPerM2: log.irradianceWPerM2 }, {
          segments: periods.map(({ a, b, st }) => ({ startTimeS: channels.timeS[a], endTimeS: channels.timeS[b], mean: st.mean })),
        });
      }
      await copy.done;
    } catch (e) {
      await copy.abort(e);
      broken = !(e instanceof ImportError || e instanceof ImportCancelled);
      if (isDatabaseError(e)) {
        throw new ImportError('unreadable', `the database refused the samples (${(e as Error).message}); nothing was imported`, { file });
      }
      throw e;
    }
    options.onPhase?.('copied');
    await report(true);
    if (log.n === 0) throw new ImportError('empty_file', 'no samples to import (every row is excluded or the log is empty)', { file });
    const { excludedCount: excludedRows, plausibility: pl, notices } = log;

    if (!seg) seg = segmentLog(channels, criteria);
    options.onPhase?.('segmented');
    await insertOverview(client, { fileId, rigId, startEpochS: t0Epoch }, overview!);
    await insertLogTrials(client, { labId: target.labId, rigId, fileId }, periods, log.lines, channels, criteria, t0Epoch);
    options.onPhase?.('trials');
    await client.query(`UPDATE source_file SET state = 'imported', rows_imported = $2, rig_id = $3, updated_at = now() WHERE id = $1`, [fileId, log.n, rigId]);
    await client.query('COMMIT');
    options.onPhase?.('committed');
    return {
      samples: log.n, trials: periods.length, excludedRows, skippedRows: log.rejectedCount, segmentsFound: seg.segments.length, rejectedRuns: seg.rejected.length,
      gaps: seg.gaps.length, criteria, plausibility: pl, notices,
    };
  } catch (e) {
    try {
      await client.query('ROLLBACK');
    } catch {
      broken = true;
    }
    throw e;
  } finally {
    client.release(broken);
    reader.close();
  }
}
