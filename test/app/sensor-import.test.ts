/**
 * Sensor-log import as a background job, against the real PostgreSQL, the S3 fake and pg-boss:
 * samples written with COPY and steady segments as trials in one transaction; a row that fails
 * halfway through the COPY (or a cancellation) leaves nothing; a job sent while no worker runs is
 * finished by the worker of the next process.
 *
 * The logs come from `writeSensorLogCsv` (test/support/sensor-log-file.ts): 1 Hz plateaus of 1200 s whose
 * set-points cycle through outlet 30 + 3k °C (k = 0…6) and flow 9 + 3k L/min (k = 0…4), with
 * ±0.02 K and ±0.2 % seeded noise — so every steady trial must sit on one of those set-points
 * (our generator, checked against its own definition).
 */
import pg from 'pg';
import { afterAll, describe, expect, test } from 'vitest';
import { getEm, getOrm } from '@/app/_lib/server/db';
import { createImportJob as createImportJobRow } from '@/app/_lib/jobs/job-store';
import { enqueueSensorImport, newBoss, startBoss } from '@/app/_lib/jobs/queue';
import { recoverInterruptedJobs, workSensorImports } from '@/app/_lib/jobs/sensor-import-job';
import { ImportCancelled, importSensorLog, logImportInput } from '@/app/_lib/imports/sensor-import';
import { pgPool } from '@/app/_lib/server/pg-pool';
import { ImportError } from '@/app/_lib/imports/import-error';
import { Rig, SourceFile, User } from '@/entities';
import { Client, createAccount, signedIn } from './support/client';
import { SOLAR_LOG_MAPPING, solarLogCsv } from '@/fixtures/demo-solar';
import { demoWork } from '@/fixtures/demo-lab';
import { LOG_MAPPING as MAPPING, engineerWithRig, jobFinished as finished, logFolder, uploadRaw as upload } from './support/sensor-logs';

const db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
const logs = logFolder('sensor-test');

afterAll(async () => {
  logs.remove();
  await db.end();
  await pgPool().end();
  await (await getOrm()).close(true);
});

const makeLog = logs.make;
const setup = () => engineerWithRig('Log rig');

const stored = async (fileId: string) => {
  const s = await db.query('SELECT count(*)::int AS n FROM sensor_sample WHERE source_file_id = $1', [fileId]);
  const t = await db.query('SELECT count(*)::int AS n FROM trial WHERE source_file_id = $1', [fileId]);
  const f = await db.query('SELECT state, rows_imported FROM source_file WHERE id = $1', [fileId]);
  return { samples: s.rows[0].n as number, trials: t.rows[0].n as number, fileState: f.rows[0].state as string };
};

const L_PER_MIN = 1e-3 / 60;

describe('sensor-log import', () => {
  test('a log with plateaus is stored as samples, and its steady segments become trials with their criteria', { timeout: 120_000 }, async () => {
    const { eng, rig } = await setup();
    const log = await makeLog(6000);
    const file = await upload(eng, rig.id, 'plateaus.csv', log);
    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field' });
    expect(started.status, started.text).toBe(202);
    const job = await finished(eng, started.body.job.id);
    expect(job.state, job.error).toBe('completed');
    expect(job.result.samples).toBe(6000);
    expect(job.progress.fraction).toBe(1);
    // five plateaus of 1200 s: each is steady once the first-order step (60 s) has settled
    expect(job.result.trials).toBeGreaterThanOrEqual(4);
    expect(await stored(file.id)).toEqual({ samples: 6000, trials: job.result.trials, fileState: 'imported' });

    // each sample as written in the file, in SI: line 3 is the generator's second sample (start + 1 s)
    const cells = log.toString('utf8').split('\n')[2].split(',');
    const sample = (await db.query('SELECT taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c FROM sensor_sample WHERE source_file_id = $1 AND line = 3', [file.id])).rows[0];
    expect(sample.taken_at.toISOString()).toBe('2026-06-01T08:00:01.000Z');
    expect(cells[0]).toBe('2026-06-01 08:00:01');
    expect(sample.inlet_c).toBe(Number(cells[1]));
    expect(sample.outlet_c).toBe(Number(cells[2]));
    expect(sample.flow_m3_per_s).toBeCloseTo(Number(cells[3]) * L_PER_MIN, 15);
    expect(sample.ambient_c).toBe(Number(cells[4]));

    const trials = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=50&sort=startedAt&dir=asc`)).body.trials;
    expect(trials).toHaveLength(job.result.trials);
    for (const t of trials) {
      expect(t.origin).toBe('log-segment');
      expect(t.sourceFileId).toBe(file.id);
      expect(t.sourceLine).toBeGreaterThan(1);
      // on a set-point of the generator, within 0.1 K and 0.5 % (noise averages out over ≥ 300 samples)
      const k = Math.round((t.outletTempC - 30) / 3);
      expect(Math.abs(t.outletTempC - (30 + 3 * k))).toBeLessThan(0.1);
      const j = Math.round((t.flowM3PerS / L_PER_MIN - 9) / 3);
      expect(Math.abs(t.flowM3PerS - (9 + 3 * j) * L_PER_MIN) / t.flowM3PerS).toBeLessThan(0.005);
    }
    const seg = await db.query('SELECT segment FROM trial WHERE source_file_id = $1 ORDER BY source_line LIMIT 1', [file.id]);
    expect(seg.rows[0].segment.criteria.preset).toBe('field');
    expect(seg.rows[0].segment.startLine).toBe(trials[0].sourceLine);
    expect(seg.rows[0].segment.n).toBeGreaterThanOrEqual(300);

    // a viewer of the lab reads the job but cannot cancel it; a finished job is not cancelled
    const viewer = await signedIn('viewer@cinder-hollow.test');
    expect((await viewer.get(`/api/jobs/${job.id}`)).status).toBe(200);
    expect((await viewer.request('DELETE', `/api/jobs/${job.id}`)).status).toBe(403);
    expect((await eng.request('DELETE', `/api/jobs/${job.id}`)).status).toBe(409);
    // the same file again is refused
    expect((await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field' })).status).toBe(409);
  });

  test('a row that fails halfway through the COPY leaves nothing behind: no samples, no trials', { timeout: 120_000 }, async () => {
    const { eng, rig } = await setup();
    // 30,000 rows: the reader yields batches of 8192, so three batches are already in the COPY when line 25,000 is read
    const file = await upload(eng, rig.id, 'bad-row.csv', await makeLog(30_000, (lines) => {
      const cells = lines[24_999].split(',');
      cells[2] = 'n/a';
      lines[24_999] = cells.join(',');
    }));
    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field' });
    expect(started.status, started.text).toBe(202);
    const job = await finished(eng, started.body.job.id);
    expect(job.state).toBe('failed');
    expect(job.error).toMatch(/line 25000/);
    expect(job.error).toMatch(/nothing was imported/);
    expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });
    expect((await eng.get(`/api/rigs/${rig.id}/trials?pageSize=1`)).body.total).toBe(0);

    // The same import called directly, to see that rows really were streamed before the failure.
    const target = { fileId: file.id, rigId: rig.id, labId: rig.labId, filename: 'bad-row.csv', storageKey: (await db.query('SELECT storage_key FROM source_file WHERE id = $1', [file.id])).rows[0].storage_key, sizeBytes: file.sizeBytes, uploadedAt: new Date() };
    let rowsInCopy = 0;
    const err = await importSensorLog(target, logImportInput.parse({ mapping: MAPPING, preset: 'field' }), { progressMs: 0, onProgress: (p) => void (rowsInCopy = p.rowsDone) }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ImportError);
    expect(rowsInCopy).toBeGreaterThanOrEqual(3 * 8192);
    expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });

    // excluding the line lets the rest in
    const again = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field', excludedLines: [25_000] });
    const ok = await finished(eng, again.body.job.id);
    expect(ok.state, ok.error).toBe('completed');
    expect(ok.result.samples).toBe(29_999);
    expect(ok.result.excludedRows).toBe(1);
  });

  test('a cancelled import is rolled back between two batches', { timeout: 120_000 }, async () => {
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'cancel.csv', await makeLog(20_000));
    const key = (await db.query('SELECT storage_key FROM source_file WHERE id = $1', [file.id])).rows[0].storage_key;
    const target = { fileId: file.id, rigId: rig.id, labId: rig.labId, filename: 'cancel.csv', storageKey: key, sizeBytes: file.sizeBytes, uploadedAt: new Date() };
    let calls = 0;
    const err = await importSensorLog(target, logImportInput.parse({ mapping: MAPPING, preset: 'field' }), { progressMs: 0, onProgress: () => ++calls >= 2 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ImportCancelled);
    expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });
  });

  test('a job sent while no worker runs is finished by the worker of the next process', { timeout: 120_000 }, async () => {
    // How the restart is staged: the web server under test runs its own worker on the queue
    // "sensor-import" and would take the job at once, so this test uses a queue of its own with the
    // same code. Process A (a PgBoss here) records the job and sends it, then stops without any
    // worker — as a web process that accepted the request and went down. Process B (a fresh PgBoss,
    // as after a restart) starts the worker; the job, kept in PostgreSQL meanwhile, is picked up
    // and completes.
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'restart.csv', await makeLog(4000));
    const queue = `sensor-import-restart-${Date.now().toString(36)}`;
    const em = await getEm();
    const job = await createImportJobRow(
      em,
      await em.findOneOrFail(Rig, { id: rig.id }),
      await em.findOneOrFail(SourceFile, { id: file.id }),
      await em.findOneOrFail(User, { email: 'engineer@cinder-hollow.test' }),
      logImportInput.parse({ mapping: MAPPING, preset: 'field' }),
    );
    const a = await startBoss(newBoss(), queue);
    await enqueueSensorImport(a, job.id, queue);
    await a.stop({ graceful: false, wait: true });

    const waiting = await eng.get(`/api/jobs/${job.id}`);
    expect(waiting.body.job.state).toBe('queued');
    expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });

    const b = await startBoss(newBoss(), queue);
    try {
      await workSensorImports(b, queue);
      const done = await finished(eng, job.id);
      expect(done.state, done.error).toBe('completed');
      expect(done.attempts).toBe(1);
      expect(await stored(file.id)).toEqual({ samples: 4000, trials: done.result.trials, fileState: 'imported' });
    } finally {
      await b.stop({ graceful: true, wait: true });
    }
  });

  test('an import that was running when its process died is started again by the next process', { timeout: 120_000 }, async () => {
    // Staged like the test above, on a queue of its own. Process A takes the job from the queue
    // (pg-boss marks it active) and "dies" mid-import: its transaction is gone with it, so nothing
    // is stored, and what it leaves is a job row saying `running` whose progress stopped two
    // minutes ago. Process B finds it (nobody holds the lock on its source file), hands it back to
    // pg-boss, and its worker runs the import again from the start.
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'interrupted.csv', await makeLog(4000));
    const queue = `sensor-import-crash-${Date.now().toString(36)}`;
    const em = await getEm();
    const job = await createImportJobRow(
      em,
      await em.findOneOrFail(Rig, { id: rig.id }),
      await em.findOneOrFail(SourceFile, { id: file.id }),
      await em.findOneOrFail(User, { email: 'engineer@cinder-hollow.test' }),
      logImportInput.parse({ mapping: MAPPING, preset: 'field' }),
    );
    const a = await startBoss(newBoss(), queue);
    await enqueueSensorImport(a, job.id, queue);
    const taken = await a.fetch(queue);
    expect(taken.map((j) => j.id)).toEqual([job.id]);
    await db.query(`UPDATE import_job SET state = 'running', attempts = 1, rows_done = 8192, started_at = now() - interval '2 minutes', updated_at = now() - interval '2 minutes' WHERE id = $1`, [job.id]);
    await a.stop({ graceful: false, wait: true });

    const b = await startBoss(newBoss(), queue);
    try {
      expect(await recoverInterruptedJobs(b, queue)).toEqual([job.id]);
      await workSensorImports(b, queue);
      const done = await finished(eng, job.id);
      expect(done.state, done.error).toBe('completed');
      expect(done.attempts).toBe(2);
      expect(await stored(file.id)).toEqual({ samples: 4000, trials: done.result.trials, fileState: 'imported' });
      // a running job of a live process is left alone
      expect(await recoverInterruptedJobs(b, queue)).toEqual([]);
    } finally {
      await b.stop({ graceful: true, wait: true });
    }
  });

  test('a job cancelled through the API before a worker took it is never run', { timeout: 120_000 }, async () => {
    // a queue of its own again, so that no worker takes the job before the DELETE
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'cancelled.csv', await makeLog(2000));
    const queue = `sensor-import-cancel-${Date.now().toString(36)}`;
    const em = await getEm();
    const job = await createImportJobRow(
      em,
      await em.findOneOrFail(Rig, { id: rig.id }),
      await em.findOneOrFail(SourceFile, { id: file.id }),
      await em.findOneOrFail(User, { email: 'engineer@cinder-hollow.test' }),
      logImportInput.parse({ mapping: MAPPING, preset: 'field' }),
    );
    const b = await startBoss(newBoss(), queue);
    try {
      await enqueueSensorImport(b, job.id, queue);
      const del = await eng.request('DELETE', `/api/jobs/${job.id}`);
      expect(del.status, del.text).toBe(200);
      expect(del.body.job.state).toBe('cancelled');
      await workSensorImports(b, queue);
      // the worker takes the pg-boss job and skips it: the row stays cancelled and nothing is stored
      const until = Date.now() + 30_000;
      while ((await b.getJobById(queue, job.id))?.state !== 'completed' && Date.now() < until) await new Promise((r) => setTimeout(r, 200));
      expect((await b.getJobById(queue, job.id))?.state).toBe('completed');
      expect((await eng.get(`/api/jobs/${job.id}`)).body.job.state).toBe('cancelled');
      expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });
    } finally {
      await b.stop({ graceful: true, wait: true });
    }
  });

  test('deleting a source file, a rig or a lab deletes their samples (triggers stand in for the foreign keys)', { timeout: 120_000 }, async () => {
    const samplesOf = async (fileId: string) => (await db.query('SELECT count(*)::int AS n FROM sensor_sample WHERE source_file_id = $1', [fileId])).rows[0].n as number;
    const importLog = async (c: Client, rigId: string, name: string, rows: number) => {
      const f = await upload(c, rigId, name, await makeLog(rows));
      const r = await c.post(`/api/rigs/${rigId}/uploads/${f.id}/log-import`, { mapping: MAPPING, preset: 'field' });
      expect(r.status, r.text).toBe(202);
      const job = await finished(c, r.body.job.id);
      expect(job.state, job.error).toBe('completed');
      expect(await samplesOf(f.id)).toBe(rows);
      return f.id;
    };
    const { eng, rig } = await setup();
    const a = await importLog(eng, rig.id, 'a.csv', 1500);
    const b = await importLog(eng, rig.id, 'b.csv', 1200);
    const other = await setup();
    const c = await importLog(other.eng, other.rig.id, 'c.csv', 1000);

    await db.query('DELETE FROM source_file WHERE id = $1', [a]);
    expect([await samplesOf(a), await samplesOf(b), await samplesOf(c)]).toEqual([0, 1200, 1000]);
    await db.query('DELETE FROM rig WHERE id = $1', [rig.id]);
    expect([await samplesOf(b), await samplesOf(c)]).toEqual([0, 1000]);
    // the file itself stays (its rig set to null), as before
    expect((await db.query('SELECT rig_id FROM source_file WHERE id = $1', [b])).rows).toEqual([{ rig_id: null }]);

    // a lab of its own, deleted as a whole: its rigs and files go by cascade, and their samples with them
    const email = `sample-owner-${Date.now().toString(36)}@example.test`;
    const { client: signed } = await createAccount(email, 'copper coil over a slow fire', 'Sample Owner', 'Sample Bench');
    const lab = (await signed.get('/api/me')).body.labs[0];
    const ownRig = (await signed.post(`/api/labs/${lab.id}/rigs`, { name: 'Tank loop', heatSource: 'propane-burner' })).body.rig;
    const d = await importLog(signed, ownRig.id, 'd.csv', 800);
    await db.query('DELETE FROM lab WHERE id = $1', [lab.id]);
    expect([await samplesOf(d), await samplesOf(c)]).toEqual([0, 1000]);
  });

  test('an import for a rig that is gone is refused and writes nothing', async () => {
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'orphan.csv', await makeLog(500));
    const key = (await db.query('SELECT storage_key FROM source_file WHERE id = $1', [file.id])).rows[0].storage_key;
    const target = { fileId: file.id, rigId: '00000000-0000-4000-8000-000000000000', labId: rig.labId, filename: 'orphan.csv', storageKey: key, sizeBytes: file.sizeBytes, uploadedAt: new Date() };
    const err = await importSensorLog(target, logImportInput.parse({ mapping: MAPPING, preset: 'field' })).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ImportError);
    expect((err as Error).message).toMatch(/rig no longer exists/);
    expect(await stored(file.id)).toEqual({ samples: 0, trials: 0, fileState: 'uploaded' });
  });

  test('jobs are not visible outside their lab', async () => {
    const { eng, rig } = await setup();
    const file = await upload(eng, rig.id, 'scoped.csv', await makeLog(1000));
    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: MAPPING, preset: 'field' });
    const email = `elsewhere-${Date.now().toString(36)}@example.test`;
    const { client: outsider } = await createAccount(email, 'copper coil over a slow fire', 'Other Lab Tester', 'Other Bench');
    expect((await outsider.get(`/api/jobs/${started.body.job.id}`)).status).toBe(404);
    expect((await outsider.request('DELETE', `/api/jobs/${started.body.job.id}`)).status).toBe(404);
    await finished(eng, started.body.job.id);
  });

  test('a collector log keeps the sun: irradiance and wind in its samples, irradiance and the air in its overview and on the rig page; a coil log stays as it was', { timeout: 120_000 }, async () => {
    const { eng, rig } = await engineerWithRig('Sun rig', 'solar-collector');
    // the morning of the demo's logged day (fixtures/demo-solar.ts), 06:00 to about 12:06
    const csv = solarLogCsv().split('\n').slice(0, 2201).join('\n') + '\n';
    const file = await upload(eng, rig.id, 'collector-morning.csv', Buffer.from(csv));
    const started = await eng.post(`/api/rigs/${rig.id}/uploads/${file.id}/log-import`, { mapping: SOLAR_LOG_MAPPING, preset: 'collector' });
    expect(started.status, started.text).toBe(202);
    const job = await finished(eng, started.body.job.id);
    expect(job.state, job.error).toBe('completed');
    expect(job.result.samples).toBe(2200);
    // each sample as written in the file (columns: time, G, air, wind, inlet, outlet, flow)
    const cells = csv.split('\n')[2].split(',');
    const s = (await db.query('SELECT irradiance_w_per_m2 AS g, wind_m_per_s AS u, ambient_c AS a, inlet_c AS i FROM sensor_sample WHERE source_file_id = $1 AND line = 3', [file.id])).rows[0];
    expect(s).toEqual({ g: Number(cells[1]), a: Number(cells[2]), u: Number(cells[3]), i: Number(cells[4]) });
    expect((await db.query('SELECT count(*)::int AS n FROM sensor_sample WHERE source_file_id = $1 AND irradiance_w_per_m2 IS NULL', [file.id])).rows[0].n).toBe(0);
    // the overview draws the sun and the air on the same time base, keeping the extremes (the sunniest sample is in it)
    const o = (await db.query('SELECT points FROM sensor_overview WHERE source_file_id = $1', [file.id])).rows[0].points;
    expect(o.irradianceWPerM2).toHaveLength(o.tS.length);
    expect(o.ambientTempC).toHaveLength(o.tS.length);
    const gs = csv.trim().split('\n').slice(1).map((l) => Number(l.split(',')[1]));
    expect(Math.max(...o.irradianceWPerM2)).toBe(Math.max(...gs));
    const page = await eng.get(`/rigs/${rig.id}`);
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/Logged irradiance in the collector plane/);
    expect(page.text).toMatch(/collector-morning\.csv/);
    // the demo burner loop's log (a coil log) has no sun: NULL in its samples, none in its overview
    const coil = (await db.query(`SELECT f.id FROM source_file f WHERE f.filename = $1`, [demoWork.log.filename])).rows[0].id;
    expect((await db.query('SELECT count(*)::int AS n FROM sensor_sample WHERE source_file_id = $1 AND (irradiance_w_per_m2 IS NOT NULL OR wind_m_per_s IS NOT NULL)', [coil])).rows[0].n).toBe(0);
    const coilPoints = (await db.query('SELECT points FROM sensor_overview WHERE source_file_id = $1', [coil])).rows[0].points;
    expect(coilPoints).not.toHaveProperty('irradianceWPerM2');
  });
});
