/**
 * A study with a cost sheet and a sensor log in Chromium: the engineer adds the blocks in the
 * editor and sees them appear without a reload (only the edited block fetches its data again);
 * "Download PNG" gives a real PNG (its signature bytes, PNG spec §5.2) on the study page and on
 * the share view; a signed-out reader switches the share view between SI and US units.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, resultsDir, screenshot, signInAs, visit } from './support/browser';
import { signedIn, type Client } from '../app/support/client';
import { importGeneratedLog } from '../app/support/sensor-logs';
import { getOrm } from '@/app/_lib/server/db';
import { pgPool } from '@/app/_lib/server/pg-pool';

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]; // PNG (ISO/IEC 15948) §5.2

/** Clicks "Download PNG" (or SVG) in the figure holding `title` and returns the file's bytes. */
async function download(page: Page, title: string, kind: 'PNG' | 'SVG' = 'PNG'): Promise<Buffer> {
  const figure = page.locator('figure', { hasText: title }).first();
  const [file] = await Promise.all([page.waitForEvent('download'), figure.getByRole('button', { name: `Download ${kind}` }).click()]);
  expect(file.suggestedFilename()).toMatch(kind === 'PNG' ? /\.png$/ : /\.svg$/);
  const bytes = readFileSync((await file.path())!);
  writeFileSync(path.join(resultsDir, `study-blocks-download-${title.toLowerCase().replace(/\W+/g, '-')}.${kind.toLowerCase()}`), bytes); // to look at
  return bytes;
}

/** Width and height from the PNG's IHDR chunk (bytes 16–23, big-endian). */
const pngSize = (b: Buffer) => ({ width: b.readUInt32BE(16), height: b.readUInt32BE(20) });

describe('study blocks in Chromium', () => {
  let eng: Awaited<ReturnType<typeof openBrowser>>;
  let api: Client;
  let studyUrl = '';
  let shareUrl = '';
  const rigName = `Pool loop rig ${Date.now().toString(36)}`;

  beforeAll(async () => {
    api = await signedIn('engineer@cinder-hollow.test');
    const lab = (await api.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
    const rig = (await api.post(`/api/labs/${lab.id}/rigs`, { name: rigName, heatSource: 'solar-collector' })).body.rig;
    await importGeneratedLog(lab.id, rig.id, 9_000, 21);
    const study = (await api.post(`/api/labs/${lab.id}/studies`, { title: `Pool loop costs ${rigName}` })).body.study;
    studyUrl = `/studies/${study.id}`;
    eng = await openBrowser({ viewport: { width: 1360, height: 900 } });
  }, 120_000);
  afterAll(async () => {
    await eng?.close();
    await pgPool().end();
    await (await getOrm()).close(true);
  });

  test('the engineer adds a forecast, a cost sheet and a sensor log; each shows up without a reload', async () => {
    const p = eng.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await visit(p, `${studyUrl}?edit=1`);
    const saved = () => p.getByRole('status').filter({ hasText: /Saved \(revision/ }).waitFor({ timeout: 15_000 });
    await p.getByRole('button', { name: '+ Forecast' }).click();
    await saved();
    await p.locator('[data-block="forecast"] figure svg').first().waitFor();
    await p.getByRole('button', { name: '+ Cost sheet' }).click();
    await saved();
    // prices are the user's: until one is given the block says what is missing
    await p.locator('[data-block="costs"]').getByText(/price: enter the price of propane per gal/).waitFor();
    await p.getByRole('button', { name: '+ Sensor log' }).click();
    await saved();
    await p.locator('[data-block="sensor-log"] figure svg').first().waitFor();

    // only the edited block fetches its data again
    const fetched: string[] = [];
    p.on('request', (r) => { if (r.url().includes('/blocks/')) fetched.push(r.url()); });
    const costId = (await p.locator('[data-block="costs"]').getAttribute('id'))!.replace('block-', '');
    await p.getByLabel('Price of block 4').fill('3');
    await p.getByLabel('Efficiency of block 4').fill('0.82');
    await saved();
    const sheet = p.getByTestId('cost-sheet');
    await sheet.waitFor();
    // propane $3.00/gal at η 0.82 → $4.00 per useful therm (DOMAIN.md §8 #16, EIA [24])
    await expect(sheet.getByRole('row', { name: /Per useful therm/ }).innerText()).resolves.toMatch(/4\.00 USD/);
    expect(fetched.length).toBeGreaterThan(0);
    expect(fetched.every((u) => u.endsWith(`/blocks/${costId}`))).toBe(true);
    await screenshot(p, 'study-blocks-1-editor');
  });

  test('the study page shows the cost sheet and the reduced sensor log; Download PNG gives a PNG', async () => {
    const p = eng.page;
    await visit(p, studyUrl);
    await p.locator('[data-block="sensor-log"] figure svg').first().waitFor();
    await expect(p.locator('[data-block="sensor-log"]').innerText()).resolves.toMatch(/9,000 samples/);
    await expect(p.locator('[data-block="costs"]').innerText()).resolves.toMatch(/carbon monoxide/);
    const png = await download(p, 'Logged inlet and outlet temperatures');
    expect([...png.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
    expect(pngSize(png)).toEqual({ width: 1440, height: 600 }); // the 720 × 300 CSS px plot at 2×
    const svg = (await download(p, 'Logged inlet and outlet temperatures', 'SVG')).toString('utf8');
    expect(svg).toMatch(/^<svg[^>]*aria-label="Logged inlet and outlet temperatures"/);
    expect(eng.consoleErrors).toEqual([]);
    await screenshot(p, 'study-blocks-2-page');
    await p.getByRole('button', { name: 'Create link' }).click();
    shareUrl = await p.getByTestId('share-url').innerText();
  });

  test('a signed-out reader switches the share view between SI and US units and downloads a PNG', async () => {
    const v = await openBrowser({ viewport: { width: 1280, height: 900 } });
    try {
      await visit(v.page, shareUrl);
      const units = v.page.getByRole('navigation', { name: 'Units' });
      await expect(units.getByRole('link', { name: /^SI/ }).getAttribute('aria-current')).resolves.toBe('true');
      await expect(v.page.locator('[data-block="forecast"]').innerText()).resolves.toMatch(/°C/);
      await expect(v.page.locator('[data-block="costs"]').innerText()).resolves.toMatch(/Per degree of the pool \(K\)/);
      expect(await v.page.getByText('pool-loop-log.csv').count()).toBe(0); // no raw files on the share view
      await screenshot(v.page, 'study-blocks-3-share-si');
      await units.getByRole('link', { name: /^US customary/ }).click();
      await v.page.waitForURL(/units=us/);
      await expect(units.getByRole('link', { name: /^US customary/ }).getAttribute('aria-current')).resolves.toBe('true');
      await expect(v.page.locator('[data-block="forecast"]').innerText()).resolves.toMatch(/°F/);
      await expect(v.page.locator('[data-block="costs"]').innerText()).resolves.toMatch(/Per degree of the pool \(°F\)/);
      await expect(v.page.locator('[data-block="sensor-log"] figure svg').first().innerHTML()).resolves.toMatch(/°F/);
      const png = await download(v.page, 'Logged flow');
      expect([...png.subarray(0, 8)]).toEqual(PNG_SIGNATURE);
      expect(v.consoleErrors).toEqual([]);
      await screenshot(v.page, 'study-blocks-4-share-us');
    } finally {
      await v.close();
    }
  });
});
