import 'server-only';
import type { Writable } from 'node:stream';
import { finished } from 'node:stream/promises';
import type pg from 'pg';
import { from as copyFrom } from 'pg-copy-streams';

/**
 * The COPY writer: a log's samples into `sensor_sample` with `COPY … FROM STDIN (FORMAT binary)`,
 * on the caller's connection and transaction, through a fixed pool of reused buffers.
 *
 * Owns: the binary row encoding of `sensor_sample` (its column list and order), the buffer pool and
 * its back-pressure, ending and aborting the COPY. May import: `pg` (types) and pg-copy-streams.
 * It knows nothing of files, mappings or trials: it is handed columns of samples already in SI.
 */

const COPY_SQL = 'COPY sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c) FROM STDIN (FORMAT binary)';
/** a collector log's rows add the sun: irradiance in the collector plane and wind (migration sensor_sample_sun) */
const COPY_SUN_SQL = 'COPY sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c, irradiance_w_per_m2, wind_m_per_s) FROM STDIN (FORMAT binary)';

/*
 * COPY's binary format (PostgreSQL manual, "COPY", Binary Format): a signature and two int32
 * words, then per row an int16 field count and each field as int32 length + bytes (-1 = NULL),
 * then an int16 -1. Binary spares both sides the number and timestamp text: uuid is its 16 bytes,
 * int4 big-endian, timestamptz int64 microseconds since 2000-01-01 UTC, float8 IEEE big-endian.
 */
const COPY_SIGNATURE = Buffer.concat([Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1'), Buffer.alloc(8)]);
const COPY_TRAILER = Buffer.from([0xff, 0xff]);
const ROW_BYTES = 2 + (4 + 16) + (4 + 4) + (4 + 16) + (4 + 8) + 4 * (4 + 8); // 110
const SUN_ROW_BYTES = ROW_BYTES + 2 * (4 + 8); // 134
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

/** A nullable float8 field at `at` (NULL when NaN); returns the offset after it. */
function float8OrNull(dv: DataView, at: number, v: number): number {
  if (v !== v) { dv.setInt32(at, -1); return at + 4; }
  dv.setInt32(at, 8); dv.setFloat64(at + 4, v);
  return at + 12;
}

/**
 * A collector log's row: the row of `rowEncoder` with ten fields, then irradiance and wind
 * (NULL when NaN). A separate encoder, so that coil logs keep their eight-field rows.
 */
function sunRowEncoder(fileId: string, rigId: string) {
  const row = rowEncoder(fileId, rigId);
  return (dv: DataView, at: number, line: number, epochS: number, inC: number, outC: number, flow: number, ambC: number, irr: number, wind: number): number => {
    const end = row(dv, at, line, epochS, inC, outC, flow, ambC);
    dv.setInt16(at, 10);
    return float8OrNull(dv, float8OrNull(dv, end, irr), wind);
  };
}

/** 96 × 256 KiB: PostgreSQL's lead (about 220,000 rows) covers the segmentation that runs meanwhile */
const COPY_BUFFER_BYTES = 256 * 1024;
const COPY_BUFFERS = 96;

/** Sample columns as the log builder holds them (`AcceptedSamples`): SI, times in s from `epochBase`. */
export interface SampleColumns {
  lines: Int32Array;
  timeS: Float64Array;
  inletTempC: Float64Array;
  outletTempC: Float64Array;
  flowM3PerS: Float64Array;
  /** empty when the log has no ambient column; NaN where a sample has none */
  ambientTempC: Float64Array;
  /** collector logs: irradiance in the collector plane (W/m²) and wind (m/s); empty when not mapped */
  irradianceWPerM2?: Float64Array;
  windMPerS?: Float64Array;
}

interface PooledBuffer { buf: Buffer; dv: DataView }

/**
 * One COPY of a file's samples. A buffer goes back to the pool when the socket has taken its
 * bytes (the write's callback), and waiting for a free one is the back-pressure. Fresh buffers for
 * 110 MB of rows would cost a page fault per 4 KiB, which on this kind of machine takes longer
 * than encoding the rows (filling a new 8 MB array: 55–120 ms; refilling it: 1–2 ms).
 */
export class SampleCopy {
  private readonly free: PooledBuffer[] = [];
  private readonly stream: Writable;
  private readonly row: ReturnType<typeof rowEncoder>;
  private readonly sunRow: ReturnType<typeof sunRowEncoder> | null;
  private waiting: (() => void) | null = null;
  private failed: Error | null = null;
  /** resolves when PostgreSQL has taken every row (after `end`), rejects on its error */
  readonly done: Promise<void>;

  /**
   * Starts the COPY on `client` (inside the caller's transaction) for the samples of one file and
   * rig; `sun` when the log has irradiance or wind (a collector log), whose rows then carry both.
   */
  constructor(client: pg.ClientBase, fileId: string, rigId: string, sun = false) {
    this.row = rowEncoder(fileId, rigId);
    this.sunRow = sun ? sunRowEncoder(fileId, rigId) : null;
    this.stream = client.query(copyFrom(sun ? COPY_SUN_SQL : COPY_SQL));
    for (let i = 0; i < COPY_BUFFERS; i++) {
      const buf = Buffer.allocUnsafeSlow(COPY_BUFFER_BYTES);
      this.free.push({ buf, dv: new DataView(buf.buffer, buf.byteOffset, buf.byteLength) });
    }
    this.done = finished(this.stream);
    this.done.catch((e: Error) => { this.failed = e; this.wake(); });
    this.stream.write(COPY_SIGNATURE);
  }

  /**
   * Encodes samples `from`..`to` (exclusive) of `s` and sends them, a pooled buffer at a time;
   * waits while every buffer is on its way to the server.
   * @param epochBase epoch seconds of time zero of `s.timeS`
   * @throws the COPY's error when PostgreSQL has refused it
   */
  async write(s: SampleColumns, from: number, to: number, epochBase: number): Promise<void> {
    if (this.sunRow) return this.writeSun(s, from, to, epochBase, this.sunRow);
    const row = this.row;
    const amb = s.ambientTempC.length > 0;
    for (let i = from; i < to;) {
      const b = await this.take();
      const dv = b.dv;
      let at = 0;
      for (; i < to && at <= COPY_BUFFER_BYTES - ROW_BYTES; i++) {
        at = row(dv, at, s.lines[i], epochBase + s.timeS[i], s.inletTempC[i], s.outletTempC[i], s.flowM3PerS[i], amb ? s.ambientTempC[i] : NaN);
      }
      this.send(b, at);
    }
  }

  /** {@link write} for a collector log: every row also carries irradiance and wind (NULL where missing). */
  private async writeSun(s: SampleColumns, from: number, to: number, epochBase: number, row: ReturnType<typeof sunRowEncoder>): Promise<void> {
    const amb = s.ambientTempC.length > 0;
    const irr = s.irradianceWPerM2?.length ? s.irradianceWPerM2 : null;
    const wind = s.windMPerS?.length ? s.windMPerS : null;
    for (let i = from; i < to;) {
      const b = await this.take();
      const dv = b.dv;
      let at = 0;
      for (; i < to && at <= COPY_BUFFER_BYTES - SUN_ROW_BYTES; i++) {
        at = row(dv, at, s.lines[i], epochBase + s.timeS[i], s.inletTempC[i], s.outletTempC[i], s.flowM3PerS[i], amb ? s.ambientTempC[i] : NaN, irr ? irr[i] : NaN, wind ? wind[i] : NaN);
      }
      this.send(b, at);
    }
  }

  /** Sends the trailer: no more rows; `done` resolves when PostgreSQL has taken them all. */
  end() { this.stream.end(COPY_TRAILER); }

  /** Cancels the COPY (CopyFail: the server drops what it received) and waits until it is over. */
  async abort(e: unknown) {
    if (!this.stream.destroyed) this.stream.destroy(e instanceof Error ? e : new Error(String(e)));
    await this.done.catch(() => undefined);
  }

  /** a free buffer (waits while all are on their way to the server) */
  private async take(): Promise<PooledBuffer> {
    for (;;) {
      if (this.failed) throw this.failed;
      const b = this.free.pop();
      if (b) return b;
      await new Promise<void>((resolve) => { this.waiting = resolve; });
    }
  }

  /** sends the first `length` bytes of a buffer from `take`, which then goes back to the pool */
  private send(b: PooledBuffer, length: number) {
    this.stream.write(b.buf.subarray(0, length), () => { this.free.push(b); this.wake(); });
  }

  private wake() { const w = this.waiting; this.waiting = null; w?.(); }
}
