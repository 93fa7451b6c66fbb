import 'server-only';
import { isUuid } from '../labs/load-in-lab';
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import { to as copyTo } from 'pg-copy-streams';
import { setImmediate } from 'node:timers/promises';
import { DISPLAY_MAX_POINTS, overviewIndicesSteps } from '@/analysis/reduce';
import { segmentLog, type PresetName, type SteadyCriteria } from '@/analysis/segment';
import type { OverviewPoints, OverviewSegment } from '@/entities/sensor-overview';
import { segmentChannels } from './log-reader';
import { displayPoints, ms, pointsAt, reducedChannels, sig, type OverviewChannels } from './display-points';

export { displayPoints, type OverviewChannels };

/**
 * The display overview of a sensor log (entities/sensor-overview.ts): at most 2,000 samples on one
 * time base chosen by LTTB with every channel's extremes and the endpoints, plus the steady
 * segments. It is built while the import's COPY finishes and stored in the import's transaction, so a study
 * page reads one row instead of a million samples; logs imported before it existed get theirs
 * built from `sensor_sample` on first read (`ensureSensorOverview`). The preview's plot series
 * are the same display points (`displayPoints`), of the whole log or of the stretch zoomed into.
 *
 * Owns: the display points of a log (which samples, how rounded), the `sensor_overview` row and
 * its backfill. May import: analysis/reduce, analysis/segment, log-reader (the segmentation
 * channels), labs/load-in-lab (the UUID rule), entities/sensor-overview (types), `pg` (types) and
 * pg-copy-streams; the caller's connection or pool.
 */

/** The segmentation as analysis/segment returns it (only what the overview keeps). */
export interface OverviewSegmentation {
  segments: readonly { startTimeS: number; endTimeS: number; mean: { inletTempC: number; outletTempC: number; flowM3PerS: number } }[];
}

/** What the overview row holds besides its keys. */
export interface OverviewData {
  samples: number;
  durationS: number;
  maxPoints: number;
  points: OverviewPoints;
  segments: OverviewSegment[];
}

/**
 * The overview of a log's channels and segments.
 * @throws as overviewIndices (a channel of another length, decreasing time).
 */
export function buildOverview(ch: OverviewChannels, seg: OverviewSegmentation, maxPoints = DISPLAY_MAX_POINTS): OverviewData {
  return overviewOf(ch, seg, maxPoints, displayPoints(ch, maxPoints));
}

/**
 * {@link buildOverview} letting other work run between its channels (a macrotask each): the import
 * builds the overview while PostgreSQL is still taking its last rows.
 */
export async function buildOverviewAsync(ch: OverviewChannels, seg: OverviewSegmentation, maxPoints = DISPLAY_MAX_POINTS): Promise<OverviewData> {
  let idx: Uint32Array = new Uint32Array(0);
  if (ch.timeS.length) {
    const steps = overviewIndicesSteps(ch.timeS, reducedChannels(ch), maxPoints);
    for (let r = steps.next(); ; r = steps.next()) {
      if (r.done) { idx = r.value; break; }
      await setImmediate();
    }
  }
  return overviewOf(ch, seg, maxPoints, pointsAt(ch, idx));
}


function overviewOf(ch: OverviewChannels, seg: OverviewSegmentation, maxPoints: number, points: OverviewPoints): OverviewData {
  const n = ch.timeS.length;
  return {
    samples: n,
    durationS: n ? ch.timeS[n - 1] - ch.timeS[0] : 0,
    maxPoints,
    points,
    segments: seg.segments.map((s) => ({
      startS: ms(s.startTimeS), endS: ms(s.endTimeS),
      inletTempC: sig(s.mean.inletTempC) ?? NaN, outletTempC: sig(s.mean.outletTempC) ?? NaN, flowM3PerS: sig(s.mean.flowM3PerS) ?? NaN,
    })),
  };
}

const UPSERT = `INSERT INTO sensor_overview (id, created_at, updated_at, source_file_id, rig_id, started_at, samples, duration_s, max_points, points, segments)
  VALUES ($1, now(), now(), $2, $3, $4, $5, $6, $7, $8, $9)
  ON CONFLICT (source_file_id) DO UPDATE SET rig_id = excluded.rig_id, started_at = excluded.started_at, samples = excluded.samples,
    duration_s = excluded.duration_s, max_points = excluded.max_points, points = excluded.points, segments = excluded.segments, updated_at = now()`;

/** Stores an overview (an upsert on its source file), on the caller's connection and transaction. */
export async function insertOverview(client: pg.ClientBase, ids: { fileId: string; rigId: string; startEpochS: number }, o: OverviewData) {
  await client.query(UPSERT, [
    randomUUID(), ids.fileId, ids.rigId, new Date(Math.round(ids.startEpochS * 1000)), o.samples, o.durationS, o.maxPoints,
    JSON.stringify(o.points), JSON.stringify(o.segments),
  ]);
}

// ---- backfill for logs imported before the overview existed ----


class Column {
  a: Float64Array;
  n = 0;
  constructor(size: number) { this.a = new Float64Array(Math.max(16, size)); }
  push(v: number) {
    if (this.n === this.a.length) { const b = new Float64Array(this.a.length * 2); b.set(this.a); this.a = b; }
    this.a[this.n++] = v;
  }
  done() { return this.a.subarray(0, this.n); }
}

/**
 * Reads a log's samples in line order with a binary COPY (PostgreSQL manual, "COPY", Binary
 * Format): per row an int16 field count, then each field as int32 length (−1 = NULL) and a
 * big-endian float8. NULL readings become NaN. Returns epoch seconds, the four channels and the irradiance.
 */
async function readSamples(client: pg.ClientBase, fileId: string, expected: number) {
  if (!isUuid(fileId)) throw new TypeError(`not a uuid: ${fileId}`);
  const cols = Array.from({ length: 6 }, () => new Column(expected));
  const stream = client.query(copyTo(
    `COPY (SELECT extract(epoch FROM taken_at)::float8, inlet_c, outlet_c, flow_m3_per_s, ambient_c, irradiance_w_per_m2 FROM sensor_sample WHERE source_file_id = '${fileId}' ORDER BY line) TO STDOUT (FORMAT binary)`,
  ));
  let pending: Buffer = Buffer.alloc(0);
  let headerDone = false;
  for await (const chunk of stream as AsyncIterable<Buffer>) {
    let buf: Buffer = pending.length ? Buffer.concat([pending, chunk]) : chunk;
    let at = 0;
    if (!headerDone) {
      if (buf.length < 19) { pending = buf; continue; }
      const ext = buf.readInt32BE(15);
      if (buf.length < 19 + ext) { pending = buf; continue; }
      at = 19 + ext;
      headerDone = true;
    }
    for (;;) {
      if (buf.length - at < 2) break;
      const fields = buf.readInt16BE(at);
      if (fields === -1) { at = buf.length; break; }
      // a row of six float8 fields is at most 2 + 6 × 12 bytes; wait for all of it
      let need = 2, ok = true;
      for (let f = 0; f < fields; f++) {
        if (buf.length - at < need + 4) { ok = false; break; }
        const len = buf.readInt32BE(at + need);
        need += 4 + Math.max(0, len);
      }
      if (!ok || buf.length - at < need) break;
      let p = at + 2;
      for (let f = 0; f < fields; f++) {
        const len = buf.readInt32BE(p);
        cols[f].push(len === 8 ? buf.readDoubleBE(p + 4) : NaN);
        p += 4 + Math.max(0, len);
      }
      at += need;
    }
    pending = at < buf.length ? buf.subarray(at) : Buffer.alloc(0);
    buf = pending;
  }
  const [epoch, inlet, outlet, flow, ambient, irradiance] = cols.map((c) => c.done());
  return { epoch, inlet, outlet, flow, ambient, irradiance };
}

/** The criteria the log was segmented with at import (stored with its trials), else the laboratory preset. */
async function importCriteria(client: pg.ClientBase, fileId: string): Promise<SteadyCriteria | PresetName> {
  const r = await client.query<{ c: SteadyCriteria | null }>(
    `SELECT segment->'criteria' AS c FROM trial WHERE source_file_id = $1 AND origin = 'log-segment' AND segment ? 'criteria' LIMIT 1`, [fileId],
  );
  const c = r.rows[0]?.c;
  return c && typeof c === 'object' && typeof c.windowS === 'number' ? c : 'laboratory';
}

/**
 * Makes sure a log has its overview, building it from `sensor_sample` when it was imported before
 * overviews existed. One builder per log at a time (an advisory lock), so two first readers never
 * do the work twice. Segments are found again with the criteria stored with the log's trials.
 * @param pool the plain `pg` pool (server/pg-pool.ts): the samples are read with a binary COPY
 * @returns false when the file has no samples (it is not an imported sensor log)
 */
export async function ensureSensorOverview(pool: pg.Pool, fileId: string): Promise<boolean> {
  if (!isUuid(fileId)) return false;
  const client = await pool.connect();
  let broken = false;
  try {
    await client.query('BEGIN');
    await client.query(`SELECT pg_advisory_xact_lock(hashtext('sensor_overview:' || $1))`, [fileId]);
    const done = await client.query('SELECT 1 FROM sensor_overview WHERE source_file_id = $1', [fileId]);
    if (done.rowCount) { await client.query('COMMIT'); return true; }
    const file = await client.query<{ rig_id: string | null; rows_imported: number }>('SELECT rig_id, rows_imported FROM source_file WHERE id = $1', [fileId]);
    const first = await client.query<{ rig_id: string }>('SELECT rig_id FROM sensor_sample WHERE source_file_id = $1 ORDER BY line LIMIT 1', [fileId]);
    if (!file.rowCount || !first.rowCount) { await client.query('COMMIT'); return false; }
    const s = await readSamples(client, fileId, file.rows[0].rows_imported);
    const t0 = s.epoch[0];
    const timeS = s.epoch.map((e) => e - t0);
    // as at import: the ambient channel takes part in the segmentation only when every sample has one
    const channels = segmentChannels({ timeS, inletTempC: s.inlet, outletTempC: s.outlet, flowM3PerS: s.flow, ambientTempC: s.ambient });
    let seg: OverviewSegmentation = { segments: [] };
    try {
      seg = segmentLog(channels, await importCriteria(client, fileId));
    } catch {
      // missing readings or a time base segmentLog refuses: the overview shows the samples without segments
    }
    // the air and the sun are drawn when the log has them (an all-NULL column is a coil log's)
    const has = (a: Float64Array) => a.some((v) => v === v);
    const shown = { ...channels, ambientTempC: has(s.ambient) ? s.ambient : null, irradianceWPerM2: has(s.irradiance) ? s.irradiance : null };
    await insertOverview(client, { fileId, rigId: first.rows[0].rig_id, startEpochS: t0 }, buildOverview(shown, seg));
    await client.query('COMMIT');
    return true;
  } catch (e) {
    try { await client.query('ROLLBACK'); } catch { broken = true; }
    throw e;
  } finally {
    client.release(broken);
  }
}
