/**
 * Headless Debian Chromium through playwright-core (never a downloaded browser). Outside host
 * lookups are mapped to NOTFOUND and the profile lives in a temporary folder, so a test run
 * never reaches beyond 127.0.0.1.
 *
 * Every console error, uncaught page error and Content-Security-Policy violation (the
 * `securitypolicyviolation` event, reported from each page) fails the test during which it
 * appeared (an afterEach hook of the file); a test that provokes an error on purpose names it
 * with `expectConsoleError`.
 */
import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterEach } from 'vitest';
import { newClientAddress } from '../../app/support/client';

interface Watch {
  problems: string[];
  expected: RegExp[];
}
const watched = new Set<Watch>();

afterEach(() => {
  const found = [...watched].flatMap((w) => w.problems.splice(0));
  for (const w of watched) w.expected = [];
  if (found.length) throw new Error(`the browser reported ${found.length} problem(s):\n${found.join('\n')}`);
});

export const baseUrl = process.env.EMBERLINE_URL ?? 'http://127.0.0.1:3000';
export const resultsDir = path.resolve(__dirname, '..', '..', '..', 'test-results');

export async function openBrowser(opts: { viewport?: { width: number; height: number } } = {}): Promise<{
  context: BrowserContext;
  page: Page;
  close: () => Promise<void>;
  consoleErrors: string[];
  /** Content-Security-Policy violations reported by the pages, as "directive: blocked URI (source)". */
  cspViolations: string[];
  /** Lets console errors matching `pattern` pass until the end of the current test (for errors a test provokes). */
  expectConsoleError: (pattern: RegExp) => void;
}> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'emberline-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: opts.viewport ?? { width: 1280, height: 860 },
    // each browser is a person at an address of their own, as each API test client is (the test
    // server believes one forwarded hop): sign-in pacing per address then counts one person's tries
    extraHTTPHeaders: { 'X-Forwarded-For': newClientAddress() },
    env: { ...process.env, HOME: profile, XDG_CONFIG_HOME: profile, XDG_CACHE_HOME: profile },
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const consoleErrors: string[] = [];
  const cspViolations: string[] = [];
  const watch: Watch = { problems: [], expected: [] };
  watched.add(watch);
  const problem = (text: string) => {
    if (!watch.expected.some((p) => p.test(text))) watch.problems.push(text);
  };
  // Playwright's init scripts and bindings run outside the page's policy, so they report what it blocks.
  await context.exposeBinding('__emberlineCspViolation', ({ page: p }, v: string) => {
    const text = `${v} on ${p.url()}`;
    cspViolations.push(text);
    watch.problems.push(`CSP violation: ${text}`);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      const report = (window as unknown as { __emberlineCspViolation: (v: string) => void }).__emberlineCspViolation;
      report(`${e.effectiveDirective}: ${e.blockedURI || 'inline'}${e.sourceFile ? ` (${e.sourceFile}:${e.lineNumber})` : ''}${e.sample ? ` "${e.sample}"` : ''}`);
    });
  });
  const wire = (p: Page) => {
    p.on('console', (m) => {
      if (m.type() !== 'error') return;
      consoleErrors.push(m.text());
      problem(`console error: ${m.text()}`);
    });
    p.on('pageerror', (e) => {
      consoleErrors.push(e.message);
      problem(`page error: ${e.message}`);
    });
  };
  for (const p of context.pages()) wire(p);
  context.on('page', wire);
  return {
    context,
    page,
    consoleErrors,
    cspViolations,
    expectConsoleError: (pattern) => watch.expected.push(pattern),
    close: async () => {
      watched.delete(watch);
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Saves a full-page screenshot under test-results/ and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(resultsDir, { recursive: true });
  const file = path.join(resultsDir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Opens a page and waits until its streamed content (the <main> landmark) has arrived. */
export async function visit(page: Page, url: string) {
  const res = await page.goto(url.startsWith('http') ? url : baseUrl + url);
  await page.locator('main#main').first().waitFor();
  return res;
}

/**
 * Signs in through the sign-in form, as a person does, and lands on the page of what the role does
 * next (/start); then opens `then` (default the rigs page, where most walk-throughs begin; null to stay).
 */
export async function signInAs(page: Page, email: string, password = 'ember-demo-lab-2026', then: string | null = '/rigs') {
  await visit(page, '/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/start');
  await page.locator('main#main').first().waitFor();
  if (then) await visit(page, then);
}
