/**
 * `npm run bench -- study [rows]`: the study page of issue 7 over a rig with a million logged
 * samples, rendered by the real app over HTTP.
 *
 * 1. the private cluster (started if `npm start` is not running; DATABASE_URL wins) with its
 *    migrations, and a build of the current sources (skipped when unchanged);
 * 2. a `next start` of our own on a free port, with its own session secret and no job worker;
 * 3. a rig whose 1 Hz log of `rows` samples (default 1,000,000) is generated here and written with
 *    one text COPY (plateaus of 1200 s cycling through seven flows; each plateau's outlet is the
 *    constant-source coil of DOMAIN.md §1.2, Ts 90 °C and UA 500 W/K, reached with a 60-s
 *    first-order lag; seeded noise), its display overview built from the stored samples (the
 *    backfill path: binary COPY out, segmentation, LTTB), one trial per steady segment and a saved
 *    coil fit over them;
 * 4. a study of six blocks — text, fit, model comparison, performance table, forecast (the coil
 *    fit warming 15,000 gal) and the sensor log — and a session of the demo engineer;
 * 5. GET /studies/:id (one warm-up, then five timed requests, gzip as a browser asks): time to the
 *    last byte of the HTML, and the bytes shipped — the HTML with its inline RSC payload, plus
 *    every JS chunk, stylesheet (and preloaded font) the page loads, as sent (gzip) and
 *    uncompressed. A `noModule` script (legacy polyfills) is reported, not counted: a browser
 *    that runs the app's module chunks never fetches it. The font files the stylesheet offers are reported, not counted (a browser
 *    loads only the faces in use, once per site).
 * Targets: under 1 s and under 500 KB. Everything it creates is removed; the server it started
 * is stopped, and the cluster too when it started it. The last line is `study: S s, K KB`
 * (median time to the full HTML, bytes shipped with gzip).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { gunzipSync } from 'node:zlib';
import { from as copyFrom } from 'pg-copy-streams';

const root = path.resolve(__dirname, '..');
const tsx = path.join(root, 'node_modules/tsx/dist/cli.mjs');

/** Parent: database, build and web server; then this file again as the child, under react-server. */
async function parent() {
  // the lifecycle scripts' own helpers (plain .mjs without types: loaded by URL)
  const lib = (name: string) => import(pathToFileURL(path.join(root, 'scripts', 'lib', name)).href);
  const { bootstrap } = (await lib('bootstrap.mjs')) as { bootstrap(o: { database: string; demo: boolean }): Promise<{ databaseUrl: string; stop(): void }> };
  const { buildIfChanged } = (await lib('build.mjs')) as { buildIfChanged(): boolean };
  const { freePort, waitForHealth } = (await lib('util.mjs')) as { freePort(): Promise<number>; waitForHealth(url: string, web: ChildProcess): Promise<void> };
  const db = await bootstrap({ database: 'emberline', demo: true });
  let web: ChildProcess | null = null;
  let code = 1;
  try {
    buildIfChanged();
    const port = await freePort();
    const env = {
      ...process.env, DATABASE_URL: db.databaseUrl, SESSION_SECRET: randomBytes(32).toString('base64url'), EMBERLINE_JOB_WORKER: 'off',
      NODE_ENV: 'production', NEXT_TELEMETRY_DISABLED: '1', TZ: 'UTC', EMBERLINE_DEMO: 'true', APP_URL: `http://127.0.0.1:${port}`,
    } as NodeJS.ProcessEnv;
    web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', '127.0.0.1', '-p', String(port)], { cwd: root, env, stdio: ['ignore', 'ignore', 'inherit'] });
    await waitForHealth(`http://127.0.0.1:${port}/api/health`, web);
    const r = spawnSync(process.execPath, [tsx, __filename, ...process.argv.slice(2)], {
      stdio: 'inherit',
      env: { ...env, EMBERLINE_BENCH_CHILD: '1', STUDY_BENCH_URL: `http://127.0.0.1:${port}`, NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --conditions=react-server`.trim() },
    });
    code = r.status ?? 1;
  } finally {
    if (web && web.exitCode === null) {
      const exited = new Promise((res) => web!.once('exit', res));
      web.kill('SIGTERM');
      await exited;
    }
    db.stop();
  }
  process.exit(code);
}

interface Fetched { status: number; wireBytes: number; body: Buffer; ms: number }

/** GET with gzip as a browser asks for it; counts the bytes on the wire and the time to the last one. */
function get(url: string, headers: Record<string, string> = {}): Promise<Fetched> {
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    http.get(url, { headers: { 'accept-encoding': 'gzip', ...headers } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const raw = Buffer.concat(chunks);
        const body = res.headers['content-encoding'] === 'gzip' ? gunzipSync(raw) : raw;
        resolve({ status: res.statusCode ?? 0, wireBytes: raw.length, body, ms: performance.now() - t0 });
      });
      res.on('error', reject);
    }).on('error', reject);
  });
}

/**
 * The log as COPY text rows (PostgreSQL manual, "COPY", text format: tab-separated, one row per
 * line): plateau p = ⌊i / 1200⌋, flow 6 + 3·(p mod 7) L/min, inlet 14.5 + 0.2·(p mod 3) °C, and
 * the outlet of the constant-source coil at that flow (Ts 90 °C, UA 500 W/K, ρ 998, cp 4186),
 * each followed with a 60-s first-order lag (15 s for the flow); ±0.02 K and ±0.2 % seeded noise.
 */
async function* logRows(fileId: string, rigId: string, startMs: number, n: number): AsyncGenerator<string> {
  const { mulberry32 } = await import('@/analysis/segment/synthetic-log');
  const rnd = mulberry32(42);
  const k = 1 - Math.exp(-1 / 60), kq = 1 - Math.exp(-4 / 60);
  let tin = 14.5, tout = 40, q = 6 / 60000, ta = 19;
  let buf = '';
  for (let i = 0; i < n; i++) {
    const p = Math.floor(i / 1200);
    const setQ = (6 + 3 * (p % 7)) / 60000, setIn = 14.5 + 0.2 * (p % 3);
    const setOut = 90 - (90 - setIn) * Math.exp(-500 / (setQ * 998 * 4186));
    tin += (setIn - tin) * k; tout += (setOut - tout) * k; q += (setQ - q) * kq;
    ta += (19 + 3 * Math.sin((i / 43200) * Math.PI) - ta) * 0.01;
    const at = new Date(startMs + i * 1000).toISOString();
    buf += `${fileId}\t${i + 2}\t${rigId}\t${at}\t${(tin + 0.02 * (2 * rnd() - 1)).toFixed(3)}\t${(tout + 0.02 * (2 * rnd() - 1)).toFixed(3)}\t${(q * (1 + 0.002 * (2 * rnd() - 1))).toPrecision(6)}\t${(ta + 0.1 * (2 * rnd() - 1)).toFixed(2)}\n`;
    if (buf.length > 1 << 16) { yield buf; buf = ''; }
  }
  if (buf) yield buf;
}

async function child() {
  const base = process.env.STUDY_BENCH_URL!;
  const rows = Number(process.argv[2] ?? 1_000_000);
  const { getEm, getOrm } = await import('@/app/_lib/server/db');
  const { pgPool } = await import('@/app/_lib/server/pg-pool');
  const { ensureSensorOverview } = await import('@/app/_lib/imports/sensor-overview');
  const { saveFit } = await import('@/app/_lib/fits/fits');
  const { openSession } = await import('@/app/_lib/accounts/session');
  const SESSION_COOKIE = (await import('@/app/_lib/server/config')).config.sessionCookie;
  const { Lab, Rig, SensorOverview, SourceFile, Study, User } = await import('@/entities');
  const pool = pgPool();
  const em = await getEm();
  const created: { rig?: string; file?: string; study?: string; session?: string } = {};
  try {
    const lab = await em.findOneOrFail(Lab, { slug: 'cinder-hollow' });
    const user = await em.findOneOrFail(User, { email: 'engineer@cinder-hollow.test' });
    const rig = em.create(Rig, { lab, name: `study bench ${process.pid} ${Date.now()}`, heatSource: 'propane-burner' });
    const file = em.create(SourceFile, {
      lab, rig, filename: 'bench-log.csv', contentType: 'text/csv', sizeBytes: rows * 60, sha256: randomBytes(32).toString('hex'), storageKey: 'bench/none', state: 'imported', rowsImported: rows,
    });
    await em.flush();
    created.rig = rig.id;
    created.file = file.id;

    let t = performance.now();
    const client = await pool.connect();
    try {
      await pipeline(Readable.from(logRows(file.id, rig.id, Date.parse('2026-06-01T08:00:00Z'), rows)),
        client.query(copyFrom('COPY sensor_sample (source_file_id, line, rig_id, taken_at, inlet_c, outlet_c, flow_m3_per_s, ambient_c) FROM STDIN')));
    } finally {
      client.release();
    }
    console.log(`generated ${rows.toLocaleString('en')} logged samples and wrote them with COPY in ${((performance.now() - t) / 1000).toFixed(2)} s`);
    t = performance.now();
    await ensureSensorOverview(pool, file.id);
    const overview = await em.findOneOrFail(SensorOverview, { sourceFile: file.id });
    console.log(`overview built from the stored samples (COPY out, segmentation, LTTB): ${overview.points.tS.length} points, ${overview.segments.length} steady segments in ${((performance.now() - t) / 1000).toFixed(2)} s`);

    // one trial per steady segment, as the import writes them, and a saved coil fit over them
    const segs = overview.segments.filter((s) => Number.isFinite(s.flowM3PerS) && s.flowM3PerS > 0);
    await pool.query(
      `INSERT INTO trial (id, created_at, updated_at, lab_id, rig_id, started_at, flow_m3_per_s, inlet_c, outlet_c, source_file_id, origin)
       SELECT gen_random_uuid(), now(), now(), $1, $2, $3::timestamptz + make_interval(secs => s), q, tin, tout, $4, 'log-segment'
       FROM unnest($5::float8[], $6::float8[], $7::float8[], $8::float8[]) AS u(s, q, tin, tout)`,
      [lab.id, rig.id, overview.startedAt.toISOString(), file.id, segs.map((s) => s.startS), segs.map((s) => s.flowM3PerS), segs.map((s) => s.inletTempC), segs.map((s) => s.outletTempC)],
    );
    const trialIds = (await pool.query<{ id: string }>('SELECT id FROM trial WHERE rig_id = $1 ORDER BY started_at LIMIT 5000', [rig.id])).rows.map((r) => r.id);
    t = performance.now();
    const fit = await saveFit(em, rig, user, { title: 'bench coil', model: 'coil', trialIds, compareWith: ['exp-inlet', 'poly2'], measurementSdK: 0.3 });
    await em.flush();
    console.log(`saved a coil fit over ${trialIds.length} segment trials (compared with exp-inlet and poly2) in ${((performance.now() - t) / 1000).toFixed(2)} s`);

    const study = em.create(Study, {
      lab, createdBy: user, updatedBy: user, title: 'Study bench: burner loop over a million samples',
      blocks: [
        { id: 'text', kind: 'text', data: { markdown: '## Burner loop\n\nA million logged samples, the coil fit over their steady segments, and what it does to a pool.' } },
        { id: 'fit', kind: 'fit', data: { fitId: fit.id } },
        { id: 'cmp', kind: 'comparison', data: { fitId: fit.id } },
        { id: 'perf', kind: 'performance', data: { fitId: fit.id } },
        { id: 'fc', kind: 'forecast', data: { poolVolume: '15000 gal', startTemp: '68 degF', targetTemp: '82 degF', hours: 48, flow: '3 gpm', fitId: fit.id, losses: false } },
        { id: 'log', kind: 'sensor-log', data: { sourceFileId: file.id } },
      ],
    });
    await em.flush();
    created.study = study.id;
    const { jwt } = await openSession(em, user, 'study bench');
    created.session = (await pool.query<{ id: string }>('SELECT id FROM session WHERE user_id = $1 AND user_agent = $2 ORDER BY created_at DESC LIMIT 1', [user.id, 'study bench'])).rows[0].id;
    const cookie = `${SESSION_COOKIE}=${jwt}`;

    const sizes: string[] = [];
    for (const b of study.blocks) {
      const r = await get(`${base}/api/studies/${study.id}/blocks/${b.id}`, { cookie });
      if (r.status !== 200) throw new Error(`block ${b.id} answered ${r.status}`);
      sizes.push(`${b.kind} ${(r.body.length / 1024).toFixed(1)} KB`);
    }
    console.log(`block data (JSON, uncompressed): ${sizes.join(', ')}`);

    const url = `${base}/studies/${study.id}`;
    const warm = await get(url, { cookie });
    if (warm.status !== 200) throw new Error(`the study page answered ${warm.status}: ${warm.body.toString('utf8').slice(0, 300)}`);
    const runs: Fetched[] = [];
    for (let i = 0; i < 5; i++) runs.push(await get(url, { cookie }));
    const times = runs.map((r) => r.ms).sort((a, b) => a - b);
    const median = times[2];
    const page = runs[2];
    const html = page.body.toString('utf8');
    for (const kind of ['text', 'fit', 'comparison', 'performance', 'forecast', 'sensor-log']) {
      if (!html.includes(`data-block="${kind}"`)) throw new Error(`the HTML lacks the ${kind} block`);
    }
    if (html.includes('Loading this block')) throw new Error('a block was not in the first paint');
    console.log(`GET /studies/:id, full HTML: ${runs.map((r) => r.ms.toFixed(0)).join(', ')} ms (first, warming up: ${warm.ms.toFixed(0)} ms)`);

    // a <script noModule> (Next.js's legacy polyfills) is fetched only by a browser without ES
    // modules, never by one that runs this app's module chunks: reported, not counted
    const legacy = new Set([...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]).filter((tag) => /\bnoModule\b/i.test(tag)).map((tag) => /src="([^"]+)"/.exec(tag)?.[1]?.replace(/&amp;/g, '&')).filter((x): x is string => !!x));
    const assets = [...new Set([...html.matchAll(/(?:src|href)="(\/_next\/static\/[^"]+\.(?:js|css|woff2))"/g)].map((m) => m[1].replace(/&amp;/g, '&')))].filter((a) => !legacy.has(a));
    let legacyWire = 0;
    for (const a of legacy) legacyWire += (await get(base + a)).wireBytes;
    let jsWire = 0, jsRaw = 0, cssWire = 0, cssRaw = 0, fontWire = 0, n = 0;
    for (const a of assets) {
      const r = await get(base + a);
      if (r.status !== 200) throw new Error(`${a} answered ${r.status}`);
      n++;
      if (a.endsWith('.js')) { jsWire += r.wireBytes; jsRaw += r.body.length; } else if (a.endsWith('.css')) { cssWire += r.wireBytes; cssRaw += r.body.length; } else fontWire += r.wireBytes;
    }
    // fonts come from the stylesheet; a browser fetches only the faces the page uses, once per site
    let fontsAvailable = 0;
    for (const a of assets.filter((x) => x.endsWith('.css'))) {
      const css = (await get(base + a)).body.toString('utf8');
      for (const m of new Set([...css.matchAll(/url\(([^)]+\.woff2)\)/g)].map((x) => new URL(x[1], base + a).href))) fontsAvailable += (await get(m)).wireBytes;
    }
    const rsc = [...html.matchAll(/self\.__next_f\.push\(\[1,"((?:[^"\\]|\\.)*)"\]\)/g)].reduce((s, m) => s + m[1].length, 0);
    const kb = (b: number) => (b / 1024).toFixed(1);
    const wire = page.wireBytes + jsWire + cssWire + fontWire;
    console.log(`HTML ${kb(page.wireBytes)} KB sent (${kb(page.body.length)} KB uncompressed, of which ${kb(rsc)} KB inline RSC payload); ${n} assets: JS ${kb(jsWire)} KB sent (${kb(jsRaw)} KB), CSS ${kb(cssWire)} KB sent (${kb(cssRaw)} KB)${fontWire ? `, preloaded fonts ${kb(fontWire)} KB` : ''}; not counted: the ${kb(fontsAvailable)} KB of font files the stylesheet offers (a browser loads the faces in use, once per site)${legacy.size ? ` and ${kb(legacyWire)} KB of noModule polyfills (loaded only by browsers without ES modules)` : ''}`);
    console.log(`shipped: HTML + RSC payload + JS + CSS = ${kb(wire)} KB with gzip (${kb(page.body.length + jsRaw + cssRaw)} KB uncompressed); targets < 1 s and < 500 KB`);
    console.log(`study: ${(median / 1000).toFixed(3)} s, ${Math.round(wire / 1024)} KB`);
  } finally {
    if (created.session) await pool.query('DELETE FROM session WHERE id = $1', [created.session]).catch(() => undefined);
    if (created.study) await pool.query('DELETE FROM study WHERE id = $1', [created.study]).catch(() => undefined);
    if (created.rig) await pool.query('DELETE FROM fit WHERE rig_id = $1', [created.rig]).catch(() => undefined);
    if (created.file) await pool.query('DELETE FROM source_file WHERE id = $1', [created.file]).catch(() => undefined); // samples and overview cascade
    if (created.rig) await pool.query('DELETE FROM rig WHERE id = $1', [created.rig]).catch(() => undefined); // trials cascade
    await pool.end();
    await (await getOrm()).close(true);
  }
}

(process.env.EMBERLINE_BENCH_CHILD ? child() : parent()).catch((e) => {
  console.error(e);
  process.exit(1);
});
