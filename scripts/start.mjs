#!/usr/bin/env node
// `npm start`: packages, PostgreSQL (installed and started privately unless DATABASE_URL is set),
// migrations, demo data, local fakes of hosted services, a build when sources changed, then
// the web server on http://127.0.0.1:3000. Ctrl-C stops everything it started.
//
//   npm start -- --instances N [--worker]
// runs N web instances (each on a free loopback port, with its own job worker) behind a small
// loopback load balancer on the same address (scripts/lib/proxy.mjs), as a deployment of N
// instances would run; with --worker the web instances run no job worker and one worker-only
// process (scripts/worker.ts) takes the jobs.
import os from 'node:os';
import path from 'node:path';
import { root, portIsFree, freePort, spawn, fail, waitForHealth, stopper, runMain, watchWebServer, webProcesses } from './lib/util.mjs';
import { bootstrap } from './lib/bootstrap.mjs';
import { buildIfChanged } from './lib/build.mjs';
import { startFakes } from './lib/fakes.mjs';
import { startProxy } from './lib/proxy.mjs';

const port = Number(process.env.PORT ?? 3000);
const host = '127.0.0.1';
const t0 = Date.now();
const args = process.argv.slice(2);
const flag = (name) => {
  const i = args.indexOf(name);
  return i >= 0 ? (args[i + 1] ?? '') : undefined;
};
const instancesArg = flag('--instances');
const instances = instancesArg === undefined ? 1 : Number(instancesArg);
const separateWorker = args.includes('--worker');
// the private cluster allows 60 connections; each instance holds up to DATABASE_POOL_MAX for the
// ORM, 4 for imports and 3 for pg-boss
const MAX_INSTANCES = 6;

async function main() {
  if (!Number.isInteger(instances) || instances < 1 || instances > MAX_INSTANCES) fail(`--instances takes a whole number from 1 to ${MAX_INSTANCES} (got "${instancesArg}")`);
  if (separateWorker && instances === 1 && instancesArg === undefined) fail('--worker goes with --instances N (a separate job worker beside N web instances)');
  if (!(await portIsFree(port, host))) fail(`port ${port} on ${host} is already taken; stop whatever uses it or set PORT`);
  // Demo mode (demo lab, captured mail) is the default with the private cluster, never with DATABASE_URL.
  const demo = (process.env.EMBERLINE_DEMO ?? (process.env.DATABASE_URL ? 'false' : 'true')) === 'true';
  const db = await bootstrap({ database: 'emberline', demo });
  const { push, stopAll } = stopper(db.stop);
  try {
    const fakes = await startFakes();
    push(fakes.stop);
    buildIfChanged();
    const env = {
      ...process.env,
      ...fakes.env,
      DATABASE_URL: db.databaseUrl,
      NEXT_TELEMETRY_DISABLED: '1',
      NODE_ENV: 'production',
      EMBERLINE_DEMO: demo ? 'true' : 'false',
      // Links in e-mail and the same-origin check use this origin, never a request header.
      APP_URL: process.env.APP_URL ?? `http://${host}:${port}`,
    };
    const many = instances > 1 || separateWorker;
    /** resolves when every web server answers its health check (and the balancer is listening) */
    let up;
    if (!many) {
      const web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', host, '-p', String(port), '--processes', String(webProcesses())], {
        cwd: root,
        env,
        // piped (and passed on) so that its last lines can be shown if it dies
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      // when it ends by itself: why (exit code or signal) and what it printed last, then stop the rest
      const watch = watchWebServer(web, (status) => {
        stopAll();
        process.exit(status);
      });
      push(() => {
        watch.expectExit();
        if (web.exitCode === null && web.signalCode === null) web.kill('SIGTERM');
      });
      up = () => waitForHealth(`http://${host}:${port}/api/health`, web);
    } else {
      const ports = await Promise.all(Array.from({ length: instances }, () => freePort()));
      const webEnv = {
        ...env,
        // behind our balancer: one hop of X-Forwarded-For is believed (it adds the client's address)
        TRUST_PROXY_HOPS: '1',
        // one process per instance: the instances share the cores
        EMBERLINE_WEB_PROCESSES: '1',
        DATABASE_POOL_MAX: process.env.DATABASE_POOL_MAX ?? String(Math.max(2, Math.floor(48 / instances) - 7)),
        // the cores shared out between the instances' analysis threads (app/_lib/server/analysis-pool.ts)
        EMBERLINE_ANALYSIS_THREADS: process.env.EMBERLINE_ANALYSIS_THREADS ?? String(Math.max(1, Math.floor(os.availableParallelism() / instances))),
        ...(separateWorker ? { EMBERLINE_JOB_WORKER: 'off' } : {}),
      };
      const children = ports.map((p, i) => ({
        name: `web instance ${i + 1} (port ${p})`,
        child: spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', host, '-p', String(p)], { cwd: root, env: webEnv, stdio: ['ignore', 'ignore', 'inherit'] }),
      }));
      if (separateWorker) {
        // tsx runs the script in a child node: the condition goes through NODE_OPTIONS
        const worker = spawn(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'scripts/worker.ts')], {
          cwd: root,
          env: { ...env, NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --conditions=react-server`.trim() },
          stdio: ['ignore', 'inherit', 'inherit'],
        });
        children.push({ name: 'the job worker', child: worker });
      }
      let stopping = false;
      push(() => {
        stopping = true;
        for (const { child } of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
      });
      for (const { name, child } of children) {
        child.on('exit', (code, signal) => {
          if (stopping) return;
          console.error(`\x1b[31m✖ ${name} exited with ${signal ?? `code ${code}`}\x1b[0m`);
          // the balancer routes around an instance that has gone; the last one ends it all
          if (children.some((c) => c.child.exitCode === null && c.child.signalCode === null && c.name.startsWith('web'))) return;
          stopAll();
          process.exit(code || 1);
        });
      }
      up = async () => {
        await Promise.all(ports.map((p, i) => waitForHealth(`http://${host}:${p}/api/health`, children[i].child)));
        const proxy = await startProxy({ host, port, targets: ports.map((p) => ({ host, port: p })) });
        push(() => proxy.close());
        console.log(`${instances} web instance${instances > 1 ? 's' : ''} on ${ports.map((p) => `${host}:${p}`).join(', ')}${separateWorker ? ' (no job worker: a separate worker process takes the jobs)' : ', each with a job worker'}, behind a loopback load balancer on ${host}:${port}`);
      };
    }
    const shutdown = (signal) => {
      console.log(`\n${signal}: stopping the web server${many ? 's' : ''} and the database`);
      stopAll();
      process.exit(0);
    };
    process.on('SIGINT', () => shutdown('SIGINT'));
    process.on('SIGTERM', () => shutdown('SIGTERM'));
    await up();
    const { printDemoSignIns } = await import('./lib/demo-accounts.mjs');
    console.log(`\n\x1b[1mEmberline is ready at http://${host}:${port}\x1b[0m  (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
    if (env.EMBERLINE_DEMO === 'true') printDemoSignIns();
    console.log('Press Ctrl-C to stop.\n');
  } catch (e) {
    stopAll();
    throw e;
  }
}

runMain(main);
