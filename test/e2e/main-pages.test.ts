/**
 * The main pages in Chromium, as an engineer of the demo lab: landing, rigs, a rig, the fit
 * workbench, import, forecast (with its result), a study, its share link, a saved fit, members and
 * account.
 *
 * - At 360 px (a small phone, common practice) no page scrolls sideways: the document is no wider
 *   than the viewport, and the header folds the account and lab controls into a Menu disclosure
 *   that works from the keyboard (WAI-ARIA APG disclosure pattern: Enter opens, Escape closes and
 *   returns focus).
 * - axe-core finds nothing of serious or critical impact on any of them, at a desktop's width and
 *   a phone's (the WCAG 2.1 A and AA rules and axe's best practices).
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { signedIn } from '../app/support/client';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { axeFindings } from './support/axe';

interface MainPage {
  name: string;
  path: () => string;
  /** waits for what the page draws after its first paint */
  ready?: (p: Page) => Promise<void>;
}

const ids = { rig: '', fit: '', study: '', share: '', collector: '' };

const PAGES: MainPage[] = [
  { name: 'landing', path: () => '/' },
  { name: 'rigs', path: () => '/rigs' },
  { name: 'rig', path: () => `/rigs/${ids.rig}` },
  { name: 'fit', path: () => `/rigs/${ids.rig}/fit`, ready: (p) => p.getByRole('heading', { name: 'Model comparison' }).waitFor() },
  { name: 'import', path: () => `/rigs/${ids.rig}/import` },
  // the demo's solar collector: its logged day on the rig page, and its efficiency curve
  { name: 'collector rig', path: () => `/rigs/${ids.collector}`, ready: (p) => p.getByRole('region', { name: 'Logged data' }).waitFor() },
  { name: 'collector', path: () => `/rigs/${ids.collector}/collector`, ready: (p) => p.getByRole('heading', { name: /Efficiency curve/ }).waitFor() },
  {
    name: 'forecast',
    path: () => '/forecasts',
    ready: async (p) => {
      await p.getByLabel('Heater', { exact: true }).selectOption('');
      await p.getByLabel(/^Price/).fill('3');
      await p.getByLabel(/^Efficiency/).fill('0.82');
      await p.getByRole('button', { name: 'Forecast' }).click();
      await p.getByText('Rise per hour by pump flow').waitFor();
    },
  },
  { name: 'study', path: () => `/studies/${ids.study}`, ready: (p) => p.locator('[data-block="fit"] svg').first().waitFor() },
  { name: 'share', path: () => ids.share, ready: (p) => p.locator('[data-block="fit"] svg').first().waitFor() },
  { name: 'fit detail', path: () => `/fits/${ids.fit}` },
  { name: 'members', path: () => '/lab/members' },
  { name: 'account', path: () => '/account' },
];

describe('the main pages in Chromium', () => {
  let desk: Awaited<ReturnType<typeof openBrowser>>;
  let phone: Awaited<ReturnType<typeof openBrowser>>;

  beforeAll(async () => {
    // a saved fit, a study that shows it and a share link of the study, made through the API
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rigs = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs as { id: string; name: string }[];
    const rig = rigs.find((r) => r.name === 'Stovepipe Coil A')!;
    const collector = rigs.find((r) => r.name === 'Garage Roof Collector')!;
    const trialIds = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=500`)).body.trials.filter((t: { origin: string }) => t.origin === 'demo').map((t: { id: string }) => t.id);
    const fit = (await eng.post(`/api/labs/${lab.id}/fits`, { rigId: rig.id, title: `Main pages fit ${Date.now().toString(36)}`, model: 'coil', trialIds })).body.fit;
    const study = (await eng.post(`/api/labs/${lab.id}/studies`, { title: `Main pages study ${Date.now().toString(36)}` })).body.study;
    const cur = (await eng.get(`/api/studies/${study.id}`)).body.study;
    const text = { id: 'note', kind: 'text', data: { markdown: 'Read the [roles and permissions](/help/permissions) before you share this.' } };
    // a cost sheet with a season and payback, and a tub fill (their tables and cautions under axe too)
    const seasonAndTub = [
      { id: 'fc', kind: 'forecast', data: { poolVolume: '40 m^3', startTemp: '20 degC', targetTemp: '28 degC', hours: 24, flow: '12 L/min', fitId: fit.id, losses: false } },
      { id: 'cs', kind: 'costs', data: { fuel: 'wood', price: 250, heatFrom: 'forecast', forecastBlockId: 'fc', season: { days: 120, hoursPerDay: 8, targetTemp: '28 degC', cover: true, surfaceArea: '32 m^2', weather: { airTemp: '24 degC', relativeHumidity: 0.6 }, purchased: { price: 1800, fuel: 'propane', fuelPrice: 3.5 } } } },
      { id: 'tub', kind: 'tub-fill', data: { fitId: fit.id, tubVolume: '1200 L', flow: '6 L/min', supplyTemp: '15 degC', targetTemp: '38 degC' } },
    ];
    const saved = await eng.request('PUT', `/api/studies/${study.id}`, { title: cur.title, baseRevision: cur.revision, blocks: [...cur.blocks, text, { id: 'f1', kind: 'fit', data: { fitId: fit.id } }, ...seasonAndTub] });
    expect(saved.status, saved.text).toBe(200);
    const share = await eng.post(`/api/studies/${study.id}/shares`, { days: 7 });
    expect(share.status, share.text).toBe(201);
    Object.assign(ids, { rig: rig.id, fit: fit.id, study: study.id, share: new URL(share.body.url).pathname, collector: collector.id });

    desk = await openBrowser({ viewport: { width: 1280, height: 860 } });
    phone = await openBrowser({ viewport: { width: 360, height: 760 } });
    await signInAs(desk.page, 'engineer@cinder-hollow.test');
    await signInAs(phone.page, 'engineer@cinder-hollow.test');
  }, 180_000);
  afterAll(async () => {
    await desk?.close();
    await phone?.close();
  });

  test.each(PAGES)('$name: at 360 px nothing scrolls sideways, and axe finds nothing serious', async (page) => {
    const p = phone.page;
    await visit(p, page.path());
    await page.ready?.(p);
    const { scrollWidth, innerWidth, widest } = await p.evaluate(() => ({
      scrollWidth: document.documentElement.scrollWidth,
      innerWidth: window.innerWidth,
      // the innermost elements that reach past the right edge, to say what makes the page too wide
      widest: [...document.querySelectorAll('body *')]
        .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5 && ![...el.children].some((c) => c.getBoundingClientRect().right > window.innerWidth + 0.5))
        .slice(0, 4)
        .map((el) => `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${[...el.classList].slice(0, 3).join('.')} (${Math.round(el.getBoundingClientRect().right)} px)`),
    }));
    expect(scrollWidth, `${page.name}: the page lays out ${scrollWidth} px wide in a ${innerWidth} px viewport; past the edge: ${widest.join(', ')}`).toBeLessThanOrEqual(innerWidth);
    await screenshot(p, `phone-${page.name.replace(/ /g, '-')}`);
    expect((await axeFindings(p)).join('\n')).toBe('');
  });

  test.each(PAGES)('$name: at a desktop width axe finds nothing serious or critical', async (page) => {
    const p = desk.page;
    await visit(p, page.path());
    await page.ready?.(p);
    expect((await axeFindings(p)).join('\n')).toBe('');
  });

  test('the phone header opens its Menu from the keyboard and closes it with Escape', async () => {
    const p = phone.page;
    await visit(p, '/rigs');
    const menu = p.getByRole('button', { name: 'Menu' });
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('false');
    await expect(p.getByRole('button', { name: 'Sign out', exact: true }).isVisible()).resolves.toBe(false);
    await menu.focus();
    await p.keyboard.press('Enter');
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('true');
    await p.getByRole('button', { name: 'Sign out', exact: true }).waitFor();
    await expect(p.getByRole('link', { name: /Notices/ }).isVisible()).resolves.toBe(true);
    await expect(p.getByLabel('Current lab').isVisible()).resolves.toBe(true);
    await screenshot(p, 'phone-header-menu-open');
    const { scrollWidth, innerWidth } = await p.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }));
    expect(scrollWidth).toBeLessThanOrEqual(innerWidth);
    expect((await axeFindings(p)).join('\n')).toBe('');
    await p.keyboard.press('Escape');
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('false');
    await expect(p.evaluate(() => document.activeElement?.textContent?.trim())).resolves.toBe('Menu');
    // at a desktop width the controls sit in the bar and there is no Menu button
    await visit(desk.page, '/rigs');
    await expect(desk.page.getByRole('button', { name: 'Menu' }).isVisible()).resolves.toBe(false);
    await expect(desk.page.getByRole('button', { name: 'Sign out', exact: true }).isVisible()).resolves.toBe(true);
  });
});
