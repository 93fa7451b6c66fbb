#!/usr/bin/env node
// `npm test`: the same bootstrapping as `npm start` with a fresh test database, then unit,
// integration (real PostgreSQL) and browser tests (headless Debian Chromium) in one vitest run.
// Extra arguments go to vitest (e.g. `npm test -- --project unit`). Ends with the runner's
// summary and a plain "N passed, N failed" line; exits non-zero on any failure.
import path from 'node:path';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { root, step, spawn, freePort, waitForHealth, stopper, runMain, runVisible, watchWebServer } from './lib/util.mjs';
import { ensureNodeModules, ensureChromium } from './lib/install.mjs';
import { bootstrap } from './lib/bootstrap.mjs';
import { buildIfChanged } from './lib/build.mjs';
import { startFakes } from './lib/fakes.mjs';

async function main() {
  ensureNodeModules();
  step('lint (eslint: the Next.js and typescript-eslint rules)');
  runVisible(process.execPath, [path.join(root, 'node_modules/eslint/bin/eslint.js'), '--max-warnings', '0', '--report-unused-disable-directives', '.'], 'lint found problems (see above): fix them, then run the tests again', { cwd: root });
  const chromium = ensureChromium();
  const db = await bootstrap({ database: 'emberline_test', fresh: true, demo: true });
  const { push, stopAll } = stopper(db.stop);
  process.on('SIGINT', () => {
    stopAll();
    process.exit(130);
  });
  try {
    const fakes = await startFakes({ test: true });
    push(fakes.stop);
    buildIfChanged();
    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    const env = {
      ...process.env,
      ...fakes.env,
      DATABASE_URL: db.databaseUrl,
      NEXT_TELEMETRY_DISABLED: '1',
      EMBERLINE_DEMO: 'true',
      APP_URL: baseUrl,
      TZ: 'UTC',
    };
    // The test client stands in for a load balancer: its X-Forwarded-For is believed (one hop),
    // so that each test client has an address of its own for the per-address limits.
    const web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', '127.0.0.1', '-p', String(port)], {
      cwd: root,
      env: { ...env, NODE_ENV: 'production', TRUST_PROXY_HOPS: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    // a web server that dies during the run says why (the tests then fail on their own)
    const watch = watchWebServer(web, () => {}, { quiet: true });
    push(() => {
      watch.expectExit();
      if (web.exitCode === null && web.signalCode === null) web.kill('SIGTERM');
    });
    await waitForHealth(`${baseUrl}/api/health`, web);
    const resultsDir = path.join(root, 'test-results');
    mkdirSync(resultsDir, { recursive: true });
    const jsonFile = path.join(resultsDir, 'vitest.json');
    rmSync(jsonFile, { force: true });
    step('running the tests');
    const code = await new Promise((resolve) => {
      const vitest = spawn(
        process.execPath,
        [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${jsonFile}`, ...process.argv.slice(2)],
        { cwd: root, env: { ...env, NODE_ENV: 'test', EMBERLINE_URL: baseUrl, CHROMIUM_PATH: chromium }, stdio: 'inherit' },
      );
      vitest.on('exit', (c) => resolve(c ?? 1));
    });
    stopAll();
    if (existsSync(jsonFile)) {
      const r = JSON.parse(readFileSync(jsonFile, 'utf8'));
      const skipped = (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
      // a file whose setup failed has no failed test of its own: count it as one failure
      const brokenFiles = r.testResults.filter((f) => f.status === 'failed' && !f.assertionResults.some((a) => a.status === 'failed')).length;
      console.log(`\nemberline: ${r.numPassedTests} passed, ${r.numFailedTests + brokenFiles} failed, ${skipped} skipped`);
      if (r.numTotalTests === 0) {
        console.error('no test ran');
        process.exit(1);
      }
    }
    process.exit(code);
  } catch (e) {
    stopAll();
    throw e;
  }
}

runMain(main);
