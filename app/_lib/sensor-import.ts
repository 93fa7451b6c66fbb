import 'server-only';
import { randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import { z } from 'zod';
import { PRESETS, resolveCriteria, segmentLog, segmentStats, type PresetName, type SegmentStats, type SteadyCriteria } from '@/analysis/segment';
import { ImportError, confirmedMappingSchema, createSensorLogBuilder, openDelimited, type RowIssue, type SensorLog } from './import';
import { getObjectStream } from './storage';
import { writeSensorOverview } from './sensor-overview';

/**
 * Sensor-log import: the stored file is streamed from object storage, parsed in row batches,
 * converted to SI and checked row by row, written to `sensor_sample` with COPY, segmented into
 * steady periods, and each accepted period becomes a trial — all in one transaction on one
 * connection, so a bad row halfway through, a database error or a cancellation leaves nothing.
 * Memory stays bounded: one text chunk and one batch of rows at a time, plus the channels as
 * Float64Arrays for the segmenter (about 44 bytes a sample). Rows go to COPY in its binary format.
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
    /** lines the engineer left out; any other rejected row refuses the whole import */
    excludedLines: z.array(z.number().int().positive()).max(100_000).default([]),
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
}

export interface SensorImportResult {
  samples: number;
  trials: number;
  excludedRows: number;
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

class Grow<T extends Float64Array | Int32Array> {
  n = 0;
  constructor(public a: T, private readonly make: (n: number) => T) {}
  push(x: number) {
    if (this.n === this.a.length) { const b = this.make(this.a.length * 2); b.set(this.a); this.a = b; }
    this.a[this.n++] = x;
  }
  done(): T { return this.a.subarray(0, this.n) as T; }
}
const f64 = (n = 1 << 16) => new Grow(new Float64Array(n), (k) => new Float64Array(k));

const COPY_SQL = 'COPY sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c) FROM STDIN (FORMAT binary)';

/*
 * COPY's binary format (PostgreSQL manual, "COPY", Binary Format): a signature and two int32
 * words, then per row an int16 field count and each field as int32 length + bytes (-1 = NULL),
 * then an int16 -1. Binary spares both sides the number and timestamp text: uuid is its 16 bytes,
 * int4 big-endian, timestamptz int64 microseconds since 2000-01-01 UTC, float8 IEEE big-endian.
 */
const COPY_SIGNATURE = Buffer.concat([Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1'), Buffer.alloc(8)]);
const COPY_TRAILER = Buffer.from([0xff, 0xff]);
const ROW_BYTES = 2 + (4 + 16) + (4 + 4) + (4 + 16) + (4 + 8) + 4 * (4 + 8);
const PG_EPOCH_S = 946_684_800;
const uuidBytes = (id: string) => {
  const b = Buffer.from(id.replace(/-/g, ''), 'hex');
  if (b.length !== 16) throw new TypeError(`not a uuid: ${id}`);
  return b;
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

    const src = await openDelimited(counted(), { fileName: file, batchSize: options.batchSize });
    // validates the mapping against the header before anything is written
    createSensorLogBuilder(input.mapping, src.header, { file });

    const t = f64(), tin = f64(), tout = f64(), q = f64(), amb = f64();
    const lines = new Grow(new Int32Array(1 << 16), (k) => new Int32Array(k));
    let hasAmbient = false;
    let excludedRows = 0;
    let t0Epoch: number | null = null; // epoch s of the first accepted sample
    let prevEpoch = -Infinity;
    let clockDay = 0; // s added to clock times after midnight roll-overs
    const dayStart = Math.floor(target.uploadedAt.getTime() / 86_400_000) * 86_400;
    const uploadedS = target.uploadedAt.getTime() / 1000;
    const pl = { outletBelowInlet: 0, aboveBoiling: 0, nonPositiveFlow: 0 };
    const notices = new Set<string>();
    const fileId = target.fileId, rigId = target.rigId;
    let lastReport = Date.now();

    const report = async (force = false) => {
      if (!options.onProgress) return;
      const now = Date.now();
      if (!force && now - lastReport < progressMs) return;
      lastReport = now;
      if (await options.onProgress({ bytesDone, bytesTotal, rowsDone: t.n })) throw new ImportCancelled();
    };

    const fileUuid = uuidBytes(fileId), rigUuid = uuidBytes(rigId);
    async function* copyData(): AsyncGenerator<Buffer> {
      yield COPY_SIGNATURE;
      for await (const batch of src.batches()) {
        // One builder per batch: the samples it accepts are exactly this batch's (the builder
        // counts time from its first sample, which we turn back into epoch seconds below).
        const b = createSensorLogBuilder(input.mapping, src.header, { file }, { maxIssues: batch.rows.length });
        b.add(batch);
        const log = b.finish();
        for (const issue of log.issues) {
          if (excluded.has(issue.line)) excludedRows++;
          else throw rowError(issue, file);
        }
        for (const n of log.notices) notices.add(n);
        pl.outletBelowInlet += log.plausibility.outletBelowInlet;
        pl.aboveBoiling += log.plausibility.aboveBoiling;
        pl.nonPositiveFlow += log.plausibility.nonPositiveFlow;
        const o = log.timeOrigin;
        let base: number;
        if (o.kind === 'datetime') base = o.epochS;
        else if (o.kind === 'elapsed') base = uploadedS + o.seconds;
        else {
          const [h, m, s] = o.iso.split(':').map(Number);
          base = dayStart + clockDay + h * 3600 + m * 60 + s;
          if (base < prevEpoch - 43_200) { clockDay += 86_400; base += 86_400; }
        }
        if (log.ambientTempC) hasAmbient = true;
        const buf = Buffer.allocUnsafe(log.n * ROW_BYTES);
        const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
        let at = 0;
        for (let i = 0; i < log.n; i++) {
          const line = log.lines[i];
          if (excluded.has(line)) { excludedRows++; continue; }
          const epoch = base + log.timeS[i];
          if (!(epoch > prevEpoch)) {
            throw rowError({ line, severity: 'error', code: 'time_not_increasing', field: 'timeS', message: 'time does not increase from the row before' } as RowIssue, file);
          }
          prevEpoch = epoch;
          if (t0Epoch === null) t0Epoch = epoch;
          const a = log.ambientTempC ? log.ambientTempC[i] : NaN;
          const ti = log.inletTempC[i], to = log.outletTempC[i], qi = log.flowM3PerS[i];
          t.push(epoch - t0Epoch); tin.push(ti); tout.push(to); q.push(qi); amb.push(a);
          lines.push(line);
          dv.setInt16(at, 8); at += 2;
          dv.setInt32(at, 16); fileUuid.copy(buf, at + 4); at += 20;
          dv.setInt32(at, 4); dv.setInt32(at + 4, line); at += 8;
          dv.setInt32(at, 16); rigUuid.copy(buf, at + 4); at += 20;
          const us = Math.round((epoch - PG_EPOCH_S) * 1e6);
          const hi = Math.floor(us / 4294967296);
          dv.setInt32(at, 8); dv.setInt32(at + 4, hi); dv.setUint32(at + 8, us - hi * 4294967296); at += 12;
          dv.setInt32(at, 8); dv.setFloat64(at + 4, ti); at += 12;
          dv.setInt32(at, 8); dv.setFloat64(at + 4, to); at += 12;
          dv.setInt32(at, 8); dv.setFloat64(at + 4, qi); at += 12;
          if (Number.isNaN(a)) { dv.setInt32(at, -1); at += 4; } else { dv.setInt32(at, 8); dv.setFloat64(at + 4, a); at += 12; }
        }
        if (at) yield buf.subarray(0, at);
        await report();
      }
      yield COPY_TRAILER;
    }

    try {
      await pipeline(Readable.from(copyData()), client.query(copyFrom(COPY_SQL)));
    } catch (e) {
      broken = !(e instanceof ImportError || e instanceof ImportCancelled);
      if (e instanceof Error && 'code' in e && typeof (e as { code?: unknown }).code === 'string' && /^[0-9A-Z]{5}$/.test((e as { code: string }).code)) {
        throw new ImportError('unreadable', `the database refused the samples (${e.message}); nothing was imported`, { file });
      }
      throw e;
    }
    await report(true);
    if (t.n === 0) throw new ImportError('empty_file', 'no samples to import (every row is excluded or the log is empty)', { file });

    const channels = { timeS: t.done(), inletTempC: tin.done(), outletTempC: tout.done(), flowM3PerS: q.done(), ambientTempC: hasAmbient ? amb.done() : null };
    if (hasAmbient) for (let i = 0; i < channels.timeS.length; i++) if (Number.isNaN(channels.ambientTempC![i])) { channels.ambientTempC = null; break; }
    const seg = segmentLog(channels, criteria);
    await writeSensorOverview(client, { fileId, rigId, startEpochS: t0Epoch! }, channels, seg);
    const ln = lines.done();
    const pieces: { a: number; b: number; st: SegmentStats; extra: Record<string, unknown> }[] = [];
    if (input.segments) {
      for (const s of input.segments) {
        const a = lowerBound(ln, s.startLine), b = lowerBound(ln, s.endLine + 1) - 1;
        if (b - a < 1) throw new ImportError('bad_mapping', `the period from line ${s.startLine} to ${s.endLine} holds fewer than two samples`, { file });
        pieces.push({ a, b, st: segmentStats(channels, a, b, criteria.blockS), extra: { chosen: true } });
      }
    } else {
      for (const s of seg.segments) {
        const { criteria: _c, startIndex, endIndex, ...rest } = s;
        void _c;
        pieces.push({ a: startIndex, b: endIndex, st: s, extra: { maxDeviation: rest.maxDeviation } });
      }
    }

    const trialRows = pieces.map(({ a, b, st, extra }) => {
      const startedAt = new Date(Math.round((t0Epoch! + channels.timeS[a]) * 1000));
      const segment = {
        criteria, startLine: ln[a], endLine: ln[b], startTimeS: channels.timeS[a], endTimeS: channels.timeS[b],
        durationS: channels.timeS[b] - channels.timeS[a], n: st.n, mean: st.mean, sd: st.sd, blockStdError: st.blockStdError,
        blocks: st.blocks, outletSlopeKPerS: st.outletSlopeKPerS, inletSlopeKPerS: st.inletSlopeKPerS, ...extra,
      };
      return [randomUUID(), target.labId, rigId, startedAt, st.mean.flowM3PerS, st.mean.inletTempC, st.mean.outletTempC, st.mean.ambientTempC, fileId, ln[a], JSON.stringify(segment)];
    });
    for (let i = 0; i < trialRows.length; i += 500) {
      const chunk = trialRows.slice(i, i + 500);
      const values = chunk.map((_, r) => `(${Array.from({ length: 11 }, (_, c) => `$${r * 11 + c + 1}`).join(', ')}, now(), now(), 'log-segment')`).join(', ');
      await client.query(
        `INSERT INTO trial (id, lab_id, rig_id, started_at, flow_m3_per_s, inlet_c, outlet_c, ambient_c, source_file_id, source_line, segment, created_at, updated_at, origin) VALUES ${values}`,
        chunk.flat(),
      );
    }
    await client.query(`UPDATE source_file SET state = 'imported', rows_imported = $2, rig_id = $3, updated_at = now() WHERE id = $1`, [fileId, t.n, rigId]);
    await client.query('COMMIT');
    return {
      samples: t.n, trials: trialRows.length, excludedRows, segmentsFound: seg.segments.length, rejectedRuns: seg.rejected.length,
      gaps: seg.gaps.length, criteria, plausibility: pl, notices: [...notices],
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

/** First index i with a[i] >= x (a sorted ascending). */
function lowerBound(a: Int32Array, x: number): number {
  let lo = 0, hi = a.length;
  while (lo < hi) { const mid = (lo + hi) >>> 1; if (a[mid] < x) lo = mid + 1; else hi = mid; }
  return lo;
}
