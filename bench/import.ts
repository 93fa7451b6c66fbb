/**
 * `npm run bench -- import [rows]`: the full sensor-log import against `psql \copy`, in one run.
 *
 * 1. writes a synthetic 1 Hz log (1,000,000 rows, about 55 MB) with `writeSensorLogCsv`;
 * 2. `psql \copy` of that CSV into a scratch table of the same columns (no indexes: the plain
 *    speed of PostgreSQL's COPY on this machine) — the baseline;
 * 3. our import path on the same file: read in chunks, parse, map to SI, validate every row, COPY
 *    into `sensor_sample` (with its primary key), segment (field preset) and write the
 *    trials, in one transaction — `importSensorLog` as the background worker runs it, reading a
 *    local file instead of object storage;
 * 4. for comparison, `psql \copy` of the rows we stored into a copy of `sensor_sample` with the same
 *    primary key and indexes (what the storage itself costs, without any parsing on our side);
 * 5. the first page of that rig's trials, queried as the trials table does (`listTrials`).
 * Prints the CPU time of Node and of the PostgreSQL cluster for the baseline and the import (the
 * machine's two cores are shared, so the load average is printed too), peak RSS of this process
 * (target < 512 MB) and the page time (target < 300 ms); the last line is the ratio of our rows/s
 * to psql's into the plain scratch table (target >= 0.5).
 * Everything it creates is removed (and the deleted samples vacuumed). TRACE=1 prints the rows
 * written every second and when each phase of the import ends.
 *
 * Connection: DATABASE_URL, or the private cluster of `npm start` (.data/pg-password, port
 * EMBERLINE_PG_PORT or 54329, database emberline) with its migrations applied.
 */
import { spawnSync } from 'node:child_process';
import { createReadStream, existsSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const root = path.resolve(__dirname, '..');

// app/_lib modules start with `import 'server-only'`, which resolves to an empty module only
// under the react-server condition (as inside Next): run ourselves again with it.
if (!process.env.EMBERLINE_BENCH_CHILD) {
  if (!process.env.DATABASE_URL) {
    const pw = path.join(root, '.data', 'pg-password');
    if (!existsSync(pw)) {
      console.error('import bench: set DATABASE_URL or run `npm start` once so that the private cluster exists');
      process.exit(2);
    }
    process.env.DATABASE_URL = `postgres://emberline:${encodeURIComponent(readFileSync(pw, 'utf8').trim())}@127.0.0.1:${process.env.EMBERLINE_PG_PORT ?? 54329}/emberline`;
  }
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), __filename, ...process.argv.slice(2)], {
    stdio: 'inherit',
    env: { ...process.env, EMBERLINE_BENCH_CHILD: '1', TZ: 'UTC', NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --conditions=react-server`.trim() },
  });
  process.exit(r.status ?? 1);
}

/**
 * CPU time (ms) of the private cluster's processes (postmaster and its children, from /proc; the
 * children that ended count through the postmaster's), or null when it cannot be read.
 */
function clusterCpuMs(): number | null {
  try {
    const postmaster = Number(readFileSync(path.join(root, '.data', 'pg', 'postmaster.pid'), 'utf8').split('\n')[0]);
    const tick = 10; // ms per clock tick (USER_HZ = 100 on Linux)
    let total = 0;
    for (const d of readdirSync('/proc')) {
      if (!/^\d+$/.test(d)) continue;
      let stat: string;
      try { stat = readFileSync(`/proc/${d}/stat`, 'utf8'); } catch { continue; }
      const f = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      // utime + stime, and for the postmaster also its reaped children's (connections that ended)
      if (Number(d) === postmaster) total += (Number(f[11]) + Number(f[12]) + Number(f[13]) + Number(f[14])) * tick;
      else if (Number(f[1]) === postmaster) total += (Number(f[11]) + Number(f[12])) * tick;
    }
    return total;
  } catch {
    return null;
  }
}

const cpuMs = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
const fmtCpu = (ms: number | null) => (ms === null ? 'n/a' : `${(ms / 1000).toFixed(2)} s`);

async function main() {
  const { writeSensorLogCsv, SENSOR_LOG_MAPPING } = await import('../test/support/sensor-log-file');
  const { getEm, getOrm } = await import('@/app/_lib/server/db');
  const { importSensorLog, logImportInput } = await import('@/app/_lib/imports/sensor-import');
  const { pgPool } = await import('@/app/_lib/server/pg-pool');
  const { listTrials, listQuery } = await import('@/app/_lib/rigs/trials');
  const { Lab, Rig, SourceFile } = await import('@/entities');

  const rows = Number(process.argv[2] ?? 1_000_000);
  const url = process.env.DATABASE_URL!;
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-import-bench-'));
  const file = path.join(dir, 'sensor-log.csv');
  const scratch = `bench_copy_${process.pid}`;
  const pool = pgPool();
  const em = await getEm();
  let rigId: string | null = null;
  let fileId: string | null = null;
  try {
    const bytes = await writeSensorLogCsv(file, { rows });
    console.log(`generated ${rows.toLocaleString('en')} rows, ${(bytes / 1e6).toFixed(1)} MB`);

    // baseline: psql \copy of the same rows
    await pool.query(`CREATE TABLE ${scratch} (taken_at timestamp, inlet_c double precision, outlet_c double precision, flow_l_per_min double precision, ambient_c double precision, pump_w integer, status text)`);
    const pgCpu0 = clusterCpuMs();
    const p0 = performance.now();
    const psql = spawnSync('/usr/bin/psql', [url, '-v', 'ON_ERROR_STOP=1', '-q', '-c', `\\copy ${scratch} FROM '${file}' WITH (FORMAT csv, HEADER true)`], { encoding: 'utf8' });
    const psqlS = (performance.now() - p0) / 1000;
    const pgCpuBaseline = pgCpu0 === null ? null : clusterCpuMs()! - pgCpu0;
    if (psql.status !== 0) throw new Error(`psql \\copy failed: ${psql.stderr}`);
    const copied = Number((await pool.query(`SELECT count(*) AS n FROM ${scratch}`)).rows[0].n);
    const psqlRate = copied / psqlS;
    console.log(`psql \\copy: ${copied.toLocaleString('en')} rows in ${psqlS.toFixed(2)} s = ${Math.round(psqlRate).toLocaleString('en')} rows/s (PostgreSQL CPU ${fmtCpu(pgCpuBaseline)})`);

    // our path
    const [lab] = await em.find(Lab, {}, { orderBy: { createdAt: 'asc' }, limit: 1 });
    if (!lab) throw new Error('the database has no lab: run `npm start` once to load the demo lab');
    const rig = em.create(Rig, { lab, name: `import bench ${process.pid} ${Date.now()}`, heatSource: 'other' });
    const source = em.create(SourceFile, { lab, rig, filename: 'sensor-log.csv', contentType: 'text/csv', sizeBytes: bytes, sha256: `bench${process.pid}${Date.now()}`.padEnd(64, '0').slice(0, 64), storageKey: 'bench/local-file' });
    await em.flush();
    rigId = rig.id;
    fileId = source.id;
    const input = logImportInput.parse({
      preset: 'field',
      mapping: SENSOR_LOG_MAPPING,
    });
    const rssBefore = process.memoryUsage().rss;
    const pgCpu1 = clusterCpuMs();
    const nodeCpu0 = cpuMs();
    const i0 = performance.now();
    const result = await importSensorLog(
      { fileId: source.id, rigId: rig.id, labId: lab.id, filename: 'sensor-log.csv', storageKey: source.storageKey, sizeBytes: bytes, uploadedAt: new Date() },
      input,
      {
        open: async () => createReadStream(file, { highWaterMark: 1 << 16 }),
        ...(process.env.TRACE ? {
          progressMs: 1000,
          onProgress: (p: { rowsDone: number }) => void console.log(`${((performance.now() - i0) / 1000).toFixed(2)} s ${p.rowsDone} rows`),
          onPhase: (phase: string) => console.log(`${((performance.now() - i0) / 1000).toFixed(2)} s ${phase}`),
        } : {}),
      },
    );
    const importS = (performance.now() - i0) / 1000;
    const nodeCpu = cpuMs() - nodeCpu0;
    const pgCpuImport = pgCpu1 === null ? null : clusterCpuMs()! - pgCpu1;
    const peakMB = process.resourceUsage().maxRSS / 1024;
    const rate = result.samples / importS;
    console.log(`import (parse, map, validate, COPY, segment, trials; one transaction): ${result.samples.toLocaleString('en')} samples, ${result.trials} trials in ${importS.toFixed(2)} s = ${Math.round(rate).toLocaleString('en')} rows/s`);
    console.log(`CPU of the import: Node ${fmtCpu(nodeCpu)}, PostgreSQL ${fmtCpu(pgCpuImport)}; machine load ${os.loadavg().map((x) => x.toFixed(1)).join(' ')} (2 cores, shared)`);
    console.log(`memory: rss ${(rssBefore / 1048576).toFixed(0)} MB before the import, peak RSS ${peakMB.toFixed(0)} MB (target < 512 MB)`);

    // the same rows once more with psql, into a copy of sensor_sample with its keys and indexes
    const rowsFile = path.join(dir, 'rows.txt');
    const exp = spawnSync('/usr/bin/psql', [url, '-v', 'ON_ERROR_STOP=1', '-q', '-c', `\\copy (SELECT * FROM sensor_sample WHERE source_file_id = '${source.id}' ORDER BY line) TO '${rowsFile}'`], { encoding: 'utf8' });
    if (exp.status !== 0) throw new Error(`psql export failed: ${exp.stderr}`);
    await pool.query(`CREATE TABLE ${scratch}_keys (LIKE sensor_sample INCLUDING ALL)`);
    const k0 = performance.now();
    const keyed = spawnSync('/usr/bin/psql', [url, '-v', 'ON_ERROR_STOP=1', '-q', '-c', `\\copy ${scratch}_keys FROM '${rowsFile}'`], { encoding: 'utf8' });
    const keyedS = (performance.now() - k0) / 1000;
    if (keyed.status !== 0) throw new Error(`psql \\copy failed: ${keyed.stderr}`);
    console.log(`psql \\copy of the stored rows into a copy of sensor_sample (its keys and indexes): ${keyedS.toFixed(2)} s = ${Math.round(result.samples / keyedS).toLocaleString('en')} rows/s — our import reaches ${(rate / (result.samples / keyedS)).toFixed(2)} of that`);

    const pageEm = await getEm();
    const pageRig = await pageEm.findOneOrFail(Rig, { id: rig.id });
    const q0 = performance.now();
    const page = await listTrials(pageEm, pageRig, listQuery.parse({}));
    const pageMs = performance.now() - q0;
    console.log(`first page of the rig's trials: ${page.rows.length} of ${page.total} in ${pageMs.toFixed(1)} ms (target < 300 ms)`);
    console.log(`import ratio: ${(rate / psqlRate).toFixed(2)} (target >= 0.5)`);
  } finally {
    await pool.query(`DROP TABLE IF EXISTS ${scratch}, ${scratch}_keys`).catch(() => undefined);
    if (fileId) await pool.query('DELETE FROM source_file WHERE id = $1', [fileId]).catch(() => undefined);
    if (rigId) await pool.query('DELETE FROM rig WHERE id = $1', [rigId]).catch(() => undefined);
    // the deleted samples would otherwise be vacuumed during the next run's import
    await pool.query('VACUUM sensor_sample').catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
    await pool.end();
    await (await getOrm()).close(true);
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
