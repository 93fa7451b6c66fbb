/** A viewer forecasts a pool in US units with a saved coil fit and a propane price. */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { signedIn } from '../app/support/client';

describe('forecast page in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1360, height: 900 } });
  });
  afterAll(async () => b?.close());

  test('shows the trajectory, hours to target, energy budget, rise table, cost and cautions', async () => {
    const us = await signedIn('viewer@cinder-hollow.test');
    await us.request('PATCH', '/api/me', { unitSystem: 'us' });
    try {
      await signInAs(b.page, 'viewer@cinder-hollow.test');
      await visit(b.page, '/forecasts');
      await b.page.getByLabel('Heater').selectOption('');
      await b.page.getByLabel(/^Price/).fill('3');
      await b.page.getByLabel(/^Efficiency/).fill('0.82');
      await b.page.getByRole('button', { name: 'Forecast' }).click();
      await b.page.getByText('Rise per hour by pump flow').waitFor();
      await expect(b.page.getByText('Hours to target').count()).resolves.toBe(1);
      await expect(b.page.getByRole('list', { name: 'Cautions' }).innerText()).resolves.toMatch(/scald/);
      expect(await b.page.locator('figure svg').count()).toBe(2);
      await screenshot(b.page, 'forecast-us');
    } finally {
      await us.request('PATCH', '/api/me', { unitSystem: 'si' });
    }
  });
});
