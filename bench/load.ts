/**
 * `npm run bench -- load [--url URL] [--clients 32] [--seconds 20]`: the app under a team's load,
 * over loopback HTTP with keep-alive connections.
 *
 * 1. The app: the one at `--url` (or `LOAD_BENCH_URL`), which must hold the demo lab; else one of
 *    our own — the private cluster (started when `npm start` is not running; DATABASE_URL wins)
 *    with its migrations and demo lab, the local fakes, a build of the current sources (skipped
 *    when unchanged) and `scripts/serve.mjs` on a free port of 127.0.0.1, as `npm start` runs it.
 * 2. Set-up through the API, as the demo engineer: a rig with 50 bucket trials (invented: the
 *    constant-source coil of DOMAIN.md §1.2 with Ts 90 °C and UA 500 W/K, flows 4–29 L/min, an
 *    inlet of 15 °C, seeded noise), a saved coil fit over them and a study of seven blocks (text,
 *    caution, fit, comparison, performance, trials, a forecast from the fit). Its time is printed.
 * 3. Single endpoints, 16 clients for 3 s each (after a warm-up): the study page, `/rigs`, the rig
 *    page, the trials API, one study block; then 30 analyses of the 50-trial rig one after another
 *    (p50). Targets: study page ≥ 300 req/s, analyze p50 ≤ 40 ms.
 * 4. The mixed load: `clients` clients (32) for `seconds` (20), each sending its next request as
 *    soon as the last one has answered, drawn with a seeded generator from the mix below.
 * 5. Four clients fitting (POST …/analyze) in a loop for 10 s while one more client asks
 *    `GET /api/health` every 50 ms.
 * The last line is `load: R req/s, p95 P ms, errors E; health p95 H ms while fitting` (targets
 * R ≥ 150, P ≤ 600, E = 0, H ≤ 100). An error is any answer other than 2xx or a failed request.
 * What it created is removed when it can reach the database (its own app, or DATABASE_URL with
 * `--url`); the server it started is stopped, and the cluster too when it started it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import pg from 'pg';
import { mulberry32 } from '../analysis/fit/random';

const root = path.resolve(__dirname, '..');
const argv = process.argv.slice(2);
const opt = (flag: string) => {
  const i = argv.indexOf(flag);
  return i >= 0 ? argv[i + 1] : undefined;
};
const CLIENTS = Number(opt('--clients') ?? 32);
const SECONDS = Number(opt('--seconds') ?? 20);
const FIT_CLIENTS = 4;
const FIT_SECONDS = 10;
const ALONE_CLIENTS = 16;
const ALONE_SECONDS = 3;
const REQUEST_TIMEOUT_MS = 60_000;

/** The mixed load: what a team does at once (weights out of 100). */
const MIX = [
  { name: 'GET /rigs', weight: 15 },
  { name: 'GET /rigs/:id', weight: 15 },
  { name: 'GET /api/rigs/:id/trials', weight: 25 },
  { name: 'GET /api/studies/:id/blocks/:block', weight: 20 },
  { name: 'GET /studies/:id', weight: 15 },
  { name: 'POST /api/rigs/:id/analyze', weight: 10 },
] as const;
type RouteName = (typeof MIX)[number]['name'];

const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });

interface Answer { status: number; ms: number; body: string; cookies?: string[] }

/** One request over the keep-alive agent; resolves with status 0 when the request itself failed. */
function request(base: string, method: string, url: string, headers: Record<string, string>, body?: unknown): Promise<Answer> {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const payload = body === undefined ? undefined : JSON.stringify(body);
    const req = http.request(base + url, {
      method, agent,
      headers: { ...headers, ...(payload ? { 'content-type': 'application/json', 'content-length': String(Buffer.byteLength(payload)) } : {}) },
    }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, ms: performance.now() - t0, body: Buffer.concat(chunks).toString('utf8'), cookies: res.headers['set-cookie'] }));
      res.on('error', (e) => resolve({ status: 0, ms: performance.now() - t0, body: e.message }));
    });
    req.on('error', (e) => resolve({ status: 0, ms: performance.now() - t0, body: e.message }));
    // an answer that never comes is an error, not a hung benchmark
    req.setTimeout(REQUEST_TIMEOUT_MS, () => req.destroy(new Error(`no answer within ${REQUEST_TIMEOUT_MS / 1000} s`)));
    req.end(payload);
  });
}

const ok = (a: Answer) => a.status >= 200 && a.status < 300;
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- API answers of several shapes, read field by field
function must(a: Answer, what: string): any {
  if (!ok(a)) throw new Error(`${what} answered ${a.status}: ${a.body.slice(0, 300)}`);
  return a.body.startsWith('{') ? JSON.parse(a.body) : a.body;
}

/** The q-quantile of sorted values (nearest rank). */
function quantile(sorted: number[], q: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
}

/** 50 invented bucket trials: the constant-source coil, Tout = Ts − (Ts − Tin)·exp(−UA/(ṁ·cp)) (DOMAIN.md §1.2). */
function benchTrials() {
  const rnd = mulberry32(50);
  const noise = () => (rnd() + rnd() + rnd() - 1.5) * 0.3;
  const trials = [];
  const t0 = Date.parse('2026-05-02T09:00:00Z');
  for (let i = 0; i < 50; i++) {
    const flowLPerMin = 4 + ((i * 7) % 26); // 4–29 L/min in a shuffled order
    const q = flowLPerMin / 60000;
    const inlet = 15 + 0.02 * i;
    const outlet = 90 - (90 - inlet) * Math.exp(-500 / (q * 990 * 4180));
    trials.push({
      startedAt: new Date(t0 + i * 600_000).toISOString(),
      flow: q * (1 + noise() / 50),
      inlet: Math.round((inlet + noise()) * 100) / 100,
      outlet: Math.round((outlet + noise()) * 100) / 100,
    });
  }
  return trials;
}

interface Setup {
  headers: Record<string, string>;
  labId: string;
  rigId: string;
  fitId: string;
  studyId: string;
  blockIds: string[];
  createdMs: { rig: number; trials: number; fit: number; study: number };
}

async function setUp(base: string): Promise<Setup> {
  const { demoAccounts } = (await import(pathToFileURL(path.join(root, 'scripts/lib/demo-accounts.mjs')).href)) as { demoAccounts(): { password: string; users: { email: string; role: string }[] } };
  const { password, users } = demoAccounts();
  const engineer = users.find((u) => u.role === 'engineer')!.email;
  const origin = { origin: base };
  const signIn = await request(base, 'POST', '/api/auth/sign-in', origin, { email: engineer, password });
  must(signIn, 'sign-in of the demo engineer');
  const cookie = (signIn.cookies ?? []).map((c) => c.split(';')[0]).join('; ');
  const headers = { ...origin, cookie };
  const me = must(await request(base, 'GET', '/api/me', headers), 'GET /api/me');
  const labId: string = me.labs[0].id;
  const stamp = `${process.pid}-${Date.now().toString(36)}`;

  let t = performance.now();
  const rig = must(await request(base, 'POST', `/api/labs/${labId}/rigs`, headers, { name: `Load bench coil ${stamp}`, heatSource: 'wood-fire' }), 'creating the rig').rig;
  const rigMs = performance.now() - t;
  t = performance.now();
  const trials = must(await request(base, 'POST', `/api/rigs/${rig.id}/trials`, headers, { trials: benchTrials() }), 'adding 50 trials').trials as { id: string }[];
  const trialsMs = performance.now() - t;
  t = performance.now();
  const fit = must(await request(base, 'POST', `/api/labs/${labId}/fits`, headers, {
    rigId: rig.id, title: 'Load bench coil fit', model: 'coil', trialIds: trials.map((x) => x.id), compareWith: ['exp-inlet', 'poly2'],
  }), 'saving the fit').fit;
  const fitMs = performance.now() - t;
  t = performance.now();
  const study = must(await request(base, 'POST', `/api/labs/${labId}/studies`, headers, { title: `Load bench study ${stamp}` }), 'creating the study').study;
  const blocks = [
    { id: 'text', kind: 'text', data: { markdown: '## Coil over a wood fire\n\nFifty bucket trials, the coil fit over them, and what it does to a pool.' } },
    { id: 'caution', kind: 'caution', data: {} },
    { id: 'fit', kind: 'fit', data: { fitId: fit.id } },
    { id: 'cmp', kind: 'comparison', data: { fitId: fit.id } },
    { id: 'perf', kind: 'performance', data: { fitId: fit.id } },
    { id: 'trials', kind: 'trials', data: { fitId: fit.id } },
    { id: 'fc', kind: 'forecast', data: { poolVolume: '15000 gal', startTemp: '68 degF', targetTemp: '82 degF', hours: 48, flow: '3 gpm', fitId: fit.id, losses: false } },
  ];
  must(await request(base, 'PUT', `/api/studies/${study.id}`, headers, { title: study.title, blocks, baseRevision: study.revision }), 'saving the study blocks');
  const studyMs = performance.now() - t;
  return { headers, labId, rigId: rig.id, fitId: fit.id, studyId: study.id, blockIds: blocks.map((b) => b.id), createdMs: { rig: rigMs, trials: trialsMs, fit: fitMs, study: studyMs } };
}

function send(base: string, s: Setup, name: RouteName, pick: () => number): Promise<Answer> {
  switch (name) {
    case 'GET /rigs': return request(base, 'GET', '/rigs', s.headers);
    case 'GET /rigs/:id': return request(base, 'GET', `/rigs/${s.rigId}`, s.headers);
    case 'GET /api/rigs/:id/trials': return request(base, 'GET', `/api/rigs/${s.rigId}/trials?pageSize=50`, s.headers);
    case 'GET /api/studies/:id/blocks/:block': return request(base, 'GET', `/api/studies/${s.studyId}/blocks/${s.blockIds[Math.floor(pick() * s.blockIds.length)]}`, s.headers);
    case 'GET /studies/:id': return request(base, 'GET', `/studies/${s.studyId}`, s.headers);
    case 'POST /api/rigs/:id/analyze': return request(base, 'POST', `/api/rigs/${s.rigId}/analyze`, s.headers, { models: ['coil', 'exp-inlet'] });
  }
}

interface Sample { name: string; status: number; ms: number; body: string }

/** `clients` loops, each sending its next request when the last one has answered, until `seconds` pass. */
async function loop(clients: number, seconds: number, next: (client: number) => Promise<Sample>): Promise<{ samples: Sample[]; wallS: number }> {
  const samples: Sample[] = [];
  const t0 = performance.now();
  const end = t0 + seconds * 1000;
  await Promise.all(Array.from({ length: clients }, async (_, c) => {
    while (performance.now() < end) samples.push(await next(c));
  }));
  return { samples, wallS: (performance.now() - t0) / 1000 };
}

const f0 = (x: number) => (Number.isFinite(x) ? x.toFixed(0) : '–');
const loadAverages = () => os.loadavg().map((x) => x.toFixed(2)).join(' ');

async function measure(base: string): Promise<{ created: Setup }> {
  console.log(`load bench against ${base}: ${os.cpus().length} cores, load averages ${loadAverages()}`);
  const s = await setUp(base);
  const c = s.createdMs;
  console.log(`set-up through the API: rig ${f0(c.rig)} ms, its 50 trials in one batch ${f0(c.trials)} ms (the rig with its trials: ${f0(c.rig + c.trials)} ms), coil fit saved (compared with exp-inlet and poly2) ${f0(c.fit)} ms, study of ${s.blockIds.length} blocks ${f0(c.study)} ms`);
  const rnd = mulberry32(14);
  // warm-up: every route a few times (the first request of a route loads its code)
  // (a route that fails is named here and counted as errors below; the figures of the rest still come)
  const failing = new Set<RouteName>();
  for (let i = 0; i < 3; i++) {
    for (const m of MIX) {
      const a = await send(base, s, m.name, rnd);
      if (!ok(a) && !failing.has(m.name)) {
        failing.add(m.name);
        console.log(`warning: warm-up ${m.name} answered ${a.status}: ${a.body.slice(0, 160).replace(/\s+/g, ' ')}`);
      }
    }
  }

  for (const name of ['GET /studies/:id', 'GET /rigs', 'GET /rigs/:id', 'GET /api/rigs/:id/trials', 'GET /api/studies/:id/blocks/:block'] as RouteName[]) {
    const r = await loop(ALONE_CLIENTS, ALONE_SECONDS, async () => ({ name, ...(await send(base, s, name, rnd)) }));
    const times = r.samples.map((x) => x.ms).sort((a, b) => a - b);
    const errors = r.samples.filter((x) => !ok(x)).length;
    console.log(`alone, ${ALONE_CLIENTS} clients for ${ALONE_SECONDS} s: ${name.padEnd(36)} ${(r.samples.length / r.wallS).toFixed(0).padStart(5)} req/s, p50 ${f0(quantile(times, 0.5))} ms, p95 ${f0(quantile(times, 0.95))} ms${errors ? `, ${errors} errors` : ''}${name === 'GET /studies/:id' ? ' (target >= 300 req/s)' : ''}`);
  }
  const analyses: number[] = [];
  for (let i = 0; i < 30; i++) {
    const a = await send(base, s, 'POST /api/rigs/:id/analyze', rnd);
    must(a, 'analyze');
    analyses.push(a.ms);
  }
  analyses.sort((a, b) => a - b);
  console.log(`alone, one client: POST /api/rigs/:id/analyze of the 50-trial rig (coil and exp-inlet) p50 ${analyses[14].toFixed(1)} ms, p95 ${quantile(analyses, 0.95).toFixed(1)} ms (target p50 <= 40 ms)`);

  // the mixed load
  const total = MIX.reduce((a, m) => a + m.weight, 0);
  const draw = (): RouteName => {
    let x = rnd() * total;
    for (const m of MIX) if ((x -= m.weight) < 0) return m.name;
    return MIX[0].name;
  };
  console.log(`mixed load: ${CLIENTS} clients for ${SECONDS} s over ${MIX.map((m) => `${m.name} ${m.weight}%`).join(', ')}`);
  const mixed = await loop(CLIENTS, SECONDS, async () => {
    const name = draw();
    return { name, ...(await send(base, s, name, rnd)) };
  });
  const all = mixed.samples.map((x) => x.ms).sort((a, b) => a - b);
  const errors = mixed.samples.filter((x) => !ok(x));
  for (const m of MIX) {
    const mine = mixed.samples.filter((x) => x.name === m.name);
    const t = mine.map((x) => x.ms).sort((a, b) => a - b);
    console.log(`  ${m.name.padEnd(36)} ${String(mine.length).padStart(6)} requests, p50 ${f0(quantile(t, 0.5)).padStart(5)} ms, p95 ${f0(quantile(t, 0.95)).padStart(5)} ms, max ${f0(t.at(-1) ?? NaN).padStart(5)} ms${mine.some((x) => !ok(x)) ? `, ${mine.filter((x) => !ok(x)).length} errors` : ''}`);
  }
  for (const e of errors.slice(0, 3)) console.log(`  error: ${e.name} answered ${e.status}: ${e.body.slice(0, 200)}`);
  const rps = mixed.samples.length / mixed.wallS;
  const p95 = quantile(all, 0.95);
  console.log(`mixed: ${mixed.samples.length} requests in ${mixed.wallS.toFixed(1)} s = ${rps.toFixed(0)} req/s, p50 ${f0(quantile(all, 0.5))} ms, p95 ${f0(p95)} ms, p99 ${f0(quantile(all, 0.99))} ms, errors ${errors.length} (targets >= 150 req/s, p95 <= 600 ms, 0 errors)`);

  // four people fitting while the health check is timed
  let fitting = true;
  const health: number[] = [];
  let healthErrors = 0;
  const probe = (async () => {
    while (fitting) {
      const a = await request(base, 'GET', '/api/health', {});
      if (!ok(a)) healthErrors++;
      health.push(a.ms);
      await new Promise((r) => setTimeout(r, 50));
    }
  })();
  const fits = await loop(FIT_CLIENTS, FIT_SECONDS, async () => ({ name: 'POST /api/rigs/:id/analyze', ...(await send(base, s, 'POST /api/rigs/:id/analyze', rnd)) }));
  fitting = false;
  await probe;
  health.sort((a, b) => a - b);
  const fitTimes = fits.samples.map((x) => x.ms).sort((a, b) => a - b);
  const fitErrors = fits.samples.filter((x) => !ok(x)).length;
  console.log(`${FIT_CLIENTS} clients fitting for ${FIT_SECONDS} s: ${(fits.samples.length / fits.wallS).toFixed(1)} analyses/s, p50 ${f0(quantile(fitTimes, 0.5))} ms${fitErrors ? `, ${fitErrors} errors` : ''}; GET /api/health every 50 ms meanwhile: ${health.length} answers, p50 ${f0(quantile(health, 0.5))} ms, p95 ${f0(quantile(health, 0.95))} ms, max ${f0(health.at(-1) ?? NaN)} ms${healthErrors ? `, ${healthErrors} errors` : ''} (target p95 <= 100 ms)`);
  console.log(`load averages after: ${loadAverages()}`);
  console.log(`load: ${rps.toFixed(0)} req/s, p95 ${f0(p95)} ms, errors ${errors.length + fitErrors + healthErrors}; health p95 ${f0(quantile(health, 0.95))} ms while fitting`);
  return { created: s };
}

/** Removes what the set-up made (the rig's trials and the fit go with the rig and by its id). */
async function cleanUp(databaseUrl: string, s: Setup): Promise<void> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('DELETE FROM study WHERE id = $1', [s.studyId]);
    await client.query('DELETE FROM fit WHERE rig_id = $1', [s.rigId]);
    await client.query('DELETE FROM rig WHERE id = $1', [s.rigId]);
  } finally {
    await client.end();
  }
}

async function main() {
  const given = opt('--url') ?? process.env.LOAD_BENCH_URL;
  if (given) {
    const { created } = await measure(given.replace(/\/$/, ''));
    if (process.env.DATABASE_URL) await cleanUp(process.env.DATABASE_URL, created);
    else console.log(`left in the demo lab (no DATABASE_URL to remove them): rig ${created.rigId}, study ${created.studyId}`);
    return 0;
  }
  // the lifecycle scripts' own helpers (plain .mjs without types: loaded by URL)
  const lib = (name: string) => import(pathToFileURL(path.join(root, 'scripts', 'lib', name)).href);
  const { bootstrap } = (await lib('bootstrap.mjs')) as { bootstrap(o: { database: string; demo: boolean }): Promise<{ databaseUrl: string; stop(): void }> };
  const { buildIfChanged } = (await lib('build.mjs')) as { buildIfChanged(): boolean };
  const { startFakes } = (await lib('fakes.mjs')) as { startFakes(): Promise<{ env: Record<string, string>; stop(): void }> };
  const { freePort, waitForHealth, webProcesses } = (await lib('util.mjs')) as { freePort(): Promise<number>; waitForHealth(url: string, web: ChildProcess): Promise<void>; webProcesses(): number };
  const db = await bootstrap({ database: 'emberline', demo: true });
  let web: ChildProcess | null = null;
  let fakes: { stop(): void } | null = null;
  let created: Setup | null = null;
  try {
    const f = await startFakes();
    fakes = f;
    buildIfChanged();
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    const env = { ...process.env, ...f.env, DATABASE_URL: db.databaseUrl, NODE_ENV: 'production', NEXT_TELEMETRY_DISABLED: '1', EMBERLINE_DEMO: 'true', APP_URL: base } as NodeJS.ProcessEnv;
    web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', '127.0.0.1', '-p', String(port), '--processes', String(webProcesses())], { cwd: root, env, stdio: ['ignore', 'ignore', 'inherit'] });
    await waitForHealth(`${base}/api/health`, web);
    created = (await measure(base)).created;
    return 0;
  } finally {
    if (created) await cleanUp(db.databaseUrl, created).catch((e: unknown) => console.error('clean-up failed:', e));
    if (web && web.exitCode === null) {
      const exited = new Promise((res) => web!.once('exit', res));
      web.kill('SIGTERM');
      await exited;
    }
    fakes?.stop();
    db.stop();
  }
}

main().then((code) => {
  agent.destroy();
  process.exit(code);
}, (e: unknown) => {
  console.error(e);
  process.exit(1);
});
