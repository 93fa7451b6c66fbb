#!/usr/bin/env node
// `npm start`: packages, PostgreSQL (installed and started privately unless DATABASE_URL is set),
// migrations, demo data, local fakes of hosted services, a build when sources changed, then
// the web server on http://127.0.0.1:3000. Ctrl-C stops everything it started.
import path from 'node:path';
import { root, portIsFree, spawn, fail, waitForHealth, stopper, runMain, watchWebServer } from './lib/util.mjs';
import { bootstrap } from './lib/bootstrap.mjs';
import { buildIfChanged } from './lib/build.mjs';
import { startFakes } from './lib/fakes.mjs';

const port = Number(process.env.PORT ?? 3000);
const host = '127.0.0.1';
const t0 = Date.now();

async function main() {
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
    const web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', host, '-p', String(port)], {
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
    const shutdown = (signal) => {
      console.log(`\n${signal}: stopping the web server and the database`);
      stopAll();
      process.exit(0);
    };
    process.on('SIGINT', () => shutdown('SIGINT'));
    process.on('SIGTERM', () => shutdown('SIGTERM'));
    await waitForHealth(`http://${host}:${port}/api/health`, web);
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
