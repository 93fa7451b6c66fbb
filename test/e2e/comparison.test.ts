/**
 * Design comparison in Chromium with the demo lab as `npm start` loads it (fixtures/README.md):
 * each role lands on what it does next after signing in; the engineer compares the two coils and
 * saves the comparison, the reviewer comments on it, the viewer reads it and downloads the XLSX
 * with its Comparison sheet. The demo coils were generated with UA 430 and 560 W/K on the same
 * fire (fixtures/demo-lab.ts), so the longer coil must come out ahead in words.
 */
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';

const WIDE = { viewport: { width: 1360, height: 900 } };

describe('design comparison and the landing of each role', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  let url = '';
  const title = `Coil A against coil B ${Date.now().toString(36)}`;
  beforeAll(async () => {
    b = await openBrowser(WIDE);
  });
  afterAll(async () => b?.close());

  test('the engineer lands on her open work, compares the two coils and saves the comparison', async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test', undefined, null);
    const open = p.getByRole('region', { name: 'Your open work' });
    await expect(open.innerText()).resolves.toMatch(/Burner loop, July[\s\S]*Changes requested/);
    await expect(open.innerText()).resolves.toMatch(/Burner loop, exponential try/);
    await expect(p.getByRole('region', { name: 'Waiting for a reviewer' }).innerText()).resolves.toMatch(/Long coil, first firing/);
    await screenshot(p, 'landing-engineer');
    await p.getByRole('navigation', { name: 'Work areas' }).getByRole('link', { name: 'Compare' }).click();
    await p.getByLabel('Title').fill(title);
    await p.getByRole('checkbox', { name: /^Stovepipe Coil A/ }).check();
    await p.getByRole('checkbox', { name: /^B?\s*Stovepipe Coil B/ }).check();
    await p.getByLabel(/Common inlet/).fill('18');
    await p.getByLabel(/Common flow/).fill('10');
    await screenshot(p, 'comparison-new');
    await p.getByRole('button', { name: 'Compare and save' }).click();
    await p.waitForURL(/\/comparisons\/[0-9a-f-]{36}$/);
    url = new URL(p.url()).pathname;
    const verdict = p.getByRole('region', { name: 'Verdict' });
    await expect(verdict.innerText()).resolves.toMatch(/Stovepipe Coil B delivers [\d.]+–[\d.]+ % more heat at 10 L\/min than Stovepipe Coil A\./);
    expect(await p.locator('figure svg').count()).toBeGreaterThanOrEqual(2);
    await expect(p.locator('table').nth(1).innerText()).resolves.toMatch(/UA ratio/);
    await screenshot(p, 'comparison-engineer');
  });

  test('the reviewer lands on the review queue and comments on the comparison', async () => {
    const r = await openBrowser(WIDE);
    try {
      await signInAs(r.page, 'reviewer@cinder-hollow.test', undefined, null);
      await expect(r.page.getByRole('region', { name: 'Your review queue' }).innerText()).resolves.toMatch(/Long coil, first firing[\s\S]*Which coil for the backyard pool|Which coil for the backyard pool[\s\S]*Long coil, first firing/);
      await screenshot(r.page, 'landing-reviewer');
      await visit(r.page, url);
      await r.page.getByLabel('Comment', { exact: true }).fill('Same barrel, same wood? Say so in the notes and I am happy.');
      await r.page.getByRole('button', { name: 'Add comment' }).click();
      await r.page.getByText('Same barrel, same wood?').first().waitFor();
      await screenshot(r.page, 'comparison-reviewer-commented');
    } finally {
      await r.close();
    }
  });

  test('the viewer lands on the studies, reads the comparison and downloads it with its Comparison sheet', async () => {
    const v = await openBrowser(WIDE);
    try {
      await signInAs(v.page, 'viewer@cinder-hollow.test', undefined, null);
      await expect(v.page.getByRole('region', { name: 'Studies to read' }).innerText()).resolves.toMatch(/Which coil for the backyard pool/);
      await screenshot(v.page, 'landing-viewer');
      await visit(v.page, url);
      await v.page.getByText('Same barrel, same wood?').first().waitFor();
      expect(await v.page.getByRole('button', { name: 'Add comment' }).count()).toBe(0);
      await screenshot(v.page, 'comparison-viewer');
      const [download] = await Promise.all([v.page.waitForEvent('download'), v.page.getByRole('link', { name: 'Download XLSX' }).click()]);
      expect(download.suggestedFilename()).toMatch(/\.xlsx$/);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile((await download.path())!);
      const sheet = wb.getWorksheet('Comparison')!;
      expect(sheet).toBeTruthy();
      const text: string[] = [];
      sheet.eachRow((row) => text.push((row.values as unknown[]).map(String).join(' | ')));
      expect(text.join('\n')).toMatch(/UA ratio/);
      expect(text.join('\n')).toMatch(/Heat per length of tube/);
    } finally {
      await v.close();
    }
  });

  test('the owner lands on the team', async () => {
    const o = await openBrowser(WIDE);
    try {
      await signInAs(o.page, 'owner@cinder-hollow.test', undefined, null);
      const team = o.page.getByRole('region', { name: 'Your team' });
      for (const role of ['engineer', 'reviewer', 'viewer']) await expect(team.innerText()).resolves.toContain(`${role}@cinder-hollow.test`);
      await screenshot(o.page, 'landing-owner');
    } finally {
      await o.close();
    }
  });
});
