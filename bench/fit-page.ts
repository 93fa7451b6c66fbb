/**
 * `npm run bench -- fit-page [rounds]`: how fast the fit page answers in the browser on the demo
 * rig (Stovepipe Coil A) — the time from a model toggle, or from a new inlet temperature typed in,
 * to the next frame painted with every plot redrawn. Measured in headless Debian Chromium with
 * `performance.now()` in the page; logged, never asserted.
 *
 * 1. the private cluster with the demo lab (started when `npm start` is not running; DATABASE_URL
 *    wins) and a build of the current sources (skipped when unchanged);
 * 2. a `next start` of our own on a free port (no job worker);
 * 3. the demo engineer signs in, opens the rig's fit page and waits for its first answer;
 * 4. `rounds` times (default 5): switch the exponential model off and on again, and type a new
 *    inlet temperature. A toggle back to a model set already seen is answered from the page's own
 *    memory of recent answers; a new set and a new inlet go to the server (`POST …/analyze`).
 * The last line is `fit page: toggle p50 T ms (first ask F ms), inlet p50 I ms (target ≤ 100 ms)`.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { pathToFileURL } from 'node:url';
import { chromium, type Page } from 'playwright-core';

const root = path.resolve(__dirname, '..');
const rounds = Math.max(1, Number(process.argv[2] ?? 5));

async function main() {
  const lib = (name: string) => import(pathToFileURL(path.join(root, 'scripts', 'lib', name)).href);
  const { bootstrap } = (await lib('bootstrap.mjs')) as { bootstrap(o: { database: string; demo: boolean }): Promise<{ databaseUrl: string; stop(): void }> };
  const { buildIfChanged } = (await lib('build.mjs')) as { buildIfChanged(): boolean };
  const { freePort, waitForHealth } = (await lib('util.mjs')) as { freePort(): Promise<number>; waitForHealth(url: string, web: ChildProcess): Promise<void> };
  const db = await bootstrap({ database: 'emberline', demo: true });
  let web: ChildProcess | null = null;
  const profile = mkdtempSync(path.join(os.tmpdir(), 'emberline-fit-bench-'));
  try {
    buildIfChanged();
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    web = spawn(process.execPath, [path.join(root, 'scripts/serve.mjs'), '-H', '127.0.0.1', '-p', String(port)], {
      cwd: root,
      env: { ...process.env, DATABASE_URL: db.databaseUrl, SESSION_SECRET: randomBytes(32).toString('base64url'), EMBERLINE_JOB_WORKER: 'off', NODE_ENV: 'production', NEXT_TELEMETRY_DISABLED: '1', TZ: 'UTC', EMBERLINE_DEMO: 'true', APP_URL: base },
      stdio: ['ignore', 'ignore', 'inherit'],
    });
    await waitForHealth(`${base}/api/health`, web);
    const context = await chromium.launchPersistentContext(profile, {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      headless: true,
      viewport: { width: 1360, height: 900 },
      env: { ...process.env, HOME: profile, XDG_CONFIG_HOME: profile, XDG_CACHE_HOME: profile },
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost'],
    });
    try {
      const page = context.pages()[0] ?? (await context.newPage());
      await page.goto(`${base}/sign-in`);
      await page.getByLabel('E-mail').fill('engineer@cinder-hollow.test');
      await page.getByLabel('Password').fill('ember-demo-lab-2026');
      await page.getByRole('button', { name: 'Sign in' }).click();
      // signing in lands on the role's next-step page
      await page.waitForURL('**/start');
      // the demo rig's fit page, by the rig's id from the API (as the page itself reads it)
      // (in-page code as strings: tsx names functions with a helper the page does not have)
      const rigId = (await page.evaluate(`(async () => {
        const me = await (await fetch('/api/me')).json();
        const lab = me.labs.find((l) => l.slug === 'cinder-hollow') || me.labs[0];
        const rigs = (await (await fetch('/api/labs/' + lab.id + '/rigs')).json()).rigs;
        const rig = rigs.find((r) => r.name === 'Stovepipe Coil A');
        return rig ? rig.id : null;
      })()`)) as string | null;
      if (!rigId) throw new Error('the demo rig Stovepipe Coil A is not in the demo lab');
      await page.goto(`${base}/rigs/${rigId}/fit`);
      await page.getByRole('heading', { name: 'Model comparison' }).waitFor({ timeout: 120_000 });
      await page.locator('figure svg').nth(5).waitFor({ timeout: 120_000 });
      await report(page);
    } finally {
      await context.close();
    }
  } finally {
    rmSync(profile, { recursive: true, force: true });
    if (web && web.exitCode === null) {
      const exited = new Promise((res) => web!.once('exit', res));
      web.kill('SIGTERM');
      await exited;
    }
    db.stop();
  }
}

/**
 * Runs one change in the page and resolves with the milliseconds from it to the first frame
 * painted after every figure of the page has been drawn anew and the page is no longer busy.
 */
function timeChange(page: Page, change: { kind: 'toggle'; label: string } | { kind: 'inlet'; value: string }): Promise<number> {
  return page.evaluate(`(async (c) => {
    const figures = () => [...document.querySelectorAll('figure')].map((f) => f.querySelector('svg'));
    const before = figures();
    const t0 = performance.now();
    if (c.kind === 'toggle') {
      const label = [...document.querySelectorAll('label')].find((l) => l.textContent.trim() === c.label);
      const box = label && label.querySelector('input');
      if (!box) throw new Error('no checkbox ' + c.label);
      box.click();
    } else {
      const label = [...document.querySelectorAll('label')].find((l) => l.textContent.includes('Plan for an inlet'));
      const input = label && label.querySelector('input');
      if (!input) throw new Error('no inlet field');
      // as typing does: React reads the value through the native setter and an input event
      Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value').set.call(input, c.value);
      input.dispatchEvent(new Event('input', { bubbles: true }));
    }
    const frame = () => new Promise((r) => requestAnimationFrame(r));
    for (;;) {
      await frame();
      const now = figures();
      const busy = document.querySelector('[aria-busy="true"]') !== null;
      if (!busy && now.length >= 6 && now.every((svg, i) => svg && svg !== before[i])) {
        await frame(); // the frame that shows it
        return performance.now() - t0;
      }
      if (performance.now() - t0 > 30000) throw new Error('the page did not redraw within 30 s');
    }
  })(${JSON.stringify(change)})`) as Promise<number>;
}

async function report(page: Page) {
  const expLabel = 'Exponential toward the inlet';
  const firstAsk: number[] = [];
  const toggles: number[] = [];
  const inlets: number[] = [];
  for (let i = 0; i < rounds; i++) {
    // a new inlet each round: the server answers it (no answer kept for it yet)
    inlets.push(await timeChange(page, { kind: 'inlet', value: (18 + i * 0.7).toFixed(1) }));
    // off (a model set not asked for at this inlet: the server answers), then on again (kept in the page)
    firstAsk.push(await timeChange(page, { kind: 'toggle', label: expLabel }));
    toggles.push(await timeChange(page, { kind: 'toggle', label: expLabel }));
  }
  const p50 = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];
  const list = (a: number[]) => a.map((t) => t.toFixed(0)).join(', ');
  console.log(`new inlet (server answers): ${list(inlets)} ms`);
  console.log(`model toggle to a new set (server answers): ${list(firstAsk)} ms`);
  console.log(`model toggle back (answer kept in the page): ${list(toggles)} ms`);
  console.log(`machine load average: ${os.loadavg().map((l) => l.toFixed(2)).join(' ')}`);
  console.log(`fit page: toggle p50 ${p50(firstAsk).toFixed(0)} ms (back ${p50(toggles).toFixed(0)} ms), inlet p50 ${p50(inlets).toFixed(0)} ms (target ≤ 100 ms)`);
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
