/**
 * A viewer forecasts a pool in US units with a saved coil fit and a propane price; an engineer
 * forecasts with an hourly weather table and a daytime heater schedule.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { signedIn } from '../app/support/client';

describe('forecast page in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1360, height: 900 } });
  });
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'emberline-weather-'));
  afterAll(async () => {
    await b?.close();
    rmSync(tmp, { recursive: true, force: true });
  });

  test('shows the trajectory, hours to target, energy budget, rise table, cost and cautions', async () => {
    const us = await signedIn('viewer@cinder-hollow.test');
    await us.request('PATCH', '/api/me', { unitSystem: 'us' });
    try {
      await signInAs(b.page, 'viewer@cinder-hollow.test');
      await visit(b.page, '/forecasts');
      await b.page.getByLabel('Heater', { exact: true }).selectOption('');
      await b.page.getByLabel(/^Price/).fill('3');
      await b.page.getByLabel(/^Efficiency/).fill('0.82');
      await b.page.getByRole('button', { name: 'Forecast' }).click();
      await b.page.getByText('Rise per hour by pump flow').waitFor();
      await expect(b.page.getByText('Hours to target').count()).resolves.toBe(1);
      await expect(b.page.getByRole('list', { name: 'Cautions' }).innerText()).resolves.toMatch(/scald/);
      // both plots are drawn in the browser from the answer's numbers
      await b.page.locator('figure svg').nth(1).waitFor();
      expect(await b.page.locator('figure svg').count()).toBe(2);
      await screenshot(b.page, 'forecast-us');
    } finally {
      await us.request('PATCH', '/api/me', { unitSystem: 'si' });
    }
  });

  test('takes an hourly weather table and a heater schedule; a bad table is refused with its line', async () => {
    const p = b.page;
    await b.context.clearCookies();
    await signInAs(p, 'engineer@cinder-hollow.test');
    await visit(p, '/forecasts');
    await p.getByLabel('Heater', { exact: true }).selectOption('');
    await p.getByLabel('Heater on at').selectOption('9');
    await p.getByLabel('Heater off at').selectOption('17');
    await p.getByRole('radio', { name: 'hourly table (CSV)' }).check();
    // an invented typical day: cool night, warm sunny afternoon (not measured data)
    const day = Array.from({ length: 24 }, (_, h) => {
      const air = 16 + 8 * Math.max(0, Math.sin(((h - 6) / 12) * Math.PI));
      const sun = Math.round(800 * Math.max(0, Math.sin(((h - 6) / 12) * Math.PI)));
      return `${h},${air.toFixed(1)},${h < 8 ? 85 : 55},${h > 11 && h < 18 ? 2.5 : 0.8},${sun}`;
    });
    const bad = path.join(tmp, 'bad-day.csv');
    writeFileSync(bad, ['hour,air (°C),RH (%),wind (m/s),solar (W/m2)', ...day.slice(0, 5), '5,12,humid,1,0'].join('\n'));
    await p.getByLabel('Hourly weather CSV').setInputFiles(bad);
    await p.getByText('bad-day.csv, line 7: RH (%): a relative humidity must be 0–100 % ("humid")').waitFor();
    const good = path.join(tmp, 'typical-day.csv');
    writeFileSync(good, ['hour,air (°C),RH (%),wind (m/s),solar (W/m2)', ...day].join('\n'));
    await p.getByLabel('Hourly weather CSV').setInputFiles(good);
    await p.getByText('typical-day.csv: 24 hourly rows').waitFor();
    await p.getByRole('button', { name: 'Forecast' }).click();
    await p.getByText('Rise per hour by pump flow').waitFor();
    await p.locator('figure svg').nth(1).waitFor();
    expect(await p.locator('figure svg').count()).toBe(2);
    await screenshot(p, 'forecast-hourly-weather');
  });
});
