/**
 * Headless Debian Chromium through playwright-core (never a downloaded browser). Outside host
 * lookups are mapped to NOTFOUND and the profile lives in a temporary folder, so a test run
 * never reaches beyond 127.0.0.1.
 */
import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const baseUrl = process.env.EMBERLINE_URL ?? 'http://127.0.0.1:3000';
export const resultsDir = path.resolve(__dirname, '..', '..', '..', 'test-results');

export async function openBrowser(opts: { viewport?: { width: number; height: number } } = {}): Promise<{
  context: BrowserContext;
  page: Page;
  close: () => Promise<void>;
  consoleErrors: string[];
}> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'emberline-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: opts.viewport ?? { width: 1280, height: 860 },
    env: { ...process.env, HOME: profile, XDG_CONFIG_HOME: profile, XDG_CACHE_HOME: profile },
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const consoleErrors: string[] = [];
  page.on('console', (m) => m.type() === 'error' && consoleErrors.push(m.text()));
  page.on('pageerror', (e) => consoleErrors.push(e.message));
  return {
    context,
    page,
    consoleErrors,
    close: async () => {
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

/** Signs in through the sign-in form, as a person does. */
export async function signInAs(page: Page, email: string, password = 'ember-demo-lab-2026') {
  await visit(page, '/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL('**/rigs');
}
