/** The solar collector in Chromium: the engineer fits the demo collector's curve and saves it; a viewer reads it and exports it. */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { baseUrl, openBrowser, screenshot, signInAs, visit } from './support/browser';

describe('collector efficiency page in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  let fitUrl = '';
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1360, height: 900 } });
  });
  afterAll(async () => b?.close());

  test('the engineer opens the demo collector, reads the ISO 9806 curve with the cloudy period left out, and saves it', async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await visit(p, '/rigs');
    await p.getByRole('link', { name: 'Garage Roof Collector' }).click();
    await p.getByRole('link', { name: 'Collector efficiency' }).click();
    await p.getByRole('heading', { name: /Efficiency curve/ }).waitFor();
    // the demo's invented curve (fixtures/demo-solar.ts) is η0 0.72: the fit gives it back within its interval
    await expect(p.getByRole('region', { name: 'Efficiency coefficients' }).innerText()).resolves.toMatch(/η₀ \(zero-loss efficiency\)\s+0\.72/);
    await expect(p.getByRole('region', { name: 'Trials left out' }).innerText()).resolves.toMatch(/irradiance varied by [\d.]+ W\/m² \(limit ±50\)/);
    expect(await p.locator('figure svg').count()).toBeGreaterThanOrEqual(3);
    await screenshot(p, 'collector-efficiency');
    await p.getByLabel('Area basis').selectOption('aperture');
    await p.getByText(/Coefficients per aperture area/).waitFor();
    await p.getByLabel('Title').fill('Garage roof, July test');
    await p.getByRole('button', { name: 'Save collector fit' }).click();
    await p.waitForURL(/\/fits\/[0-9a-f-]{36}$/);
    fitUrl = new URL(p.url()).pathname;
    await p.getByText(/Coefficients per aperture area/).waitFor();
    await screenshot(p, 'collector-fit-saved');
  });

  test('a viewer reads the saved collector fit and exports it', async () => {
    const r = await openBrowser({ viewport: { width: 1360, height: 900 } });
    try {
      await signInAs(r.page, 'viewer@cinder-hollow.test');
      await visit(r.page, fitUrl);
      await r.page.getByRole('heading', { name: /Efficiency curve/ }).waitFor();
      await expect(r.page.getByRole('button', { name: 'Save collector fit' }).count()).resolves.toBe(0);
      const href = await r.page.getByRole('link', { name: 'Download XLSX' }).getAttribute('href');
      const xlsx = await r.page.request.get(`${baseUrl}${href}`);
      expect(xlsx.status()).toBe(200);
      expect(xlsx.headers()['content-type']).toMatch(/spreadsheetml/);
      const csv = await r.page.request.get(`${baseUrl}${await r.page.getByRole('link', { name: 'Collector', exact: true }).getAttribute('href')}`);
      expect(await csv.text()).toMatch(/η0/);
      await screenshot(r.page, 'collector-fit-viewer');
    } finally {
      await r.close();
    }
  });
});
