/**
 * The web tier is stateless: two app instances (`scripts/serve.mjs`, the production build of
 * `npm test`) on two ports, against one PostgreSQL database of their own (`emberline_multi`, fresh,
 * migrated, with the demo lab) and the one object store, behave as one app. Sessions, their
 * revocation, rate limits and share links live in PostgreSQL; both instances run job workers, and
 * pg-boss hands a job to one of them (SKIP LOCKED); a job whose instance is killed is finished by
 * the other once its lease has run out (app/_lib/jobs/job-store.ts: lease 15 s, heartbeat 5 s,
 * recovery sweep 5 s).
 *
 * The instances are our own (the app of `npm test` keeps running the other tests, and it does not
 * share this database, so that no third worker takes the jobs). Both believe one proxy hop
 * (TRUST_PROXY_HOPS=1) and share one public origin (APP_URL), as behind one load balancer.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, DEMO_PASSWORD, uniqueEmail } from './support/client';
import { LOG_MAPPING, logFolder, uploadRaw } from './support/sensor-logs';

const root = path.resolve(__dirname, '../..');
const lib = (name: string) => import(pathToFileURL(path.join(root, 'scripts', 'lib', name)).href);

interface Instance { name: string; url: string; web: ChildProcess }
let a: Instance;
let b: Instance;
let dbUrl: string;
let db: pg.Pool;
const logs = logFolder('multi-instance');

function stop(i: Instance | undefined, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (!i || i.web.exitCode !== null || i.web.signalCode !== null) return Promise.resolve();
  return new Promise((res) => {
    i.web.once('exit', () => res());
    i.web.kill(signal);
  });
}

/** Waits until the instance answers its health check (a busy machine may take a while to start two). */
async function healthy(i: Instance, limitMs = 180_000): Promise<void> {
  const until = Date.now() + limitMs;
  for (;;) {
    if (i.web.exitCode !== null) throw new Error(`instance ${i.name} exited with code ${i.web.exitCode}`);
    const ok = await fetch(`${i.url}/api/health`).then((r) => r.ok, () => false);
    if (ok) return;
    if (Date.now() > until) throw new Error(`instance ${i.name} was not healthy within ${limitMs / 1000} s`);
    await new Promise((res) => setTimeout(res, 300));
  }
}

beforeAll(async () => {
  const { ensureDatabase } = (await lib('database.mjs')) as { ensureDatabase(url: string, o: { fresh: boolean }): Promise<void> };
  const { freePort } = (await lib('util.mjs')) as { freePort(): Promise<number> };
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = '/emberline_multi';
  dbUrl = u.toString();
  await ensureDatabase(dbUrl, { fresh: true });
  const setup = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'scripts/setup-db.ts')], {
    cwd: root, env: { ...process.env, DATABASE_URL: dbUrl, EMBERLINE_DEMO: 'true', NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --conditions=react-server`.trim() }, encoding: 'utf8',
  });
  if (setup.status !== 0) throw new Error(`migrations of emberline_multi failed: ${setup.stderr || setup.stdout}`);
  db = new pg.Pool({ connectionString: dbUrl, max: 3 });

  const ports = [await freePort(), await freePort()];
  const appUrl = `http://127.0.0.1:${ports[0]}`;
  const start = (name: string, port: number): Instance => ({
    name,
    url: `http://127.0.0.1:${port}`,
    web: spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', '127.0.0.1', '-p', String(port)], {
      cwd: root,
      env: { ...process.env, DATABASE_URL: dbUrl, NODE_ENV: 'production', TRUST_PROXY_HOPS: '1', APP_URL: appUrl, DATABASE_POOL_MAX: '4', EMBERLINE_ANALYSIS_THREADS: '1', EMBERLINE_JOB_WORKER: 'on' },
      stdio: ['ignore', 'ignore', 'inherit'],
    }),
  });
  a = start('A', ports[0]);
  b = start('B', ports[1]);
  await Promise.all([healthy(a), healthy(b)]);
}, 240_000);

afterAll(async () => {
  await Promise.all([stop(a), stop(b)]);
  logs.remove();
  await db?.end();
});

/** A client of one instance, with the shared public origin (as a browser behind the load balancer). */
const on = (i: Instance, ip?: string) => new Client(ip, i.url, a.url);
/** The same person (cookies and address) on the other instance. */
function moved(c: Client, to: Instance): Client {
  const other = on(to, c.ip);
  for (const [k, v] of c.cookies) other.cookies.set(k, v);
  return other;
}
async function signedInOn(i: Instance, email = 'engineer@cinder-hollow.test'): Promise<Client> {
  const c = on(i);
  const r = await c.post('/api/auth/sign-in', { email, password: DEMO_PASSWORD });
  expect(r.status, r.text).toBe(200);
  return c;
}

describe('two instances behave as one app', () => {
  test('a session made on one instance works on the other', { timeout: 60_000 }, async () => {
    const onA = await signedInOn(a, 'viewer@cinder-hollow.test');
    const onB = moved(onA, b);
    const me = await onB.get('/api/me');
    expect(me.status, me.text).toBe(200);
    expect(me.body.user.email).toBe('viewer@cinder-hollow.test');
    expect((await new Client(undefined, b.url, a.url).get('/api/me')).status).toBe(401); // and B does not simply let anyone in
  });

  test('sign-out everywhere on one instance ends the sessions on the other', async () => {
    const first = await signedInOn(a, 'reviewer@cinder-hollow.test');
    const second = await signedInOn(b, 'reviewer@cinder-hollow.test');
    const firstOnB = moved(first, b);
    expect((await firstOnB.get('/api/me')).status).toBe(200);
    expect((await second.get('/api/me')).status).toBe(200);
    const out = await first.post('/api/auth/sign-out-everywhere');
    expect(out.status, out.text).toBeLessThan(300);
    expect((await firstOnB.get('/api/me')).status).toBe(401);
    expect((await second.get('/api/me')).status).toBe(401);
    expect((await moved(second, a).get('/api/me')).status).toBe(401);
  });

  test('sign-in pacing counts the failures made on both instances (rate limits are shared)', async () => {
    // app/_lib/accounts/accounts.ts SIGN_IN_PACE: five free failures per (account, address), then
    // one try per 15 s; as test/app/accounts.test.ts shows on one instance, the seventh try is refused
    const email = uniqueEmail('paced');
    const guesserA = on(a);
    const guesserB = on(b, guesserA.ip);
    const statuses: number[] = [];
    let last;
    for (let i = 0; i < 7; i++) {
      last = await (i % 2 ? guesserB : guesserA).post('/api/auth/sign-in', { email, password: 'wrong wrong wrong' });
      statuses.push(last.status);
    }
    expect(statuses.slice(0, 6)).toEqual([401, 401, 401, 401, 401, 401]);
    expect(last!.status).toBe(429); // the seventh, on A, after three failures on B
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
  });

  test('a share link revoked on one instance is refused by the other', { timeout: 90_000 }, async () => {
    const eng = await signedInOn(a);
    const labId = (await eng.get('/api/me')).body.labs[0].id;
    const study = (await eng.post(`/api/labs/${labId}/studies`, { title: `Shared across instances ${Date.now().toString(36)}` })).body.study;
    const blockId = (await eng.get(`/api/studies/${study.id}`)).body.study.blocks[0].id;
    const made = await eng.post(`/api/studies/${study.id}/shares`, { days: 7 });
    expect(made.status, made.text).toBe(201);
    const token = String(made.body.url).split('/share/')[1];
    const anon = new Client(undefined, b.url, null);
    expect((await anon.get(`/api/share/${token}/blocks/${blockId}`)).status).toBe(200);
    expect((await anon.get(`/share/${token}`)).text).not.toContain('This link cannot be used');
    const revoked = await eng.request('DELETE', `/api/shares/${made.body.share.id}`);
    expect(revoked.status, revoked.text).toBeLessThan(300);
    expect((await anon.get(`/api/share/${token}/blocks/${blockId}`)).status).toBe(404);
    expect((await anon.get(`/share/${token}`)).text).toContain('This link cannot be used');
    expect((await anon.get(`/api/share/${token}/export`)).status).toBe(404);
  });
});

describe('background jobs with a worker in each instance', () => {
  const stored = async (fileId: string) => {
    const s = await db.query('SELECT count(*)::int AS n, count(DISTINCT line)::int AS lines FROM sensor_sample WHERE source_file_id = $1', [fileId]);
    const t = await db.query('SELECT count(*)::int AS n FROM trial WHERE source_file_id = $1', [fileId]);
    return { samples: s.rows[0].n as number, lines: s.rows[0].lines as number, trials: t.rows[0].n as number };
  };
  async function rigOf(c: Client, tag: string) {
    const labId = (await c.get('/api/me')).body.labs[0].id;
    const r = await c.post(`/api/labs/${labId}/rigs`, { name: `${tag} ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`, heatSource: 'propane-burner' });
    expect(r.status, r.text).toBe(201);
    return r.body.rig.id as string;
  }
  async function finished(c: Client, jobId: string, limitMs: number) {
    const until = Date.now() + limitMs;
    for (;;) {
      const r = await c.get(`/api/jobs/${jobId}`);
      expect(r.status, r.text).toBe(200);
      if (['completed', 'failed', 'cancelled'].includes(r.body.job.state)) return r.body.job;
      if (Date.now() > until) throw new Error(`job ${jobId} still ${r.body.job.state} after ${limitMs} ms`);
      await new Promise((res) => setTimeout(res, 250));
    }
  }

  test('each sensor-log import job is run exactly once though both instances run workers', { timeout: 180_000 }, async () => {
    const eng = await signedInOn(a);
    const rigId = await rigOf(eng, 'Two workers');
    // three jobs at once, started on both instances, so that both workers are busy
    const jobs: { fileId: string; jobId: string }[] = [];
    for (const [i, via] of [a, b, a].entries()) {
      const c = moved(eng, via);
      const file = await uploadRaw(c, rigId, `two-workers-${i}.csv`, await logs.make(3000));
      const started = await c.post(`/api/rigs/${rigId}/uploads/${file.id}/log-import`, { mapping: LOG_MAPPING, preset: 'field' });
      expect(started.status, started.text).toBe(202);
      jobs.push({ fileId: file.id, jobId: started.body.job.id });
    }
    for (const j of jobs) {
      const done = await finished(moved(eng, b), j.jobId, 120_000);
      expect(done.state, done.error).toBe('completed');
      // claimed once: a second claim of the same job would count a second attempt
      expect(done.attempts).toBe(1);
      expect(await stored(j.fileId)).toEqual({ samples: 3000, lines: 3000, trials: done.result.trials });
    }
  });

  test('a job whose instance is killed (SIGKILL) is finished by the other within 60 s', { timeout: 240_000 }, async () => {
    const eng = await signedInOn(a);
    const rigId = await rigOf(eng, 'Killed worker');
    const file = await uploadRaw(eng, rigId, 'killed-worker.csv', await logs.make(3000));
    // hold the source file's row, so that the import that takes the job waits inside its transaction
    const holder = await db.connect();
    let killed: Instance | null = null;
    let jobId = '';
    try {
      await holder.query('BEGIN');
      // NO KEY UPDATE: the job row's foreign key (KEY SHARE) passes, the import's FOR UPDATE waits
      await holder.query('SELECT 1 FROM source_file WHERE id = $1 FOR NO KEY UPDATE', [file.id]);
      const started = await eng.post(`/api/rigs/${rigId}/uploads/${file.id}/log-import`, { mapping: LOG_MAPPING, preset: 'field' });
      expect(started.status, started.text).toBe(202);
      jobId = started.body.job.id as string;
      // the waiting import names its process (pg-pool.ts: application_name "emberline <host> <pid>")
      const until = Date.now() + 60_000;
      let pid = 0;
      while (!pid) {
        const w = await db.query<{ application_name: string }>(
          `SELECT application_name FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock' AND query ILIKE '%FROM source_file WHERE id%FOR UPDATE%'`,
        );
        pid = Number(w.rows[0]?.application_name.split(' ').at(-1) ?? 0);
        if (!pid && Date.now() > until) throw new Error('no instance took the job within 60 s');
        if (!pid) await new Promise((res) => setTimeout(res, 200));
      }
      killed = [a, b].find((i) => i.web.pid === pid) ?? null;
      expect(killed, `the import runs in process ${pid}, which is neither instance (${a.web.pid}, ${b.web.pid})`).not.toBeNull();
      expect((await db.query('SELECT state, attempts FROM import_job WHERE id = $1', [jobId])).rows[0]).toEqual({ state: 'running', attempts: 1 });
      await stop(killed!, 'SIGKILL');
    } finally {
      await holder.query('ROLLBACK').catch(() => undefined);
      holder.release();
    }
    const survivor = killed === a ? b : a;
    const t0 = Date.now();
    const done = await finished(moved(eng, survivor), jobId, 60_000);
    expect(done.state, done.error).toBe('completed');
    expect(done.attempts).toBe(2);
    // the killed attempt left nothing: every sample once
    expect(await stored(file.id)).toEqual({ samples: 3000, lines: 3000, trials: done.result.trials });
    console.log(`multi-instance: the job of the killed instance ${killed!.name} was finished by ${survivor.name} ${((Date.now() - t0) / 1000).toFixed(1)} s after the kill`);
  });
});
