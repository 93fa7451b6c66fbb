import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { LockMode } from '@mikro-orm/core';
import { resolveCriteria, type SteadySegment } from '@/analysis/segment';
import { liveSteadyState, type LiveSteadyState } from '@/analysis/segment/live-steady';
import { predictRuns } from '@/analysis/plan/plan-session';
import { SourceFile, TestSession, Trial, type TestSessionRow, type TrialRow } from '@/entities';
import type { TestSessionRun } from '@/entities/test-session';
import { sensorSampleSchema } from '../imports/sensor-log';
import { checkTrialRow, trialFields } from '../rigs/trial-rule';
import { conflict, invalid, notFound } from '../server/errors';
import { sha256 } from '../server/secrets';
import { assertOpen, nextPendingRun } from './sessions';

/**
 * A logger's samples for a live session: parsed from a small JSON or CSV batch with the sensor-log
 * row rule (`sensorSampleSchema` of imports/sensor-log.ts), stored as the session's sensor log (one
 * `source_file` of the rig, the rows in `sensor_sample` as any imported log), and run through the
 * steady-state test of the session's preset (analysis/segment live-steady.ts) as they arrive; a
 * steady period that later samples can no longer change becomes a trial of the session through
 * the one trial rule, once.
 *
 * Idempotent by sample time: under the session's row lock a batch's samples at or before the
 * latest stored one must be stored already with the same values (a retried batch: skipped), so a
 * sample (session, channel, time) is stored once; anything else before the latest is out of order
 * and refused whole. Times are kept to the millisecond.
 */

export const SAMPLE_CHANNELS = ['t', 'inletTempC', 'outletTempC', 'flowM3PerS', 'ambientTempC'] as const;
/** Most samples one batch carries (ten minutes at 1 Hz, with room). */
export const MAX_BATCH_SAMPLES = 1000;
/** Most samples of one session (about 55 hours at 1 Hz). */
export const MAX_SESSION_SAMPLES = 200_000;
/** Largest batch body, bytes. */
export const MAX_SAMPLE_BODY_BYTES = 128 * 1024;
/** The live test looks back at most this far (bounded work per batch), s. */
export const LIVE_LOOKBACK_S = 4 * 3600;
/** A steady period is matched to the pending run of the nearest flow within this fraction. */
export const RUN_MATCH_FRACTION = 0.15;

export interface Sample {
  epochS: number;
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
  ambientTempC: number | null;
}

const CHANNEL_LIST = SAMPLE_CHANNELS.join(', ');

function readTime(v: unknown, where: string): number {
  let s: number;
  if (typeof v === 'number') s = v;
  else if (typeof v === 'string' && /^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:?\d\d)$/i.test(v.trim())) s = Date.parse(v.trim()) / 1000;
  else if (typeof v === 'string' && /^-?\d+(\.\d+)?$/.test(v.trim())) s = Number(v.trim());
  else throw invalid(`${where} must be a date-time with its zone ("2026-06-01T09:00:00Z") or epoch seconds.`, { [where]: 'not a time with a zone, nor epoch seconds' }, 'bad_sample');
  const now = Date.now() / 1000;
  if (!Number.isFinite(s) || s < 946_684_800 || s > now + 86_400) throw invalid(`${where} is not a plausible time (after 2000 and at most a day ahead of the server's clock).`, { [where]: 'implausible time' }, 'bad_sample');
  return Math.round(s * 1000) / 1000;
}

function readSample(o: Record<string, unknown>, i: number): Sample {
  for (const k of Object.keys(o)) {
    if (!(SAMPLE_CHANNELS as readonly string[]).includes(k)) throw invalid(`samples.${i}: unknown channel "${k.slice(0, 40)}" (channels: ${CHANNEL_LIST}).`, { [`samples.${i}.${k.slice(0, 40)}`]: 'unknown channel' }, 'unknown_channel');
  }
  const epochS = readTime(o.t, `samples.${i}.t`);
  const num = (v: unknown) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v === '' ? undefined : v);
  const r = sensorSampleSchema.safeParse({ timeS: 0, inletTempC: num(o.inletTempC), outletTempC: num(o.outletTempC), flowM3PerS: num(o.flowM3PerS), ambientTempC: num(o.ambientTempC) ?? undefined });
  if (!r.success) {
    const issue = r.error.issues[0];
    const field = String(issue.path[0] ?? 'sample');
    throw invalid(`samples.${i}.${field}: ${issue.message}.`, { [`samples.${i}.${field}`]: issue.message }, 'bad_sample');
  }
  if (!(r.data.flowM3PerS >= 0)) throw invalid(`samples.${i}.flowM3PerS: a flow cannot be negative.`, { [`samples.${i}.flowM3PerS`]: 'negative flow' }, 'bad_sample');
  return { epochS, inletTempC: r.data.inletTempC, outletTempC: r.data.outletTempC, flowM3PerS: r.data.flowM3PerS, ambientTempC: r.data.ambientTempC ?? null };
}

/**
 * Reads a batch: JSON `{"samples":[{"t":…,"inletTempC":…,"outletTempC":…,"flowM3PerS":…,"ambientTempC"?:…}]}`
 * or CSV with the header `t,inletTempC,outletTempC,flowM3PerS[,ambientTempC]` (SI; t a date-time
 * with its zone or epoch seconds). Samples must come in increasing time.
 * @throws DomainError invalid: `unknown_channel`, `bad_sample`, `out_of_order` (within the batch), `empty`, `too_many`
 */
export function parseSampleBatch(text: string, contentType: string): Sample[] {
  let rows: Record<string, unknown>[];
  if (/^text\/csv|^text\/plain/i.test(contentType)) {
    const lines = text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l && !l.startsWith('#'));
    if (!lines.length) throw invalid('The batch holds no samples.', { samples: 'empty' }, 'empty');
    const header = lines[0].split(',').map((h) => h.trim());
    for (const h of header) if (!(SAMPLE_CHANNELS as readonly string[]).includes(h)) throw invalid(`Unknown channel "${h.slice(0, 40)}" in the CSV header (channels: ${CHANNEL_LIST}).`, { header: `unknown channel ${h.slice(0, 40)}` }, 'unknown_channel');
    if (lines.length - 1 > MAX_BATCH_SAMPLES) throw invalid(`A batch holds at most ${MAX_BATCH_SAMPLES} samples.`, { samples: 'too many' }, 'too_many');
    rows = lines.slice(1).map((l, i) => {
      const cells = l.split(',');
      if (cells.length !== header.length) throw invalid(`samples.${i}: ${cells.length} cells for ${header.length} columns (line ${i + 2}).`, { [`samples.${i}`]: 'wrong number of cells' }, 'bad_sample');
      return Object.fromEntries(header.map((h, j) => [h, cells[j].trim()]));
    });
  } else {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw invalid('The body is neither JSON nor CSV (send Content-Type: application/json or text/csv).', { body: 'unreadable' }, 'bad_json');
    }
    const samples = (body as { samples?: unknown })?.samples;
    if (!body || typeof body !== 'object' || Object.keys(body).some((k) => k !== 'samples') || !Array.isArray(samples)) throw invalid('Send {"samples": [...]}.', { samples: 'missing' }, 'bad_sample');
    if (samples.length > MAX_BATCH_SAMPLES) throw invalid(`A batch holds at most ${MAX_BATCH_SAMPLES} samples.`, { samples: 'too many' }, 'too_many');
    rows = samples.map((s, i) => {
      if (!s || typeof s !== 'object' || Array.isArray(s)) throw invalid(`samples.${i} must be an object.`, { [`samples.${i}`]: 'not an object' }, 'bad_sample');
      return s as Record<string, unknown>;
    });
  }
  if (!rows.length) throw invalid('The batch holds no samples.', { samples: 'empty' }, 'empty');
  const out = rows.map(readSample);
  for (let i = 1; i < out.length; i++) {
    if (!(out[i].epochS > out[i - 1].epochS)) throw invalid(`samples.${i}.t is not after samples.${i - 1}.t: send each batch in time order, one sample per time.`, { [`samples.${i}.t`]: 'out of order' }, 'out_of_order');
  }
  return out;
}

const literal = (xs: readonly (number | null)[]) => `{${xs.map((x) => (x === null ? 'NULL' : String(x))).join(',')}}`;
const same = (a: number | null, b: number | null) => (a === null || b === null ? a === b : Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b)));

interface StoredRow { line: number; t: number; inlet_c: number; outlet_c: number; flow_m3_per_s: number; ambient_c: number | null }

/** What a batch did. */
export interface IngestResult {
  stored: number;
  duplicates: number;
  sampleCount: number;
  live: LiveView;
  trials: TrialRow[];
}

/** The live signal with the next flow to set. */
export interface LiveView {
  state: LiveSteadyState['state'];
  message: string;
  steadyForS: number;
  minDurationS: number;
  lastSampleAt: string | null;
  nextRun: TestSessionRun | null;
  preset: string;
}

/**
 * Stores a batch for a session (see the module note) and runs the live test.
 * @throws DomainError conflict `out_of_order` / `sample_differs` / `session_closed` / `too_many_samples`; not_found
 */
export async function ingestSamples(em: EntityManager, sessionId: string, samples: Sample[], uploadedBy: { id: string } | null): Promise<IngestResult> {
  return em.transactional(async (tx) => {
    const s = await tx.findOne(TestSession, { id: sessionId }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true });
    if (!s) throw notFound();
    assertOpen(s);
    const last = s.lastSampleAt ? s.lastSampleAt.getTime() / 1000 : -Infinity;
    const old = samples.filter((x) => x.epochS <= last);
    const fresh = samples.filter((x) => x.epochS > last);
    if (old.length) {
      const rows = s.sourceFile
        ? await tx.execute<StoredRow[]>(
          `select line, round(extract(epoch from taken_at) * 1000)::float8 / 1000 as t, inlet_c, outlet_c, flow_m3_per_s, ambient_c
             from sensor_sample where source_file_id = ? and taken_at between to_timestamp(?) and to_timestamp(?)`,
          [s.sourceFile.id, old[0].epochS - 0.001, old[old.length - 1].epochS + 0.001],
        )
        : [];
      const byMs = new Map(rows.map((r) => [Math.round(Number(r.t) * 1000), r]));
      old.forEach((x, k) => {
        const i = samples.indexOf(x);
        const r = byMs.get(Math.round(x.epochS * 1000));
        if (!r) throw conflict(`samples.${i}.t (${new Date(x.epochS * 1000).toISOString()}) is before the latest stored sample (${s.lastSampleAt!.toISOString()}) and was not sent before: a logger sends its samples in time order. Nothing of this batch was stored.`, 'out_of_order', { fields: { [`samples.${i}.t`]: 'out of order' } });
        if (!same(r.inlet_c, x.inletTempC) || !same(r.outlet_c, x.outletTempC) || !same(r.flow_m3_per_s, x.flowM3PerS) || !same(r.ambient_c, x.ambientTempC)) {
          throw conflict(`samples.${i} (${new Date(x.epochS * 1000).toISOString()}) was stored before with other values: a sample is stored once per time. Nothing of this batch was stored.`, 'sample_differs', { fields: { [`samples.${i}`]: 'differs from the stored sample' } });
        }
        void k;
      });
    }
    if (s.sampleCount + fresh.length > MAX_SESSION_SAMPLES) throw conflict(`A session holds at most ${MAX_SESSION_SAMPLES.toLocaleString('en-US')} samples: close it and start another.`, 'too_many_samples');
    if (fresh.length) {
      let file = s.sourceFile ? await tx.findOneOrFail(SourceFile, s.sourceFile.id) : null;
      if (!file) {
        file = tx.create(SourceFile, {
          lab: s.lab, rig: s.rig, uploadedBy: uploadedBy ? (uploadedBy.id as never) : null, purpose: 'trials', filename: `session-${s.id}.csv`,
          contentType: 'text/csv', sizeBytes: 0, sha256: sha256(`test-session:${s.id}`), storageKey: `session:${s.id}`, state: 'imported', rowsImported: 0,
        });
        s.sourceFile = file;
        await tx.flush();
      }
      const lines = fresh.map((_, k) => s.sampleCount + k + 1);
      await tx.execute(
        `insert into sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c)
         select ?::uuid, x.line, ?::uuid, to_timestamp(x.t), x.i, x.o, x.q, x.a
           from unnest(?::int[], ?::float8[], ?::float8[], ?::float8[], ?::float8[], ?::float8[]) as x (line, t, i, o, q, a)`,
        [file.id, s.rig.id, literal(lines), literal(fresh.map((x) => x.epochS)), literal(fresh.map((x) => x.inletTempC)), literal(fresh.map((x) => x.outletTempC)), literal(fresh.map((x) => x.flowM3PerS)), literal(fresh.map((x) => x.ambientTempC))],
      );
      s.sampleCount += fresh.length;
      file.rowsImported = s.sampleCount;
      s.firstSampleAt ??= new Date(fresh[0].epochS * 1000);
      s.lastSampleAt = new Date(fresh[fresh.length - 1].epochS * 1000);
      if (s.state === 'planned') s.state = 'running';
      // an overview built from an earlier part of the log would be stale
      await tx.execute('delete from sensor_overview where source_file_id = ?', [file.id]);
    }
    const { live, trials } = await liveAndRecord(tx, s, false);
    await tx.flush();
    if (fresh.length) await tx.execute('select pg_notify(?, ?)', [SESSION_CHANNEL, s.id]);
    return { stored: fresh.length, duplicates: old.length, sampleCount: s.sampleCount, live, trials };
  });
}

/** The PostgreSQL channel that tells every instance a session has new samples (payload: its id). */
export const SESSION_CHANNEL = 'emberline_session';

interface LogWindow { t0: number; lines: Int32Array; timeS: Float64Array; inletTempC: Float64Array; outletTempC: Float64Array; flowM3PerS: Float64Array; ambientTempC: Float64Array | null }

/** The session's samples of the last LIVE_LOOKBACK_S (and from a little before the last recorded period), s from the first sample. */
export async function sessionLog(em: EntityManager, s: TestSessionRow): Promise<LogWindow | null> {
  if (!s.sourceFile || !s.firstSampleAt || !s.lastSampleAt) return null;
  const t0 = s.firstSampleAt.getTime() / 1000;
  const lastRel = s.lastSampleAt.getTime() / 1000 - t0;
  const criteria = resolveCriteria(s.settings.preset);
  const from = Math.max(0, lastRel - LIVE_LOOKBACK_S, s.recordedUntilS === null || s.recordedUntilS === undefined ? 0 : s.recordedUntilS - 2 * (criteria.windowS + criteria.averagingS));
  const rows = await em.execute<StoredRow[]>(
    `select line, extract(epoch from taken_at)::float8 as t, inlet_c, outlet_c, flow_m3_per_s, ambient_c
       from sensor_sample where source_file_id = ? and taken_at >= to_timestamp(?) order by line`,
    [s.sourceFile.id, t0 + from - 0.0005],
  );
  const n = rows.length;
  const w: LogWindow = { t0, lines: new Int32Array(n), timeS: new Float64Array(n), inletTempC: new Float64Array(n), outletTempC: new Float64Array(n), flowM3PerS: new Float64Array(n), ambientTempC: new Float64Array(n) };
  let allAmbient = n > 0;
  rows.forEach((r, i) => {
    w.lines[i] = r.line; w.timeS[i] = Number(r.t) - t0; w.inletTempC[i] = r.inlet_c; w.outletTempC[i] = r.outlet_c; w.flowM3PerS[i] = r.flow_m3_per_s;
    if (r.ambient_c === null) allAmbient = false; else w.ambientTempC![i] = r.ambient_c;
  });
  if (!allAmbient) w.ambientTempC = null;
  return w;
}

function matchRun(runs: TestSessionRun[], flow: number): TestSessionRun | null {
  let best: TestSessionRun | null = null;
  for (const r of runs) {
    if (r.state !== 'pending') continue;
    const d = Math.abs(r.flowM3PerS / flow - 1);
    if (d <= RUN_MATCH_FRACTION && (!best || d < Math.abs(best.flowM3PerS / flow - 1) || (d === Math.abs(best.flowM3PerS / flow - 1) && r.order < best.order))) best = r;
  }
  return best;
}

/**
 * The live test on the session's log, and the steady periods that later samples cannot change
 * (with `includeCurrent`, also the one the log ends in: closing) made into trials, once, matched to
 * the pending run of the nearest flow (within RUN_MATCH_FRACTION) or added as a run.
 */
export async function liveAndRecord(em: EntityManager, s: TestSessionRow, includeCurrent: boolean, record = true): Promise<{ live: LiveView; trials: TrialRow[]; log: LogWindow | null }> {
  const criteria = resolveCriteria(s.settings.preset);
  const log = await sessionLog(em, s);
  const view = (st: Pick<LiveSteadyState, 'state' | 'message' | 'steadyForS' | 'minDurationS'>): LiveView => ({
    state: st.state, message: st.message, steadyForS: st.steadyForS, minDurationS: st.minDurationS, lastSampleAt: s.lastSampleAt?.toISOString() ?? null, nextRun: nextPendingRun(s.runs), preset: s.settings.preset,
  });
  if (!log || log.timeS.length < 3) return { live: view({ state: 'waiting', message: 'Waiting for the logger.', steadyForS: 0, minDurationS: criteria.minDurationS }), trials: [], log };
  const live = liveSteadyState(log, criteria);
  const candidates: SteadySegment[] = record ? [...live.final, ...(includeCurrent && live.current ? [live.current] : [])] : [];
  const runs = s.runs.map((r) => ({ ...r, trialIds: [...r.trialIds] }));
  const made: TrialRow[] = [];
  for (const seg of candidates) {
    if (s.recordedUntilS !== null && s.recordedUntilS !== undefined && seg.startTimeS <= s.recordedUntilS) continue;
    s.recordedUntilS = seg.endTimeS;
    const m = seg.mean;
    const line = log.lines[seg.startIndex];
    const r = checkTrialRow({ flowM3PerS: m.flowM3PerS, inletTempC: m.inletTempC, outletTempC: m.outletTempC, ambientTempC: m.ambientTempC ?? undefined }, line);
    if (!r.ok) continue;
    let run = matchRun(runs, m.flowM3PerS);
    if (!run) {
      const p = predictRuns({ model: s.settings.model, prior: s.settings.prior, inletTempC: s.settings.inletTempC, measurementUK: s.settings.measurementUK }, [m.flowM3PerS])[0];
      run = { key: `r${Math.max(0, ...runs.map((x) => Number(x.key.slice(1)))) + 1}`, order: Math.max(0, ...runs.map((x) => x.order)) + 1, ...p, purpose: 'added', state: 'pending', trialIds: [] };
      runs.push(run);
    }
    const segment = {
      criteria, startLine: line, endLine: log.lines[seg.endIndex], startTimeS: seg.startTimeS, endTimeS: seg.endTimeS, durationS: seg.durationS, n: seg.n,
      mean: seg.mean, sd: seg.sd, blockStdError: seg.blockStdError, blocks: seg.blocks, outletSlopeKPerS: seg.outletSlopeKPerS, inletSlopeKPerS: seg.inletSlopeKPerS, maxDeviation: seg.maxDeviation,
    };
    const trial = em.create(Trial, {
      ...trialFields(r.row, new Date(Math.round((log.t0 + seg.startTimeS) * 1000))), lab: s.lab, rig: s.rig, session: s, origin: 'log-segment',
      sourceFile: s.sourceFile, sourceLine: line, segment: JSON.parse(JSON.stringify(segment)) as Record<string, unknown>, isReference: run.purpose === 'reference',
      notes: `Session "${s.title}", run ${run.order}: steady for ${(seg.durationS / 60).toFixed(1)} min on the logger.`,
    });
    run.trialIds.push(trial.id);
    run.state = 'done';
    made.push(trial);
  }
  if (made.length) s.runs = runs.sort((a, b) => a.order - b.order);
  return { live: view(live), trials: made, log };
}
