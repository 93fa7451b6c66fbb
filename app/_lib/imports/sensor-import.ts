import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Writable } from 'node:stream';
import { finished } from 'node:stream/promises';
import { setImmediate } from 'node:timers/promises';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { z } from 'zod';
import { PRESETS, resolveCriteria, segmentLog, segmentLogSteps, segmentStats, type PresetName, type SegmentationResult, type SegmentStats, type SteadyCriteria } from '@/analysis/segment';
import { ImportError, confirmedMappingSchema, createSensorLogBuilder, openDelimited, type RowIssue, type SensorLog } from '.';
import { getObjectStream } from '../server/storage';
import { buildOverviewAsync, insertOverview, type OverviewData } from './sensor-overview';
import { checkTrialRow } from '../rigs/trial-rule';

/**
 * Sensor-log import: the stored file is streamed from object storage, read in blocks of rows,
 * converted to SI and checked row by row (the fast row path, or papaparse and the zod sample schema
 * for any row it does not take), written to `sensor_sample` with COPY, segmented into steady
 * periods, and each accepted period becomes a trial — all in one transaction on one connection, so
 * a bad row halfway through, a database error or a cancellation leaves nothing.
 * Memory stays bounded: one text chunk and one block of rows at a time, a fixed pool of COPY
 * buffers, plus the channels as Float64Arrays for the segmenter (about 44 bytes a sample). Rows go
 * to COPY in its binary format; PostgreSQL ingests while the next rows are read (two processes on
 * two cores), and the segmentation runs in slices while it works through the last of them.
 */
const g = globalThis as typeof globalThis & { __emberlinePgPool?: pg.Pool };

/** One plain `pg` pool per process for COPY (MikroORM's pool stays with the ORM). */
export function copyPool(): pg.Pool {
  if (!g.__emberlinePgPool) {
    g.__emberlinePgPool = new pg.Pool({
      connectionString: process.env.DATABASE_URL ?? 'postgres://emberline@127.0.0.1:54329/emberline',
      max: Number(process.env.IMPORT_POOL_MAX ?? 4),
    });
    g.__emberlinePgPool.on('error', (e) => console.error('sensor import pool:', e.message));
  }
  return g.__emberlinePgPool;
}

const criteriaKeys = Object.keys(PRESETS.laboratory).filter((k) => k !== 'preset');

/** Edits of the preset's thresholds (SI, as in SteadyCriteria); checked again by resolveCriteria. */
const criteriaEdits = z
  .record(z.string(), z.union([z.number(), z.boolean(), z.null()]))
  .refine((o) => Object.keys(o).every((k) => criteriaKeys.includes(k)), { message: `criteria may only set ${criteriaKeys.join(', ')}` });

export const logImportInput = z
  .object({
    mapping: confirmedMappingSchema.refine((m) => m.shape === 'sensorLog', { message: 'the mapping must have shape "sensorLog"' }),
    preset: z.enum(['laboratory', 'collector', 'field']).default('laboratory'),
    criteria: criteriaEdits.optional(),
    /** lines the engineer left out; any other rejected row refuses the whole import (unless skipInvalidRows) */
    excludedLines: z.array(z.number().int().positive()).max(100_000).default([]),
    /** leave out every row that cannot be read (counted in the result) instead of refusing the file */
    skipInvalidRows: z.boolean().default(false),
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

const COPY_SQL = 'COPY sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c) FROM STDIN (FORMAT binary)';

/*
 * COPY's binary format (PostgreSQL manual, "COPY", Binary Format): a signature and two int32
 * words, then per row an int16 field count and each field as int32 length + bytes (-1 = NULL),
 * then an int16 -1. Binary spares both sides the number and timestamp text: uuid is its 16 bytes,
 * int4 big-endian, timestamptz int64 microseconds since 2000-01-01 UTC, float8 IEEE big-endian.
 */
const COPY_SIGNATURE = Buffer.concat([Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1'), Buffer.alloc(8)]);
const COPY_TRAILER = Buffer.from([0xff, 0xff]);
const ROW_BYTES = 2 + (4 + 16) + (4 + 4) + (4 + 16) + (4 + 8) + 4 * (4 + 8); // 110
const PG_EPOCH_S = 946_684_800;
const uuidWords = (id: string) => {
  const b = Buffer.from(id.replace(/-/g, ''), 'hex');
  if (b.length !== 16) throw new TypeError(`not a uuid: ${id}`);
  return [b.readInt32BE(0), b.readInt32BE(4), b.readInt32BE(8), b.readInt32BE(12)];
};

/**
 * Writes one sample as a binary COPY row at `at` and returns the offset after it: the file and
 * rig uuids, the line, taken_at and the four readings (ambient NULL when NaN). DataView calls
 * only, no Buffer copies per row.
 */
function rowEncoder(fileId: string, rigId: string) {
  const [f0, f1, f2, f3] = uuidWords(fileId);
  const [r0, r1, r2, r3] = uuidWords(rigId);
  return (dv: DataView, at: number, line: number, epochS: number, inC: number, outC: number, flow: number, ambC: number): number => {
    dv.setInt16(at, 8);
    dv.setInt32(at + 2, 16); dv.setInt32(at + 6, f0); dv.setInt32(at + 10, f1); dv.setInt32(at + 14, f2); dv.setInt32(at + 18, f3);
    dv.setInt32(at + 22, 4); dv.setInt32(at + 26, line);
    dv.setInt32(at + 30, 16); dv.setInt32(at + 34, r0); dv.setInt32(at + 38, r1); dv.setInt32(at + 42, r2); dv.setInt32(at + 46, r3);
    const us = Math.round((epochS - PG_EPOCH_S) * 1e6);
    const hi = Math.floor(us / 4294967296);
    dv.setInt32(at + 50, 8); dv.setInt32(at + 54, hi); dv.setUint32(at + 58, us - hi * 4294967296);
    dv.setInt32(at + 62, 8); dv.setFloat64(at + 66, inC);
    dv.setInt32(at + 74, 8); dv.setFloat64(at + 78, outC);
    dv.setInt32(at + 86, 8); dv.setFloat64(at + 90, flow);
    if (ambC !== ambC) { dv.setInt32(at + 98, -1); return at + 102; }
    dv.setInt32(at + 98, 8); dv.setFloat64(at + 102, ambC);
    return at + 110;
  };
}

/** 96 × 256 KiB: PostgreSQL's lead (about 220,000 rows) covers the segmentation that runs meanwhile */
const COPY_BUFFER_BYTES = 256 * 1024;
const COPY_BUFFERS = 96;

/**
 * COPY FROM STDIN through a fixed set of reused buffers: a buffer goes back to the pool when the
 * socket has taken its bytes (the write's callback), and waiting for a free one is the
 * back-pressure. Fresh buffers for 110 MB of rows would cost a page fault per 4 KiB, which on
 * this kind of machine takes longer than encoding the rows (filling a new 8 MB array: 55–120 ms;
 * refilling it: 1–2 ms).
 */
class CopyWriter {
  private readonly free: { buf: Buffer; dv: DataView }[] = [];
  private waiting: (() => void) | null = null;
  private failed: Error | null = null;
  /** resolves when PostgreSQL has taken every row (after the trailer), rejects on its error */
  readonly done: Promise<void>;
  constructor(private readonly stream: Writable) {
    for (let i = 0; i < COPY_BUFFERS; i++) {
      const buf = Buffer.allocUnsafeSlow(COPY_BUFFER_BYTES);
      this.free.push({ buf, dv: new DataView(buf.buffer, buf.byteOffset, buf.byteLength) });
    }
    this.done = finished(stream);
    this.done.catch((e: Error) => { this.failed = e; this.wake(); });
  }
  /** a free buffer (waits while all are on their way to the server) */
  async take(): Promise<{ buf: Buffer; dv: DataView }> {
    for (;;) {
      if (this.failed) throw this.failed;
      const b = this.free.pop();
      if (b) return b;
      await new Promise<void>((resolve) => { this.waiting = resolve; });
    }
  }
  /** sends the first `length` bytes of a buffer from `take`, which then goes back to the pool */
  send(b: { buf: Buffer; dv: DataView }, length: number) {
    this.stream.write(b.buf.subarray(0, length), () => { this.free.push(b); this.wake(); });
  }
  /** sends bytes that are not from the pool */
  sendBytes(bytes: Buffer) { this.stream.write(bytes); }
  end(trailer: Buffer) { this.stream.end(trailer); }
  /** cancels the COPY (CopyFail: the server drops what it received) and waits until it is over */
  async abort(e: unknown) {
    if (!this.stream.destroyed) this.stream.destroy(e instanceof Error ? e : new Error(String(e)));
    await this.done.catch(() => undefined);
  }
  private wake() { const w = this.waiting; this.waiting = null; w?.(); }
}

const channelsOf = (log: SensorLog) => {
  let ambientTempC = log.ambientTempC;
  if (ambientTempC) for (let i = 0; i < ambientTempC.length; i++) if (Number.isNaN(ambientTempC[i])) { ambientTempC = null; break; }
  return { timeS: log.timeS, inletTempC: log.inletTempC, outletTempC: log.outletTempC, flowM3PerS: log.flowM3PerS, ambientTempC };
};

function rowError(issue: RowIssue, file: string): ImportError {
  return new ImportError('unreadable', `${issue.message}; nothing was imported (fix the file or exclude the line)`, { file, line: issue.line, column: issue.column });
}

/**
 * Imports one stored sensor log in a single transaction.
 * @throws ImportError for an unreadable file, a bad mapping or a row that fails (with its line);
 *   ImportCancelled when `onProgress` asks to stop; AlreadyImported; any database error.
 *   In every case nothing of the file is stored.
 */
export async function importSensorLog(target: SensorImportTarget, input: LogImportInput, options: SensorImportOptions = {}): Promise<SensorImportResult> {
  let criteria: SteadyCriteria;
  try {
    criteria = resolveCriteria(input.preset as PresetName, (input.criteria ?? {}) as Partial<SteadyCriteria>);
  } catch (e) {
    if (e instanceof RangeError) throw new ImportError('bad_mapping', `steady-state criteria: ${e.message}`, { file: target.filename });
    throw e;
  }
  const file = target.filename;
  const excluded = new Set(input.excludedLines);
  const progressMs = options.progressMs ?? 500;
  const bytesTotal = target.sizeBytes;
  let bytesDone = 0;
  const raw = options.open ? await options.open() : await getObjectStream(target.storageKey);
  async function* counted() {
    for await (const chunk of raw) { bytesDone += chunk.length; yield chunk; }
  }

  const pool = copyPool();
  const client = await pool.connect();
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

    const src = await openDelimited(counted(), { fileName: file, batchSize: options.batchSize });
    // validates the mapping against the header before anything is written; excluded lines are
    // left out before they are read, and any other rejected row refuses the whole import
    const builder = createSensorLogBuilder(input.mapping, src.header, { file }, { maxIssues: 1, excludedLines: excluded, text: src.dialect, sizeHintBytes: target.sizeBytes });

    const dayStart = Math.floor(target.uploadedAt.getTime() / 86_400_000) * 86_400;
    const uploadedS = target.uploadedAt.getTime() / 1000;
    const fileId = target.fileId, rigId = target.rigId;
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
      if (await options.onProgress({ bytesDone, bytesTotal, rowsDone: written })) throw new ImportCancelled();
    };

    const row = rowEncoder(fileId, rigId);
    const copy = new CopyWriter(client.query(copyFrom(COPY_SQL)));
    let log: SensorLog;
    let channels: ReturnType<typeof channelsOf>;
    let pieces: Piece[] = [];
    let overview: OverviewData | undefined;
    try {
      copy.sendBytes(COPY_SIGNATURE);
      for await (const block of src.blocks()) {
        builder.add(block);
        const s = builder.accepted();
        if (s.rejectedCount && !input.skipInvalidRows) throw rowError(s.issues[0], file);
        if (Number.isNaN(epochBase) && s.n > 0) {
          const o = s.origin!;
          epochBase = o.kind === 'datetime' ? o.epochS : o.kind === 'elapsed' ? uploadedS + o.seconds : dayStart;
          t0Epoch = epochBase + s.timeS[0];
        }
        const amb = s.ambientTempC.length > 0;
        for (let i = written; i < s.n;) {
          const b = await copy.take();
          const dv = b.dv;
          let at = 0;
          for (; i < s.n && at <= COPY_BUFFER_BYTES - ROW_BYTES; i++) {
            at = row(dv, at, s.lines[i], epochBase + s.timeS[i], s.inletTempC[i], s.outletTempC[i], s.flowM3PerS[i], amb ? s.ambientTempC[i] : NaN);
          }
          copy.send(b, at);
        }
        written = s.n;
        await report();
      }
      options.onPhase?.('parsed');
      copy.end(COPY_TRAILER);
      // PostgreSQL is still working through the rows in the pool and the socket: segment meanwhile,
      // in slices, so that the event loop keeps handing the pooled buffers on between them
      log = builder.finish();
      channels = channelsOf(log);
      if (log.n > 0) {
        const steps = segmentLogSteps(channels, criteria);
        for (let r = steps.next(); ; r = steps.next()) {
          if (r.done) { seg = r.value; break; }
          await setImmediate();
        }
        // also while PostgreSQL works: the periods that become trials and the display overview of
        // the log with them (built a channel at a time, so the pooled buffers keep moving)
        pieces = trialPieces(log, channels, seg!, criteria, input.segments, file);
        overview = await buildOverviewAsync(channels, {
          segments: pieces.map(({ a, b, st }) => ({ startTimeS: channels.timeS[a], endTimeS: channels.timeS[b], mean: st.mean })),
        });
      }
      await copy.done;
    } catch (e) {
      await copy.abort(e);
      broken = !(e instanceof ImportError || e instanceof ImportCancelled);
      if (e instanceof Error && 'code' in e && typeof (e as { code?: unknown }).code === 'string' && /^[0-9A-Z]{5}$/.test((e as { code: string }).code)) {
        throw new ImportError('unreadable', `the database refused the samples (${e.message}); nothing was imported`, { file });
      }
      throw e;
    }
    options.onPhase?.('copied');
    await report(true);
    if (log.n === 0) throw new ImportError('empty_file', 'no samples to import (every row is excluded or the log is empty)', { file });
    const { excludedCount: excludedRows, plausibility: pl, notices } = log;

    if (!seg) seg = segmentLog(channels, criteria);
    options.onPhase?.('segmented');
    const ln = log.lines;
    await insertOverview(client, { fileId, rigId, startEpochS: t0Epoch }, overview!);

    // one statement for all trials: a column array per field (uuid, timestamptz, float8, int, jsonb)
    const cols: unknown[][] = Array.from({ length: 8 }, () => []);
    for (const { a, b, st, extra } of pieces) {
      const segment = {
        criteria, startLine: ln[a], endLine: ln[b], startTimeS: channels.timeS[a], endTimeS: channels.timeS[b],
        durationS: channels.timeS[b] - channels.timeS[a], n: st.n, mean: st.mean, sd: st.sd, blockStdError: st.blockStdError,
        blocks: st.blocks, outletSlopeKPerS: st.outletSlopeKPerS, inletSlopeKPerS: st.inletSlopeKPerS, ...extra,
      };
      const values = [randomUUID(), new Date(Math.round((t0Epoch + channels.timeS[a]) * 1000)), st.mean.flowM3PerS, st.mean.inletTempC, st.mean.outletTempC, st.mean.ambientTempC, ln[a], JSON.stringify(segment)];
      values.forEach((v, c) => cols[c].push(v));
    }
    if (pieces.length) {
      await client.query(
        `INSERT INTO trial (id, lab_id, rig_id, started_at, flow_m3_per_s, inlet_c, outlet_c, ambient_c, source_file_id, source_line, segment, created_at, updated_at, origin)
         SELECT id, $9, $10, started_at, flow, inlet, outlet, ambient, $11, line, segment, now(), now(), 'log-segment'
         FROM unnest($1::uuid[], $2::timestamptz[], $3::float8[], $4::float8[], $5::float8[], $6::float8[], $7::int[], $8::jsonb[])
           AS t (id, started_at, flow, inlet, outlet, ambient, line, segment)`,
        [...cols, target.labId, rigId, fileId],
      );
    }
    options.onPhase?.('trials');
    await client.query(`UPDATE source_file SET state = 'imported', rows_imported = $2, rig_id = $3, updated_at = now() WHERE id = $1`, [fileId, log.n, rigId]);
    await client.query('COMMIT');
    options.onPhase?.('committed');
    return {
      samples: log.n, trials: pieces.length, excludedRows, skippedRows: log.rejectedCount, segmentsFound: seg.segments.length, rejectedRuns: seg.rejected.length,
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
  }
}

interface Piece { a: number; b: number; st: SegmentStats; extra: Record<string, unknown> }

/**
 * The periods that become trials: the engineer's (source lines, inclusive), or every steady
 * segment found. Each period's means go through the one trial rule (`rigs/trial-rule.ts`), as a
 * typed or imported trial would: a period the engineer chose that the rule refuses stops the
 * import with the reason; a found segment it refuses is left out with a notice.
 */
function trialPieces(log: SensorLog, channels: ReturnType<typeof channelsOf>, seg: SegmentationResult, criteria: SteadyCriteria, chosen: LogImportInput['segments'], file: string): Piece[] {
  const ln = log.lines;
  const pieces: Piece[] = [];
  const ruled = (p: Piece, explicit: boolean) => {
    const m = p.st.mean;
    const r = checkTrialRow({ flowM3PerS: m.flowM3PerS, inletTempC: m.inletTempC, outletTempC: m.outletTempC, ambientTempC: m.ambientTempC ?? undefined }, ln[p.a]);
    if (r.ok) return pieces.push(p);
    const why = `the period from line ${ln[p.a]} to ${ln[p.b]} cannot be a trial: ${r.issues.map((i) => i.message).join('; ')}`;
    if (explicit) throw new ImportError('bad_period', why, { file, line: ln[p.a] });
    log.notices.push(why);
  };
  if (chosen) {
    for (const s of chosen) {
      const a = lowerBound(ln, s.startLine), b = lowerBound(ln, s.endLine + 1) - 1;
      if (b - a < 1) throw new ImportError('bad_mapping', `the period from line ${s.startLine} to ${s.endLine} holds fewer than two samples`, { file });
      ruled({ a, b, st: segmentStats(channels, a, b, criteria.blockS), extra: { chosen: true } }, true);
    }
  } else {
    for (const s of seg.segments) {
      const { criteria: _c, startIndex, endIndex, ...rest } = s;
      void _c;
      ruled({ a: startIndex, b: endIndex, st: s, extra: { maxDeviation: rest.maxDeviation } }, false);
    }
  }
  return pieces;
}

/** First index i with a[i] >= x (a sorted ascending). */
function lowerBound(a: Int32Array, x: number): number {
  let lo = 0, hi = a.length;
  while (lo < hi) { const mid = (lo + hi) >>> 1; if (a[mid] < x) lo = mid + 1; else hi = mid; }
  return lo;
}
