/**
 * Finding the steady periods of a stored sensor log before anything is saved (POST …/segments),
 * and importing exactly the periods the engineer kept — against the real PostgreSQL, the S3 fake
 * and pg-boss.
 *
 * The logs come from `writeSensorLogCsv` (test/support/sensor-log-file.ts): 1 Hz plateaus of 1200 s whose
 * set-points cycle through outlet 30 + 3k °C (k = 0…6) and flow 9 + 3k L/min (k = 0…4), with
 * ±0.02 K and ±0.2 % seeded noise (our generator, checked against its own definition).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, test } from 'vitest';
import type { Client } from './support/client';
import { SOLAR_LOG_MAPPING, solarLogCsv } from '@/fixtures/demo-solar';
import { LOG_MAPPING as MAPPING, engineerWithRig, jobFinished as finished, logFolder, uploadRaw as upload } from './support/sensor-logs';

const db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
const logs = logFolder('preview-test');
afterAll(async () => {
  logs.remove();
  await db.end();
});
const L_PER_MIN = 1e-3 / 60;
const makeLog = logs.make;
const setup = () => engineerWithRig('Preview rig', 'wood-fire');

/** Posts to …/segments and splits the JSON-lines answer. */
async function segments(c: Client, rigId: string, fileId: string, body: Record<string, unknown>) {
  const r = await c.post(`/api/rigs/${rigId}/uploads/${fileId}/segments`, body);
  if (r.status !== 200) return { status: r.status, body: r.body, messages: [] as any[], result: null as any, error: null as any, type: r.headers.get('content-type') };
  const messages = r.text.trim().split('\n').map((l) => JSON.parse(l));
  const last = messages[messages.length - 1];
  return { status: r.status, body: null, messages, result: last.result ?? null, error: last.error ?? null, type: r.headers.get('content-type') };
}

const onSetPoint = (outletTempC: number, flowM3PerS: number) => {
  const k = Math.round((outletTempC - 30) / 3);
  const j = Math.round((flowM3PerS / L_PER_MIN - 9) / 3);
  return Math.abs(outletTempC - (30 + 3 * k)) < 0.05 && Math.abs(flowM3PerS / L_PER_MIN - (9 + 3 * j)) / (9 + 3 * j) < 0.005;
};

describe('sensor-log preview', () => {
  test('the upload preview recognises a log and suggests its mapping; a trial sheet stays a trial sheet', async () => {
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'suggest.csv', await makeLog(600));
    const p = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/preview`, {});
    expect(p.status, p.text).toBe(200);
    expect(p.body.shape.shape).toBe('sensorLog');
    expect(p.body.shape.medianIntervalS).toBe(1);
    expect(p.body.mapping.shape).toBe('sensorLog');
    expect(p.body.mapping.columns.map((c: { field: string }) => c.field)).toEqual(['time', 'inletTemp', 'outletTemp', 'flow', 'ambientTemp']);
    expect(p.body.check).toBeNull();
    expect(p.body.logHead.rows[0]).toMatchObject({ line: 2, timeS: 0 });

    const sheet = readFileSync(path.resolve(__dirname, '..', '..', 'fixtures', 'import', 'trials-imperial.csv'));
    const f2 = await upload(eng, rig.id, 'sheet.csv', sheet);
    const p2 = await eng.post(`/api/rigs/${rig.id}/uploads/${f2.id}/preview`, {});
    expect(p2.body.shape.shape).toBe('trialSheet');
    expect(p2.body.check.okCount).toBeGreaterThan(0);
    // a log mapping cannot be confirmed as a trial sheet
    const wrong = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/confirm`, { mapping: MAPPING });
    expect(wrong.status, wrong.text).toBe(422);
    expect(wrong.body.error).toBe('wrong_shape');
  });

  test('finds the steady periods on the set-points, reduces the series keeping its extremes, and stores nothing', { timeout: 60_000 }, async () => {
    const { eng, rig } = await setup();
    const log = await makeLog(6000);
    const file = await upload(eng, rig.id, 'periods.csv', log);
    const r = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field' });
    expect(r.status).toBe(200);
    expect(r.type).toMatch(/application\/x-ndjson/);
    expect(r.error).toBeNull();
    expect(r.messages.some((m) => m.progress)).toBe(true);
    const res = r.result;
    expect(res.samples).toBe(6000);
    expect(res.rejectedCount).toBe(0);
    expect(res.startIso).toBe('2026-06-01T08:00:00.000Z');
    expect(res.medianIntervalS).toBe(1);
    expect(res.criteria.preset).toBe('field');
    // five plateaus of 1200 s; the field preset needs 5 min after settling (DOMAIN.md §2.4 proposal)
    expect(res.segments.length).toBeGreaterThanOrEqual(4);
    for (const s of res.segments) {
      expect(onSetPoint(s.mean.outletTempC, s.mean.flowM3PerS), JSON.stringify(s.mean)).toBe(true);
      expect(s.durationS).toBeGreaterThanOrEqual(300);
      expect(s.endLine - s.startLine).toBe(s.n - 1); // 1 Hz, no row left out: lines are consecutive
      expect(s.blockStdError).not.toBeNull();
    }
    // display series: at most 2,000 points, both ends and the extremes of the outlet kept
    const rows = log.toString('utf8').trim().split('\n').slice(1).map((l) => l.split(',').map(Number));
    const outlets = rows.map((x) => x[2]);
    expect(res.series.reduced).toBe(true);
    expect(res.series.tS.length).toBeLessThanOrEqual(2000);
    expect(res.series.tS[0]).toBe(0);
    expect(res.series.tS[res.series.tS.length - 1]).toBe(5999);
    expect(Math.max(...res.series.outletTempC)).toBe(Math.max(...outlets));
    expect(Math.min(...res.series.outletTempC)).toBe(Math.min(...outlets));

    const stored = await db.query('SELECT (SELECT count(*)::int FROM sensor_sample WHERE source_file_id = $1) AS s, (SELECT count(*)::int FROM trial WHERE source_file_id = $1) AS t, (SELECT state FROM source_file WHERE id = $1) AS state', [file.id]);
    expect(stored.rows[0]).toEqual({ s: 0, t: 0, state: 'uploaded' });
  });

  test('measures the periods the engineer set, says which miss the criteria, and imports exactly those', { timeout: 120_000 }, async () => {
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'chosen.csv', await makeLog(6000));
    const first = (await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field' })).result;
    const [a, b] = first.segments;
    const shortened = { startS: a.startS + 60, endS: a.endS - 30 };
    const across = { startS: a.endS - 120, endS: b.startS + 120 }; // spans a set-point change
    const r = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field', periods: [shortened, across] });
    const [p1, p2] = r.result.periods;
    expect(p1.startLine).toBe(a.startLine + 60);
    expect(p1.endLine).toBe(a.endLine - 30);
    expect(p1.notes).toEqual([]);
    expect(p2.notes.join(' ')).toMatch(/not wholly inside a steady period/);

    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, {
      mapping: MAPPING, preset: 'field', segments: [{ startLine: p1.startLine, endLine: p1.endLine }, { startLine: b.startLine, endLine: b.endLine }],
    });
    expect(started.status, started.text).toBe(202);
    const job = await finished(eng, started.body.job.id);
    expect(job.state, job.error).toBe('completed');
    expect(job.result.trials).toBe(2);
    const trials = (await db.query('SELECT source_line, flow_m3_per_s, outlet_c, inlet_c, segment FROM trial WHERE source_file_id = $1 ORDER BY source_line', [file.id])).rows;
    expect(trials.map((t) => t.source_line)).toEqual([p1.startLine, b.startLine]);
    // the trial is the mean the engineer was shown
    expect(trials[0].outlet_c).toBeCloseTo(p1.mean.outletTempC, 9);
    expect(trials[0].flow_m3_per_s).toBeCloseTo(p1.mean.flowM3PerS, 12);
    expect(trials[1].inlet_c).toBeCloseTo(b.mean.inletTempC, 9);
    expect(trials[0].segment.criteria.preset).toBe('field');
    expect(trials[0].segment.endLine).toBe(p1.endLine);

    // the rig lists the job with its file
    const jobs = await eng.get(`/api/rigs/${rig.id}/jobs`);
    expect(jobs.body.jobs[0]).toMatchObject({ id: job.id, state: 'completed', filename: 'chosen.csv' });
    // the confirmed mapping comes back for the next log with the same headers
    const next = await upload(eng, rig.id, 'next.csv', await makeLog(300));
    const p = await eng.post(`/api/rigs/${rig.id}/uploads/${next.id}/preview`, {});
    expect(p.body.savedMapping).toBe(true);
    expect(p.body.mapping).toMatchObject({ shape: 'sensorLog' });
  });

  test('bad input gets a clear answer: rows that fail by line, mapping and thresholds before reading', { timeout: 60_000 }, async () => {
    const { eng, rig } = await setup();
    const log = await makeLog(1200, (lines) => {
      lines[100] = lines[100].replace(/^([^,]+),([^,]+),([^,]+),/, '$1,$2,hot,'); // line 101
      lines[700] = lines[700].replace(/^([^,]+),/, '2026-13-45 99:00:00,'); // line 701
    });
    const file = await upload(eng, rig.id, 'bad.csv', log);
    const r = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field' });
    expect(r.result.rejectedCount).toBe(2);
    expect(r.result.issues.map((i: { line: number }) => i.line)).toEqual([101, 701]);
    expect(r.result.issues[0].column).toBe('T_out [C]');
    expect(r.result.samples).toBe(1198);
    // left out, they are no longer counted
    const r2 = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field', excludedLines: [101, 701] });
    expect(r2.result.rejectedCount).toBe(0);
    expect(r2.result.samples).toBe(1198);

    const renamed = { ...MAPPING, columns: MAPPING.columns.map((c, i) => (i === 2 ? { ...c, header: 'outlet' } : c)) };
    const m = await segments(eng, rig.id, file.id, { mapping: renamed, preset: 'field' });
    expect(m.status).toBe(422);
    expect(m.body.message).toMatch(/column C is "T_out \[C\]" in this file, not "outlet"/);
    const missing = await segments(eng, rig.id, file.id, { mapping: { ...MAPPING, columns: MAPPING.columns.filter((c) => c.field !== 'flow') }, preset: 'field' });
    expect(missing.status).toBe(422);
    expect(missing.body.message).toMatch(/no column is mapped to flow/);
    const crit = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field', criteria: { windowS: -5 } });
    expect(crit.status).toBe(422);
    expect(crit.body.message).toMatch(/windowS must be a number greater than 0, got -5/);
    const period = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field', periods: [{ startS: 600, endS: 300 }] });
    expect(period.error).toMatchObject({ status: 422 });
    expect(period.error.message).toMatch(/Period 1 ends \(5 min\) before it starts \(10 min\)/);
  });

  test('a log with many unreadable rows is refused at its first one, or imported without them when the engineer says so', { timeout: 120_000 }, async () => {
    const { eng, rig } = await setup();
    // a logger that wrote "ERR" for the outlet on every 20th row from line 1001 (300 rows)
    const broken = (lines: string[]) => {
      for (let i = 1000; i < 7000; i += 20) lines[i] = lines[i].replace(/^([^,]+),([^,]+),([^,]+),/, '$1,$2,ERR,');
    };
    const file = await upload(eng, rig.id, 'dropouts.csv', await makeLog(8000, broken));
    const r = await segments(eng, rig.id, file.id, { mapping: MAPPING, preset: 'field' });
    expect(r.result.rejectedCount).toBe(300);
    expect(r.result.issues.length).toBe(200); // the first 200 are listed
    expect(r.result.samples).toBe(7700);

    const refused = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field' });
    const failed = await finished(eng, refused.body.job.id);
    expect(failed.state).toBe('failed');
    expect(failed.error).toMatch(/line 1001/);
    expect((await db.query('SELECT count(*)::int AS n FROM sensor_sample WHERE source_file_id = $1', [file.id])).rows[0].n).toBe(0);

    const periods = r.result.segments.map((s: { startLine: number; endLine: number }) => ({ startLine: s.startLine, endLine: s.endLine }));
    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field', skipInvalidRows: true, segments: periods });
    const job = await finished(eng, started.body.job.id);
    expect(job.state, job.error).toBe('completed');
    expect(job.result).toMatchObject({ samples: 7700, skippedRows: 300, trials: periods.length });
    const n = (await db.query('SELECT count(*)::int AS n, count(*) FILTER (WHERE line >= 1001 AND line <= 6981 AND (line - 1001) % 20 = 0)::int AS bad FROM sensor_sample WHERE source_file_id = $1', [file.id])).rows[0];
    expect(n).toEqual({ n: 7700, bad: 0 });
  });

  test('a collector log\'s preview carries its air and irradiance on the same time base, keeping the irradiance extremes', { timeout: 60_000 }, async () => {
    const { eng, rig } = await engineerWithRig('Preview sun rig', 'solar-collector');
    // the afternoon of the demo's logged day (fixtures/demo-solar.ts), from 12:00
    const lines = solarLogCsv().trim().split('\n');
    const csv = [lines[0], ...lines.slice(2161)].join('\n') + '\n';
    const file = await upload(eng, rig.id, 'collector-afternoon.csv', Buffer.from(csv));
    const r = await segments(eng, rig.id, file.id, { mapping: SOLAR_LOG_MAPPING, preset: 'collector' });
    expect(r.status).toBe(200);
    expect(r.error).toBeNull();
    const series = r.result.series;
    expect(series.irradianceWPerM2).toHaveLength(series.tS.length);
    expect(series.ambientTempC).toHaveLength(series.tS.length);
    const gs = lines.slice(2161).map((l) => Number(l.split(',')[1]));
    expect(Math.min(...series.irradianceWPerM2)).toBe(Math.min(...gs));
    expect(Math.max(...series.irradianceWPerM2)).toBe(Math.max(...gs));
  });
});
