/**
 * The solar half in Chromium, as its users walk it from the navigation, at a desktop and a phone
 * width (360 px, a small phone: common practice): the engineer opens the demo collector's rig,
 * reads its logged day (irradiance, air, water and flow, the steady periods shaded) and its
 * collector efficiency page, saves the ISO 9806 curve and asks for review; the reviewer finds the
 * fit under Fits and approves it; a viewer opens the measured-day study under Studies and
 * downloads it as XLSX. Screenshots of every step go to test-results/.
 */
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, screenshot, signInAs } from './support/browser';

const WIDTHS = [
  { name: 'desktop', viewport: { width: 1360, height: 900 } },
  { name: 'phone', viewport: { width: 360, height: 760 } },
] as const;

/** Follows a link of the top navigation ("Work areas"), as a person does from any page. */
async function navigate(p: Page, area: string) {
  const link = p.getByRole('navigation', { name: 'Work areas' }).getByRole('link', { name: area, exact: true });
  const href = await link.getAttribute('href');
  await link.click();
  await p.waitForURL(`**${href}`);
  await p.locator('main#main').first().waitFor();
}

/** The page lays out no wider than the viewport (nothing scrolls sideways on a phone). */
async function fitsTheWidth(p: Page) {
  const { doc, view } = await p.evaluate(() => ({ doc: document.documentElement.scrollWidth, view: window.innerWidth }));
  expect(doc).toBeLessThanOrEqual(view);
}

describe.each(WIDTHS)('the solar collector in Chromium ($name)', ({ name, viewport }) => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  let fitPath = '';
  const title = `Garage roof, July test (${name})`;
  beforeAll(async () => {
    b = await openBrowser({ viewport });
  });
  afterAll(async () => b?.close());

  test('the engineer reaches the collector rig from the navigation and reads its logged day with the steady periods', async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test', undefined, null);
    await navigate(p, 'Rigs');
    await p.getByRole('link', { name: 'Garage Roof Collector', exact: true }).click();
    const logs = p.getByRole('region', { name: 'Logged data' });
    await logs.waitFor();
    // the trials above the log are its steady periods
    await p.getByRole('navigation', { name: 'Pages' }).getByText(/^17\s+trials$/).waitFor();
    // the demo's logged day (fixtures/demo-solar.ts): 13 h at 10 s, seventeen steady periods found by the collector preset
    await expect(logs.innerText()).resolves.toMatch(/4,680\s+samples/);
    await expect(logs.getByRole('img', { name: 'Logged irradiance in the collector plane' }).count()).resolves.toBe(1);
    await expect(logs.getByRole('img', { name: 'Logged inlet and outlet temperatures' }).count()).resolves.toBe(1);
    await expect(logs.locator('table tbody tr').count()).resolves.toBe(17);
    await screenshot(p, `solar-1-rig-logged-day-${name}`);
    await fitsTheWidth(p);
  });

  test('the engineer opens the collector efficiency page, reads the ISO 9806 curve with the cloudy period left out, saves it and asks for review', async () => {
    const p = b.page;
    await p.getByRole('link', { name: 'Collector efficiency' }).first().click();
    await p.getByRole('heading', { name: /Efficiency curve/ }).waitFor();
    // the invented curve the day was made from has η0 0.72 (fixtures/demo-solar.ts): the fit gives it back
    await expect(p.getByRole('region', { name: 'Efficiency coefficients' }).innerText()).resolves.toMatch(/η₀ \(zero-loss efficiency\)\s+0\.7[12]/);
    // ISO 9806 steady-state limits: irradiance within ±50 W/m² of the period mean (DOMAIN.md §2.4)
    await expect(p.getByRole('region', { name: 'Trials left out' }).innerText()).resolves.toMatch(/irradiance varied by [\d.]+ W\/m² \(limit ±50\)/);
    expect(await p.locator('figure svg').count()).toBeGreaterThanOrEqual(3);
    await screenshot(p, `solar-2-collector-efficiency-${name}`);
    await fitsTheWidth(p);
    await p.getByLabel('Area basis').selectOption('aperture');
    await p.getByText(/Coefficients per aperture area/).waitFor();
    await p.getByLabel('Title').fill(title);
    await p.getByRole('button', { name: 'Save collector fit' }).click();
    await p.waitForURL(/\/fits\/[0-9a-f-]{36}$/);
    fitPath = new URL(p.url()).pathname;
    await p.getByText(/Coefficients per aperture area/).waitFor();
    await p.getByRole('button', { name: 'Ask for review' }).click();
    await p.getByText('In review').first().waitFor();
    await screenshot(p, `solar-3-collector-fit-in-review-${name}`);
    await fitsTheWidth(p);
  });

  test('the reviewer finds the collector fit under Fits, comments and approves it', async () => {
    const r = await openBrowser({ viewport });
    try {
      await signInAs(r.page, 'reviewer@cinder-hollow.test', undefined, null);
      await navigate(r.page, 'Fits');
      await expect(r.page.locator('tbody').innerText()).resolves.toMatch(/ISO 9806 steady state/);
      await r.page.getByRole('link', { name: title, exact: true }).click();
      await r.page.waitForURL(`**${fitPath}`);
      await r.page.getByRole('heading', { name: /Efficiency curve/ }).waitFor();
      await r.page.getByLabel('Comment').fill('Sixteen periods at four inlets; the cloudy one is rightly left out.');
      await r.page.getByRole('button', { name: 'Add comment' }).click();
      await r.page.getByText('rightly left out').first().waitFor();
      await r.page.getByRole('button', { name: 'Approve' }).click();
      await r.page.getByText('Approved').first().waitFor();
      await screenshot(r.page, `solar-4-collector-fit-approved-${name}`);
      await fitsTheWidth(r.page);
    } finally {
      await r.close();
    }
  });

  test('a viewer opens the measured-day study under Studies, reads it and downloads it as XLSX', async () => {
    const r = await openBrowser({ viewport });
    try {
      await signInAs(r.page, 'viewer@cinder-hollow.test', undefined, null);
      await navigate(r.page, 'Studies');
      await r.page.getByRole('link', { name: 'Garage roof collector: a measured day', exact: true }).click();
      await r.page.getByRole('heading', { name: 'The measured day against the forecast' }).waitFor();
      await expect(r.page.getByRole('link', { name: 'Edit', exact: true }).count()).resolves.toBe(0);
      await screenshot(r.page, `solar-5-measured-day-study-${name}`);
      await fitsTheWidth(r.page);
      const href = await r.page.getByRole('link', { name: 'Download XLSX' }).getAttribute('href');
      const res = await r.page.request.get(`${baseUrl}${href}`);
      expect(res.status()).toBe(200);
      expect(res.headers()['content-type']).toMatch(/spreadsheetml/);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load((await res.body()) as unknown as ArrayBuffer);
      const summary = wb.getWorksheet('Summary');
      const cells: string[] = [];
      summary?.eachRow((row) => cells.push(row.values ? String((row.values as unknown[]).join(' | ')) : ''));
      expect(cells.join('\n')).toMatch(/Measured end temperature/);
      expect(cells.join('\n')).toMatch(/Measured day verdict/);
      // the viewer reads the rig's logged day too, without the engineer's buttons
      await navigate(r.page, 'Rigs');
      await r.page.getByRole('link', { name: 'Garage Roof Collector', exact: true }).click();
      await r.page.getByRole('region', { name: 'Logged data' }).waitFor();
      await expect(r.page.getByRole('link', { name: 'Import a file' }).count()).resolves.toBe(0);
    } finally {
      await r.close();
    }
  });
});
