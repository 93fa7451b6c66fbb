/**
 * Hot temperatures in Chromium, as an engineer and as a viewer: every screen that shows a
 * temperature at or above a caution threshold marks the value in words (a badge and text for
 * screen readers, not colour alone) and lists one caution per hazard beside the table or plot
 * (a place's highest band only, not the lower bands under it).
 * Thresholds (DOMAIN.md §5, §3.7): 40 °C spa limit (CPSC 79-071, UL 1563), 49 °C scald and
 * 60 °C burns in seconds (scald-time table [39]), 95 °C steam (common practice). The demo rig
 * "Stovepipe Coil A" has trials from about 35 to 80 °C (fixtures/README.md).
 * Screenshots: test-results/safety-*.png.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, resultsDir, screenshot, signInAs, visit } from './support/browser';
import { signedIn, type Client } from '../app/support/client';
import { importGeneratedLog } from '../app/support/sensor-logs';
import { getOrm } from '@/app/_lib/server/db';
import { pgPool } from '@/app/_lib/server/pg-pool';

/** The words of the marks and cautions, from analysis/safety (hazardBand, temperatureCautions). */
const SECONDS = 'at or above 60 °C: burns in seconds';
const SECONDS_US = 'at or above 140 °F: burns in seconds';

/** The screen-reader text of every marked value on the page. */
async function markTexts(page: Page): Promise<string[]> {
  return page.locator('[data-hazard] .sr-only').allInnerTexts();
}

/** The words only the lower bands' cautions use (analysis/safety temperatureCautions). */
const SCALD_WORDS = /can scald/, SPA_WORDS = /spas and tubs/, SECONDS_WORDS = /burns skin in seconds/;

/**
 * Checks a caution list by its accessible name: it exists, names each hazard once in words, and
 * shows none of the lower bands a place's highest band stands for (`absent`).
 */
async function expectCautions(page: Page, name: string | RegExp, want: RegExp[], absent: RegExp[] = []) {
  const list = page.getByRole('list', { name });
  await list.first().waitFor();
  const items = await list.first().getByRole('listitem').allInnerTexts();
  for (const re of want) expect(items.filter((t) => re.test(t)), `${name}: ${re}`).toHaveLength(1);
  for (const re of absent) expect(items.filter((t) => re.test(t)), `${name}: no ${re}`).toEqual([]);
  return items;
}

describe('safety marks on hot temperatures in Chromium', () => {
  let api: Client;
  let rigId = '';
  let studyUrl = '';
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-safety-'));
  const hotCsv = path.join(dir, `hot-trials-${Date.now().toString(36)}.csv`);

  beforeAll(async () => {
    api = await signedIn('engineer@cinder-hollow.test');
    const lab = (await api.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
    const demo = (await api.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
    rigId = demo.id;
    const ids = (await api.get(`/api/rigs/${demo.id}/trials?pageSize=500`)).body.trials.filter((t: { origin: string }) => t.origin === 'demo').map((t: { id: string }) => t.id);
    const fit = (await api.post(`/api/labs/${lab.id}/fits`, { rigId: demo.id, title: `safety fit ${Date.now()}`, model: 'coil', trialIds: ids })).body.fit;
    const logRig = (await api.post(`/api/labs/${lab.id}/rigs`, { name: `Safety log rig ${Date.now().toString(36)}`, heatSource: 'solar-collector' })).body.rig;
    const { fileId } = await importGeneratedLog(lab.id, logRig.id, 9_000, 31); // 1200-s plateaus of 30 + 3k °C (k < 7): up to 48 °C
    const created = (await api.post(`/api/labs/${lab.id}/studies`, { title: `Hot coil study ${Date.now().toString(36)}` })).body.study;
    const put = await api.request('PUT', `/api/studies/${created.id}`, {
      title: created.title, baseRevision: created.revision,
      blocks: [
        { id: 'trials', kind: 'trials', data: { fitId: fit.id } },
        { id: 'fit', kind: 'fit', data: { fitId: fit.id } },
        { id: 'log', kind: 'sensor-log', data: { sourceFileId: fileId } },
      ],
    });
    expect(put.status, put.text).toBe(200);
    studyUrl = `/studies/${created.id}`;
    // an invented sheet of five bucket trials, the hottest near boiling
    writeFileSync(hotCsv, [
      '"time","inlet (°C)","outlet (°C)","flow (L/min)","notes"',
      '"2026-08-01 09:00",16,38.5,12,"cool"',
      '"2026-08-01 09:20",16.2,44,9,"spa range"',
      '"2026-08-01 09:40",16.3,53,6,"scald range"',
      '"2026-08-01 10:00",16.4,71.5,3.5,"burns in seconds"',
      '"2026-08-01 10:20",16.5,96,1.5,"near boiling"',
    ].join('\n'));
  }, 180_000);
  afterAll(async () => {
    rmSync(dir, { recursive: true, force: true });
    await pgPool().end();
    await (await getOrm()).close(true);
  });

  test('as an engineer: the trials table, the trials page, the import check and the study', async () => {
    const b = await openBrowser({ viewport: { width: 1360, height: 900 } });
    try {
      const p = b.page;
      await signInAs(p, 'engineer@cinder-hollow.test');

      // the rig page's trials table: each hot value marked in words, the cautions beside the table
      await visit(p, `/rigs/${rigId}`);
      await p.locator('[data-hazard]').first().waitFor();
      const marks = await markTexts(p);
      expect(marks).toContain(`(${SECONDS})`);
      expect(marks).toContain('(at or above 49 °C: can scald)');
      expect(marks).toContain('(at or above the 40 °C spa limit)');
      expect(await p.locator('[data-hazard] [title]').first().getAttribute('title')).toMatch(/^at or above/); // the tooltip is extra
      // one caution per hazard and place, its highest band: the outlet burns in seconds (not also scald and spa)
      await expectCautions(p, 'Cautions for these trials', [/^Danger: The outlet water reaches .*burns skin in seconds/], [SCALD_WORDS, SPA_WORDS]);
      await p.getByRole('table').first().scrollIntoViewIfNeeded();
      await screenshot(p, 'safety-trials-table');

      // the lab's trials page shows the same table
      await visit(p, `/trials?rig=${rigId}`);
      await p.locator('[data-hazard]').first().waitFor();
      await expectCautions(p, 'Cautions for these trials', [/burns skin in seconds/]);

      // import: the check step marks the converted rows and names the hottest row of the file
      await visit(p, `/rigs/${rigId}/import`);
      await p.getByLabel('Trial file').setInputFiles(hotCsv);
      await p.getByRole('heading', { name: 'Check' }).waitFor();
      await p.getByText('Hottest outlet in the file:').waitFor();
      const check = p.locator('section', { has: p.getByRole('heading', { name: 'Check' }) });
      const checkMarks = await check.locator('[data-hazard] .sr-only').allInnerTexts();
      expect(checkMarks).toEqual(expect.arrayContaining([
        '(at or above the 40 °C spa limit)', '(at or above 49 °C: can scald)', `(${SECONDS})`,
        '(at or above 95 °C: near boiling, flashes to steam when released)',
      ]));
      expect(await check.getByText(/Hottest outlet in the file: 96\.0 °C/).count()).toBe(1);
      // near boiling (steam) and the burns are two hazards: both shown, the lower contact bands not
      await expectCautions(p, 'Cautions for this file', [/^Danger: The outlet water reaches 96\.0 °C .*close to boiling/, SECONDS_WORDS], [SCALD_WORDS, SPA_WORDS]);
      await check.scrollIntoViewIfNeeded();
      await screenshot(p, 'safety-import-check');

      // the study: the trial table and the fit plot carry marks and cautions, and so does the sensor log
      await visit(p, studyUrl);
      const trials = p.locator('[data-block="trials"]');
      await trials.locator('[data-hazard]').first().waitFor();
      expect(await trials.locator('[data-hazard] .sr-only').allInnerTexts()).toContain(`(${SECONDS})`);
      await expectCautions(p, 'Cautions for these trials', [/burns skin in seconds/]);
      await expectCautions(p, /^Cautions for outlet temperature against flow/, [/^Danger: The outlet water reaches .*burns skin in seconds/], [SCALD_WORDS, SPA_WORDS]);
      const log = p.locator('[data-block="sensor-log"]');
      expect(await log.locator('[data-hazard] .sr-only').allInnerTexts()).toContain('(at or above the 40 °C spa limit)');
      await expectCautions(p, 'Cautions for these segments', [/^Warning: The outlet water reaches 4\d\.\d °C .*spas and tubs/]);
      await expectCautions(p, 'Cautions for logged inlet and outlet temperatures', [/^Warning: The logged outlet water reaches .*spas and tubs/]);
      await screenshot(p, 'safety-study-trials');
      await trials.screenshot({ path: path.join(resultsDir, 'safety-study-trials-block.png') });
      await p.locator('[data-block="fit"] figure').first().screenshot({ path: path.join(resultsDir, 'safety-study-fit-plot.png') });
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });

  test('as a viewer in US units: the same marks and cautions, in °F', async () => {
    const viewer = await signedIn('viewer@cinder-hollow.test');
    await viewer.request('PATCH', '/api/me', { unitSystem: 'us' });
    const b = await openBrowser({ viewport: { width: 1360, height: 900 } });
    try {
      const p = b.page;
      await signInAs(p, 'viewer@cinder-hollow.test');
      await visit(p, `/rigs/${rigId}`);
      await p.locator('[data-hazard]').first().waitFor();
      expect(await markTexts(p)).toContain(`(${SECONDS_US})`);
      expect(await markTexts(p)).toContain('(at or above the 104 °F spa limit)');
      await expectCautions(p, 'Cautions for these trials', [/^Danger: The outlet water reaches 175\.\d °F \(79\.5 °C\): at or above 140 °F \(60 °C\) water burns skin in seconds/]);
      await visit(p, studyUrl);
      const trials = p.locator('[data-block="trials"]');
      await trials.locator('[data-hazard]').first().waitFor();
      expect(await trials.locator('[data-hazard] .sr-only').allInnerTexts()).toContain(`(${SECONDS_US})`);
      await expectCautions(p, 'Cautions for these trials', [/burns skin in seconds/]);
      await screenshot(p, 'safety-study-trials-viewer-us');
      await trials.screenshot({ path: path.join(resultsDir, 'safety-study-trials-block-viewer-us.png') });
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await viewer.request('PATCH', '/api/me', { unitSystem: 'si' });
      await b.close();
    }
  });

  test('signed out: the landing sample carries its cautions, and the standing notice names steam, the relief valve and the pump', async () => {
    const b = await openBrowser();
    try {
      const p = b.page;
      await visit(p, '/');
      await expectCautions(p, 'Cautions for the sample', [/^Danger: The sample outlet water reaches .*burns skin in seconds/]);
      const notice = await p.getByRole('complementary', { name: 'Safety notice' }).innerText();
      expect(notice).toMatch(/water in a closed coil boils, builds pressure and bursts out as steam/);
      expect(notice).toMatch(/relief valve .* on any heated loop that can be closed/);
      expect(notice).toMatch(/Start the pump before the fire is lit and keep it running until the coil is cold/);
      await screenshot(p, 'safety-landing');
    } finally {
      await b.close();
    }
  });
});
