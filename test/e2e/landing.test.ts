import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, visit } from './support/browser';

describe('landing page in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  beforeAll(async () => {
    b = await openBrowser();
  });
  afterAll(async () => b?.close());

  test('says what Emberline does, shows a sample plot and the work areas, with landmarks', async () => {
    const res = await visit(b.page, '/');
    expect(res?.status()).toBe(200);
    await expect(b.page.locator('h1').innerText()).resolves.toMatch(/heater models you can trust/);
    expect(await b.page.locator('main#main').count()).toBe(1);
    expect(await b.page.locator('header').count()).toBeGreaterThan(0);
    const nav = b.page.getByRole('navigation', { name: 'Work areas' });
    await nav.waitFor();
    for (const area of ['Rigs', 'Trials', 'Fits', 'Forecasts', 'Studies']) {
      expect(await nav.getByRole('link', { name: area, exact: true }).count()).toBe(1);
    }
    expect(await b.page.locator('figure svg').count()).toBeGreaterThan(0);
    await expect(b.page.getByRole('complementary', { name: 'Safety notice' }).innerText()).resolves.toMatch(/analysis aid/);
    // Fonts come from our own bundle, never from another host.
    const fontFaces = await b.page.evaluate(() => [...document.fonts].map((f) => f.family));
    expect(fontFaces.join(',')).toMatch(/Inter/);
    await screenshot(b.page, 'landing');
    expect(b.consoleErrors, b.consoleErrors.join('\n')).toEqual([]);
  });

  test('works on a phone-sized screen without sideways scrolling', async () => {
    const phone = await openBrowser({ viewport: { width: 390, height: 844 } });
    try {
      await visit(phone.page, '/');
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(phone.page, 'landing-phone');
    } finally {
      await phone.close();
    }
  });
});
