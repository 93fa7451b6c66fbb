/** The engineer fits two models in Chromium, saves a fit and asks for review; the reviewer approves. */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';

describe('fit page in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  let fitUrl = '';
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1360, height: 900 } });
  });
  afterAll(async () => b?.close());

  test('the engineer compares the coil and the exponential and saves the coil fit', async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await p.getByRole('link', { name: 'Stovepipe Coil A' }).click();
    await p.getByRole('link', { name: 'Fit models' }).click();
    await p.getByRole('heading', { name: 'Model comparison' }).waitFor();
    await expect(p.getByRole('note').innerText()).resolves.toMatch(/coil is the best|Constant-source coil/);
    // the six plots are drawn in the browser from the answer's numbers
    await p.locator('figure svg').nth(5).waitFor();
    expect(await p.locator('figure svg').count()).toBeGreaterThanOrEqual(6);
    await screenshot(p, 'fit-workbench');
    await p.getByLabel('Title').fill('Stovepipe coil, June session');
    await p.getByRole('button', { name: 'Save fit' }).click();
    await p.waitForURL(/\/fits\/[0-9a-f-]{36}$/);
    fitUrl = new URL(p.url()).pathname;
    await p.getByRole('button', { name: 'Ask for review' }).click();
    await p.getByText('In review').first().waitFor();
    await screenshot(p, 'fit-saved-in-review');
  });

  test('the reviewer comments and approves; the fit list shows the state', async () => {
    const r = await openBrowser({ viewport: { width: 1360, height: 900 } });
    try {
      await signInAs(r.page, 'reviewer@cinder-hollow.test');
      await visit(r.page, fitUrl);
      await r.page.getByLabel('Comment').fill('Residuals random against flow and order; Ts is well determined.');
      await r.page.getByRole('button', { name: 'Add comment' }).click();
      await r.page.getByText('Ts is well determined').first().waitFor();
      await r.page.getByRole('button', { name: 'Approve' }).click();
      await r.page.getByText('Approved').first().waitFor();
      await screenshot(r.page, 'fit-approved');
      await visit(r.page, '/fits');
      await expect(r.page.locator('tbody').innerText()).resolves.toMatch(/Stovepipe coil, June session[\s\S]*Approved/);
    } finally {
      await r.close();
    }
  });
});
