/** Upload, map, fix an error by excluding it, confirm, see the trials — in Chromium. */
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';

const fixture = (name: string) => path.resolve(__dirname, '..', '..', 'fixtures', 'import', name);

describe('trial import in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1280, height: 900 } });
  });
  afterAll(async () => b?.close());

  test('an engineer imports a sheet with errors after excluding the bad rows', async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await p.getByRole('link', { name: 'New rig' }).click();
    await p.getByLabel('Name').fill(`Import walk ${Date.now().toString(36)}`);
    await p.getByRole('button', { name: 'Create rig' }).click();
    await p.waitForURL(/\/rigs\/[0-9a-f-]{36}$/);
    const rigUrl = new URL(p.url()).pathname;
    await p.getByRole('link', { name: 'Import a file' }).click();
    await p.getByLabel('Trial file').setInputFiles(fixture('trials-errors.csv'));
    await p.getByRole('heading', { name: 'Check' }).waitFor();
    await expect(p.getByRole('combobox', { name: 'Meaning of column outlet (°C)' }).inputValue()).resolves.toBe('outletTemp');
    const importButton = p.getByRole('button', { name: /^Import \d+ trials$/ });
    expect(await importButton.isDisabled()).toBe(true);
    await screenshot(p, 'import-errors');
    await p.getByRole('button', { name: 'Exclude all rows with errors' }).click();
    await screenshot(p, 'import-excluded');
    await importButton.click();
    await p.getByText(/trials imported\./).waitFor();
    await visit(p, rigUrl);
    await p.locator('tbody tr').first().waitFor();
    expect(await p.locator('tbody tr').count()).toBeGreaterThan(3);
    await screenshot(p, 'import-done-trials');
  });
});
