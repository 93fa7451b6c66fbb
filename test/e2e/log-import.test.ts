/**
 * A sensor log in Chromium: upload, the page recognises a log, find the steady periods, leave out a
 * bad row, drop one period and shorten another, import in the background with a progress bar, and
 * see the trials and the job on the rig page.
 *
 * The log comes from `writeSensorLogCsv` (test/support/sensor-log-file.ts): 1 Hz plateaus of 1200 s whose
 * set-points cycle through outlet 30 + 3k °C and flow 9 + 3k L/min (our generator, checked against
 * its own definition), with one row broken by hand.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { writeSensorLogCsv } from '../support/sensor-log-file';
import { openBrowser, screenshot, signInAs } from './support/browser';

describe('sensor-log import in Chromium', () => {
  let b: Awaited<ReturnType<typeof openBrowser>>;
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'emberline-log-e2e-'));
  const file = path.join(tmp, 'burner-log.csv');
  beforeAll(async () => {
    b = await openBrowser({ viewport: { width: 1280, height: 900 } });
    await writeSensorLogCsv(file, { rows: 6000, seed: 4242 });
    const lines = readFileSync(file, 'utf8').split('\n');
    lines[1500] = lines[1500].replace(/^([^,]+),([^,]+),([^,]+),/, '$1,$2,n/a,'); // line 1501: no outlet reading
    writeFileSync(file, lines.join('\n'));
  });
  afterAll(async () => {
    await b?.close();
    rmSync(tmp, { recursive: true, force: true });
  });

  test('an engineer imports a burner log, keeping the periods she chose', { timeout: 120_000 }, async () => {
    const p = b.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await p.getByRole('link', { name: 'New rig' }).click();
    await p.getByLabel('Name').fill(`Log walk ${Date.now().toString(36)}`);
    await p.getByRole('button', { name: 'Create rig' }).click();
    await p.waitForURL(/\/rigs\/[0-9a-f-]{36}$/);
    await p.getByRole('link', { name: 'Import a file' }).click();
    await p.getByLabel('Trial file').setInputFiles(file);
    await p.getByRole('heading', { name: 'Steady periods' }).waitFor();
    expect(await p.getByRole('radio', { name: /Sensor log/ }).isChecked()).toBe(true);
    await expect(p.getByRole('combobox', { name: 'Meaning of column T_out [C]' }).inputValue()).resolves.toBe('outletTemp');
    await screenshot(p, 'log-import-mapping');

    await p.getByRole('button', { name: 'Find steady periods' }).click();
    const periods = p.getByRole('table', { name: 'Steady periods' });
    await periods.waitFor();
    // the broken row is named with its line and blocks the import until it is left out
    await p.getByRole('table', { name: 'Log rows with errors' }).getByText('1501').waitFor();
    const importButton = p.getByRole('button', { name: /^Import 5,999 samples and \d+ trials?$/ });
    expect(await importButton.isDisabled()).toBe(true);
    const found = await periods.locator('tbody tr').count();
    // five plateaus of 20 min, the first settling from the start values: at least four steady periods (field preset)
    expect(found).toBeGreaterThanOrEqual(4);
    await screenshot(p, 'log-import-periods');
    // a closer look at one period: the server reduces that stretch anew
    await p.getByRole('button', { name: 'Zoom to period 3' }).click();
    await p.getByText(/^Showing [\d.]+–[\d.]+ h of 1\.67 h$/).waitFor();
    // period 3 (18 min) with half its length on each side: about 36 min, whole samples (1 Hz) again
    await expect.poll(() => p.locator('figure').first().innerText()).toMatch(/\b1\d{3} samples over 3\d\.\d min;.*\b3 \(18\.\d min\)/s);
    await screenshot(p, 'log-import-zoomed');
    await p.getByRole('button', { name: 'Whole log' }).click();

    await p.getByLabel('Leave this row out of the import').check();
    await p.getByRole('checkbox', { name: 'Keep period 2' }).uncheck();
    const start1 = p.getByRole('textbox', { name: 'Start of period 1 (min)' });
    const before = Number(await start1.inputValue());
    await start1.fill(String(before + 2));
    await start1.blur();
    await p.getByRole('button', { name: `Import 5,999 samples and ${found - 1} trials` }).waitFor();
    await expect.poll(async () => importButton.isEnabled(), { timeout: 20_000 }).toBe(true);
    expect(Number(await p.getByRole('textbox', { name: 'Start of period 1 (min)' }).inputValue())).toBeCloseTo(before + 2, 1);
    await screenshot(p, 'log-import-adjusted');

    await importButton.click();
    await p.getByRole('heading', { name: 'Import' }).waitFor();
    await p.locator('[data-job-state="completed"]').waitFor({ timeout: 90_000 });
    await p.getByText(`steady trial${found - 1 === 1 ? '' : 's'} made`).waitFor();
    await screenshot(p, 'log-import-done');

    await p.getByRole('link', { name: 'See the trials' }).click();
    await p.waitForURL(/\/rigs\/[0-9a-f-]{36}$/);
    await p.getByRole('heading', { name: 'Sensor-log imports' }).waitFor();
    await p.locator('tbody tr').first().waitFor();
    await screenshot(p, 'log-import-rig');
    expect(b.consoleErrors).toEqual([]);
  });
});
