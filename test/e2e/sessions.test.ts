/**
 * A whole test session on a phone (375 × 740): plan it on the rig page from a guess (Ts 85 °C, UA
 * 400 W/K, inlet 18 °C, 2–20 L/min, outlet limit 95 °C, 8 runs), run the eight runs with the fill
 * timer — one reading questioned and kept, the drift check when the reference flow comes back —
 * close it and make a study. Screenshots of every step go to test-results/.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { signedIn } from '../app/support/client';

/**
 * One predicted outlet on screen: one caution per hazard — its highest contact band (here the
 * upper bound is past 60 °C: burns in seconds), and near boiling beside it when it reaches 95 °C —
 * never the lower bands under it (thresholds DOMAIN.md §5).
 */
function expectOnePerHazard(outlet: string[]) {
  expect(outlet.filter((t) => /burns skin in seconds/.test(t))).toHaveLength(1);
  expect(outlet.filter((t) => /can scald|spas and tubs/.test(t))).toEqual([]);
  expect(outlet.filter((t) => !/burns skin in seconds|boiling/.test(t))).toEqual([]);
}

describe('a test session on a phone in Chromium', () => {
  let phone: Awaited<ReturnType<typeof openBrowser>>;
  let rigId = '';
  beforeAll(async () => {
    phone = await openBrowser({ viewport: { width: 375, height: 740 } });
    const eng = await signedIn('engineer@cinder-hollow.test');
    const me = await eng.get('/api/me');
    const labId = me.body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow')?.id ?? me.body.labs[0].id;
    const rig = await eng.post(`/api/labs/${labId}/rigs`, { name: `Session coil ${Date.now().toString(36)}`, heatSource: 'wood-fire', description: 'A coil in a fire pit, for the session walk-through.' });
    expect(rig.status, rig.text).toBe(201);
    rigId = rig.body.rig.id;
  });
  afterAll(async () => phone?.close());

  test('plan, eight runs with the fill timer, a questioned reading, the drift check, close, study', async () => {
    const p = phone.page;
    await signInAs(p, 'engineer@cinder-hollow.test');
    await visit(p, `/rigs/${rigId}`);
    await p.getByRole('button', { name: 'Plan a session' }).click();
    await p.getByLabel('A guess').check();
    await p.getByLabel('Title').fill('Phone walk-through');
    await p.getByRole('button', { name: 'Preview the plan' }).click();
    const runs = p.getByLabel('Planned runs');
    await runs.locator('tbody tr').first().waitFor();
    await expect(runs.locator('table').first().locator('tbody tr').count()).resolves.toBe(8);
    await p.getByLabel('Expected standard errors').scrollIntoViewIfNeeded();
    const planned = await p.getByRole('list', { name: 'Cautions' }).first().getByRole('listitem').allInnerTexts();
    expectOnePerHazard(planned.filter((t) => /The planned outlet water/.test(t)));
    await screenshot(p, 'session-1-plan');
    await p.getByRole('button', { name: 'Save the plan and start' }).click();
    await p.waitForURL(/\/sessions\/[0-9a-f-]{36}$/);
    // the plan's hottest predicted outlet (upper bound, Ts 85 °C) shows one caution per hazard, not one
    // box per band under it (thresholds DOMAIN.md §5: 40 °C spa, 49 °C scald, 60 °C seconds, 95 °C steam)
    const cautions = await p.getByRole('list', { name: 'Cautions' }).first().getByRole('listitem').allInnerTexts();
    expectOnePerHazard(cautions.filter((t) => /The planned outlet water/.test(t)));
    await screenshot(p, 'session-2-first-run');

    let firstOutlet = 0;
    for (let i = 0; i < 8; i++) {
      const form = p.getByRole('form', { name: 'Current run' });
      await form.waitFor();
      const text = await form.innerText();
      const flowLpm = Number(/Set the flow to ([\d.]+) L\/min/.exec(text)![1]);
      const [, pred, , hi] = /Predicted outlet ([\d.]+) \(([\d.]+)–([\d.]+)\)/.exec(text)!;
      const predicted = Number(pred);
      await p.getByRole('button', { name: /Start (fill timer|another fill)/ }).click();
      await p.waitForTimeout(1500);
      await p.getByRole('button', { name: /^Stop/ }).click();
      const fill = Number((await p.getByRole('list', { name: 'Fill times' }).locator('li').first().innerText()).replace(/[^\d.]/g, ''));
      // the bucket that this fill time takes at the set flow, so that the timed flow is the planned one
      await form.getByLabel(/Bucket volume/).fill(((flowLpm * fill) / 60).toFixed(3));
      await form.getByLabel(/Inlet/).fill('18');
      let outlet = predicted;
      if (i === 7) outlet = Math.round((firstOutlet - 3) * 10) / 10; // the reference flow 3 K cooler: the fire burned down
      if (i === 2) outlet = Math.round((Number(hi) + 3) * 10) / 10; // 3 K above the upper prediction bound
      await form.getByLabel(/Outlet/).fill(String(outlet));
      if (i === 0) firstOutlet = outlet;
      if (i === 2) {
        await p.getByRole('status', { name: 'Reading check' }).filter({ hasText: 'Outside the predicted' }).waitFor();
        await p.getByRole('button', { name: 'Save reading' }).click();
        await p.getByRole('button', { name: 'Keep this reading' }).waitFor();
        await screenshot(p, 'session-3-questioned');
        await p.getByRole('button', { name: 'Keep this reading' }).click();
        await p.getByText('Saved, outside the prediction (kept).', { exact: false }).waitFor();
      } else {
        await p.getByRole('button', { name: 'Save reading' }).click();
      }
      await p.getByText(new RegExp(`^${i + 1} of 8 runs done$`)).waitFor();
    }
    await p.getByRole('heading', { name: 'Drift check' }).waitFor();
    await expect(p.getByRole('status', { name: 'Last reading' }).innerText()).resolves.toMatch(/drifted/);
    await screenshot(p, 'session-4-drift');

    await p.getByRole('button', { name: 'Close the session' }).click();
    await p.getByRole('heading', { name: 'Verdict' }).waitFor();
    // the verdict's list and the highlighted line both name the next best run
    await expect(p.getByText(/Next best run:/).count()).resolves.toBeGreaterThanOrEqual(1);
    await screenshot(p, 'session-5-verdict');
    await p.getByRole('button', { name: 'Make a study from this session' }).click();
    await p.getByRole('link', { name: 'Open the study' }).click();
    await p.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
    await p.getByText('Test session: Phone walk-through').first().waitFor();
    await screenshot(p, 'session-6-study');
  });
});
