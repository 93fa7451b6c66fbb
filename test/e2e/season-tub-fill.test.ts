/**
 * A season on a study's cost sheet and a tub-fill block in Chromium: the engineer adds a forecast,
 * a cost sheet with a season and a purchased heater, and a tub fill in the editor and sees the
 * payback and the fill; a viewer reads the study (no editing) and downloads its workbook with the
 * Tub fill sheet; screenshots at a desktop and a phone width.
 */
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import path from 'node:path';
import { baseUrl, openBrowser, resultsDir, screenshot, signInAs, visit } from './support/browser';
import { signedIn } from '../app/support/client';
import { getOrm } from '@/app/_lib/server/db';

describe('a season and a tub fill in a study', () => {
  let eng: Awaited<ReturnType<typeof openBrowser>>;
  let studyUrl = '';

  beforeAll(async () => {
    const api = await signedIn('engineer@cinder-hollow.test');
    const lab = (await api.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
    const study = (await api.post(`/api/labs/${lab.id}/studies`, { title: `A season of the pool ${Date.now().toString(36)}` })).body.study;
    studyUrl = `/studies/${study.id}`;
    eng = await openBrowser({ viewport: { width: 1360, height: 900 } });
  }, 120_000);
  afterAll(async () => {
    await eng?.close();
    await (await getOrm()).close(true);
  });

  test('the engineer sets a season and a purchased heater and sees the payback; then adds a tub fill', async () => {
    const p = eng.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await visit(p, `${studyUrl}?edit=1`);
    const saved = () => p.getByRole('status').filter({ hasText: /Saved \(revision/ }).waitFor({ timeout: 15_000 });
    await p.getByRole('button', { name: '+ Forecast' }).click();
    await saved();
    // the forecast's heater: the demo burner loop's coil fit, whose rig records no build cost (the
    // editor's default is the lab's newest coil fit, which other tests change)
    const heater = p.getByLabel('Heater (coil fit)');
    await heater.selectOption((await heater.locator('option', { hasText: 'Blue Ring Burner Loop: Burner loop, July' }).first().getAttribute('value'))!);
    await saved();
    await p.getByRole('button', { name: '+ Cost sheet' }).click();
    await saved();
    // new blocks go after the study's text and caution blocks: find the cost sheet's number from its editor row
    const n = (await p.getByLabel(/^Price of block \d+$/).getAttribute('aria-label'))!.match(/\d+/)![0];
    await p.getByLabel(`Price of block ${n}`).fill('3');
    await p.getByLabel(`Efficiency of block ${n}`).fill('0.82');
    await saved();
    await p.getByRole('button', { name: 'Add a season (energy, money and payback)' }).click();
    await saved();
    const season = p.locator('[data-block="costs"]').getByTestId('season');
    await season.waitFor();
    await expect(season.innerText()).resolves.toMatch(/120 days, heater 8 h a day, cover on/);
    await p.getByRole('button', { name: 'Compare with a purchased heater' }).click();
    await saved();
    // a comparison without a build cost or the purchased heater's price: the block names the field
    await p.locator('[data-block="costs"]').getByText(/season\.buildPrice: give what the build cost/).waitFor();
    await p.getByLabel(`Build price of block ${n}`).fill('3000');
    await saved();
    await p.locator('[data-block="costs"]').getByText(/season\.purchased\.price/).waitFor();
    await p.getByLabel(`Purchased heater price of block ${n}`).fill('2500');
    await p.getByLabel(`Purchased heater fuel of block ${n}`).selectOption('electric-resistance');
    await p.getByLabel(`Its fuel price of block ${n}`).fill('0.15');
    await saved();
    const payback = p.locator('[data-block="costs"]').getByTestId('payback');
    await payback.waitFor();
    // propane at $3.00/gal, η 0.82 ($4.00 a useful therm) against resistance at $0.15/kWh ($4.40): the build saves, so its extra $500 pays back in seasons
    await expect(payback.innerText()).resolves.toMatch(/Payback: \d+\.\d seasons: the build's extra 500\.00 USD/);
    // a bad setting is refused with its field and nothing is stored (the editor's save answers 422)
    eng.expectConsoleError(/status of 422/);
    await p.getByLabel(`Season days of block ${n}`).fill('400');
    await p.getByText(/season\.days: at most 366 days/).first().waitFor({ timeout: 15_000 });
    await p.getByLabel(`Season days of block ${n}`).fill('120');
    await saved();
    await screenshot(p, 'season-1-editor');

    await p.getByRole('button', { name: '+ Tub fill' }).click();
    await saved();
    const tub = p.locator('[data-block="tub-fill"]').getByTestId('tub-fill');
    await tub.waitFor();
    // 1,200 L at 6 L/min: 200 min (V / V̇)
    await expect(tub.innerText()).resolves.toMatch(/3 h 20 min/);
    await expect(p.locator('[data-block="tub-fill"]').getByRole('list', { name: 'Cautions for the tub fill' }).innerText()).resolves.toMatch(/40 °C|scald|burn/i);
    await screenshot(p, 'season-2-tub-fill-editor');
  });

  test('on the forecast page the engineer costs a season and sees the payback against a purchased heater', async () => {
    const p = eng.page;
    await visit(p, '/forecasts');
    await p.getByLabel(/^Price/).fill('3');
    await p.getByLabel(/^Efficiency/).fill('0.82');
    await p.getByText('A season and the payback of the build').click();
    await p.getByLabel('Season (days)').fill('120');
    await p.getByLabel('Heater hours (a day)').fill('8');
    await p.getByLabel(/^Season target/).fill('28');
    await p.getByLabel('Cover on outside the heater hours').check();
    await p.getByLabel('Build cost (money)').fill('3000');
    await p.getByLabel('Purchased heater (price)').fill('2500');
    await p.getByLabel('Purchased heater’s fuel').selectOption('electric-resistance');
    await p.getByLabel('Its fuel price (per unit)').fill('0.15');
    await p.getByRole('button', { name: 'Forecast' }).click();
    const season = p.getByTestId('season');
    await season.waitFor();
    await expect(season.innerText()).resolves.toMatch(/120 days, heater 8 h a day, cover on/);
    await expect(p.getByTestId('payback').innerText()).resolves.toMatch(/Payback: (\d+\.\d seasons|Never|At once)/);
    await screenshot(p, 'season-6-forecast-page');
  });

  test('a viewer reads the season and the tub fill and exports the workbook, at desktop and phone widths', async () => {
    for (const [width, name] of [[1280, 'desktop'], [360, 'phone']] as const) {
      const v = await openBrowser({ viewport: { width, height: 900 } });
      try {
        await signInAs(v.page, 'viewer@cinder-hollow.test');
        await visit(v.page, studyUrl);
        await v.page.locator('[data-block="costs"]').getByTestId('payback').waitFor();
        await v.page.locator('[data-block="tub-fill"]').getByTestId('tub-fill').waitFor();
        await expect(v.page.getByRole('button', { name: '+ Tub fill' }).count()).resolves.toBe(0);
        const href = await v.page.getByRole('link', { name: 'Download XLSX' }).getAttribute('href');
        const xlsx = await v.page.request.get(`${baseUrl}${href}`);
        expect(xlsx.status()).toBe(200);
        const wb = new ExcelJS.Workbook();
        await wb.xlsx.load(Buffer.from(await xlsx.body()) as unknown as ArrayBuffer);
        expect(wb.getWorksheet('Tub fill')).toBeTruthy();
        const costs: string[] = [];
        wb.getWorksheet('Costs')!.eachRow((r) => costs.push((r.values as unknown[]).map(String).join(' ')));
        expect(costs.some((r) => /Season .*Payback/.test(r))).toBe(true);
        // the page is no wider than the viewport
        expect(await v.page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width);
        await screenshot(v.page, `season-3-viewer-${name}`);
        // the two new parts alone, to look at closely
        await v.page.locator('[data-block="costs"]').getByTestId('season').screenshot({ path: path.join(resultsDir, `season-4-season-${name}.png`) });
        await v.page.locator('[data-block="tub-fill"]').screenshot({ path: path.join(resultsDir, `season-5-tub-fill-${name}.png`) });
        expect(v.consoleErrors).toEqual([]);
      } finally {
        await v.close();
      }
    }
  });
});
