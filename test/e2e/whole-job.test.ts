/**
 * The whole job on the demo lab: the engineer imports a trial sheet, fits two models, saves a fit,
 * builds a study with a fit block and a forecast block and asks for review; the reviewer reads
 * the mail in the fake, comments and approves; a viewer opens the share link and downloads the
 * XLSX, whose numbers equal the API's. Screenshots of every step go to test-results/.
 */
import path from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { signedIn, waitForMailLink } from '../app/support/client';

const fixture = (name: string) => path.resolve(__dirname, '..', '..', 'fixtures', 'import', name);

describe('the whole job in Chromium', () => {
  let eng: Awaited<ReturnType<typeof openBrowser>>;
  let studyUrl = '';
  let shareUrl = '';
  let fitId = '';
  const rigName = `Whole job rig ${Date.now().toString(36)}`;
  beforeAll(async () => {
    eng = await openBrowser({ viewport: { width: 1360, height: 900 } });
  });
  afterAll(async () => eng?.close());

  test('the engineer imports a sheet, fits two models and saves a fit', async () => {
    const p = eng.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await p.getByRole('link', { name: 'New rig' }).click();
    await p.getByLabel('Name').fill(rigName);
    await p.getByLabel('Heat source').selectOption('propane-burner');
    await p.getByRole('button', { name: 'Create rig' }).click();
    await p.waitForURL(/\/rigs\/[0-9a-f-]{36}$/);
    await p.getByRole('link', { name: 'Import a file' }).click();
    await p.getByLabel('Trial file').setInputFiles(fixture('trials-metadata.csv'));
    await p.getByRole('heading', { name: 'Check' }).waitFor();
    await screenshot(p, 'job-1-import-check');
    await p.getByRole('button', { name: /^Import \d+ trials$/ }).click();
    await p.getByText(/trials imported\./).waitFor();
    await p.getByRole('link', { name: 'See the trials' }).click();
    await p.getByRole('link', { name: 'Fit models' }).click();
    await p.getByRole('heading', { name: 'Model comparison' }).waitFor();
    await screenshot(p, 'job-2-fit-two-models');
    await p.getByLabel('Title').fill('Burner loop, first session');
    await p.getByRole('button', { name: 'Save fit' }).click();
    await p.waitForURL(/\/fits\/[0-9a-f-]{36}$/);
    fitId = p.url().split('/fits/')[1];
    await screenshot(p, 'job-3-saved-fit');
  });

  test('the engineer builds a study with a fit block and a forecast block and asks for review', async () => {
    const p = eng.page;
    await visit(p, '/studies');
    await p.getByLabel('Title').fill(`Burner loop study ${rigName}`);
    await p.getByRole('button', { name: 'Create study' }).click();
    await p.getByRole('link', { name: `Burner loop study ${rigName}` }).click();
    await p.waitForURL(/\/studies\/[0-9a-f-]{36}/);
    studyUrl = new URL(p.url()).pathname;
    await p.getByRole('link', { name: 'Edit' }).click();
    await p.getByRole('button', { name: '+ Fit with plots' }).click();
    await p.getByLabel(/Saved fit of block 3/).selectOption(fitId);
    await p.getByRole('button', { name: '+ Forecast' }).click();
    await p.getByRole('status').filter({ hasText: /Saved \(revision/ }).waitFor({ timeout: 15_000 });
    await screenshot(p, 'job-4-study-editing');
    await visit(p, studyUrl);
    await p.locator('[data-block="fit"] svg').first().waitFor();
    await p.locator('[data-block="forecast"] svg').first().waitFor();
    await p.getByRole('button', { name: 'Ask for review' }).click();
    await p.getByText('In review').first().waitFor();
    await p.getByRole('button', { name: 'Create link' }).click();
    shareUrl = await p.getByTestId('share-url').innerText();
    await screenshot(p, 'job-5-study-in-review');
  });

  test('the reviewer follows the mail, comments and approves', async () => {
    const { link } = await waitForMailLink('reviewer@cinder-hollow.test', /Review requested: Burner loop study/);
    const r = await openBrowser({ viewport: { width: 1360, height: 900 } });
    try {
      await signInAs(r.page, 'reviewer@cinder-hollow.test');
      await visit(r.page, new URL(link).pathname);
      await r.page.getByLabel('Comment').fill('Heat ceiling is extrapolated; otherwise sound.');
      await r.page.getByRole('button', { name: 'Add comment' }).click();
      await r.page.getByText('Heat ceiling is extrapolated').first().waitFor();
      await r.page.getByRole('button', { name: 'Approve' }).click();
      await r.page.getByText('Approved').first().waitFor();
      await screenshot(r.page, 'job-6-approved');
    } finally {
      await r.close();
    }
    await waitForMailLink('engineer@cinder-hollow.test', /Approved: Burner loop study/);
    // …and an in-app notice
    await visit(eng.page, '/notices');
    await eng.page.getByText(/approved the study "Burner loop study/).first().waitFor();
    await screenshot(eng.page, 'job-6b-author-notice');
  });

  test('a viewer opens the share link and downloads the XLSX; its numbers equal the API’s', async () => {
    const v = await openBrowser({ viewport: { width: 1280, height: 900 } });
    try {
      await visit(v.page, shareUrl);
      await v.page.locator('[data-block="fit"] svg').first().waitFor();
      expect(await v.page.getByText('Demo Engineer').count()).toBe(0);
      await screenshot(v.page, 'job-7-shared-view');
      const [download] = await Promise.all([v.page.waitForEvent('download'), v.page.getByRole('link', { name: 'Download XLSX' }).click()]);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile((await download.path())!);
      const sheet = wb.getWorksheet('Fit')!;
      const header = (sheet.getRow((sheet.views[0] as { ySplit?: number }).ySplit ?? 1).values as unknown[]).map(String); // the frozen header row, under the safety notice
      const values = new Map<string, number>();
      sheet.eachRow((row, n) => {
        if (n > 1) values.set(String(row.getCell(header.indexOf('Parameter')).value), Number(row.getCell(header.indexOf('Estimate')).value));
      });
      const api = (await (await signedIn('viewer@cinder-hollow.test')).get(`/api/fits/${fitId}`)).body.fit.result.fit.params;
      expect(values.get('UA')).toBeCloseTo(api.UA.value, 8); // W/K in SI
      expect(values.get('Ts')).toBeCloseTo(api.Ts.value, 8); // °C
    } finally {
      await v.close();
    }
  });
});
