/**
 * Operating plans in Chromium: the engineer builds a plan on a rig's page, lights the fire before
 * the pump and sees the caution at once (the checker runs in the browser), puts the steps back in
 * the safe order (DOMAIN.md §5: flow before fire, pump until the coil is cold; common practice),
 * saves it and adds it to a study; a viewer reads it in the study on a phone.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { openBrowser, screenshot, signInAs, visit } from './support/browser';
import { axeFindings } from './support/axe';
import { signedIn } from '../app/support/client';

describe('operating plans in Chromium', () => {
  let eng: Awaited<ReturnType<typeof openBrowser>>;
  const run = Date.now().toString(36);
  const rigName = `Plan rig ${run}`;
  const planName = `First firing ${run}`;
  let rigUrl = '';
  let studyUrl = '';

  beforeAll(async () => {
    const api = await signedIn('engineer@cinder-hollow.test');
    const lab = (await api.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
    const rig = (await api.post(`/api/labs/${lab.id}/rigs`, { name: rigName, heatSource: 'wood-fire', description: 'A coil over a fire pit for the plan walk-through.' })).body.rig;
    rigUrl = `/rigs/${rig.id}`;
    const study = (await api.post(`/api/labs/${lab.id}/studies`, { title: `How we run ${rigName}` })).body.study;
    studyUrl = `/studies/${study.id}`;
    eng = await openBrowser({ viewport: { width: 1360, height: 900 } });
  }, 60_000);
  afterAll(async () => eng?.close());

  test('the engineer builds a plan, sees the caution of the fire lit before the pump, fixes the order and saves it', async () => {
    const p = eng.page;
    await signInAs(p, 'engineer@cinder-hollow.test', undefined, rigUrl);
    const section = p.getByRole('region', { name: 'Operating plan' });
    await section.getByRole('button', { name: 'New plan' }).click();
    const form = section.getByRole('form', { name: 'New operating plan' });
    await form.getByLabel('Plan name').fill(planName);
    // the new plan starts from the safe order: no caution
    await form.locator('[data-plan-safe]').waitFor();
    await expect(form.getByLabel('Step 6', { exact: true }).inputValue()).resolves.toBe('fire-lit');
    // light the fire before the pump: step 6 up twice, above "Pump on"
    await form.getByRole('button', { name: 'Move step 6 up' }).click();
    await form.getByRole('button', { name: 'Move step 5 up' }).click();
    const cautions = form.getByRole('list', { name: 'Cautions of this plan as it stands' });
    await cautions.getByText(/Step 4 \(fire lit\): the fire is lit before water flows through the coil/).waitFor();
    await expect(cautions.innerText()).resolves.toMatch(/^Danger: Step 4/);
    await expect(form.innerText()).resolves.toMatch(/follow local codes and licensed practice/);
    await screenshot(p, 'operating-plan-1-hazard');
    // the form with a caution, as assistive technology meets it (axe: WCAG 2.1 A/AA, best practice)
    expect((await axeFindings(p)).join('\n')).toBe('');
    await p.setViewportSize({ width: 390, height: 844 });
    expect(await p.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(p, 'operating-plan-1-hazard-phone');
    await p.setViewportSize({ width: 1360, height: 900 });
    // and stop the pump where it should run until the coil is cold: the caution names it too
    await form.getByLabel('Step 9', { exact: true }).selectOption('pump-off');
    await cautions.getByText(/Step 9 \(pump off\): the pump stops while the coil is still hot/).waitFor();
    await form.getByLabel('Step 9', { exact: true }).selectOption('wait-until-cold');
    await expect(form.getByLabel(/Coil temperature of step 9/).inputValue()).resolves.toBe('35');
    // the safe order again: the fire back under the pump and the flow
    await form.getByRole('button', { name: 'Move step 4 down' }).click();
    await form.getByRole('button', { name: 'Move step 5 down' }).click();
    await form.locator('[data-plan-safe]').waitFor();
    await form.getByRole('button', { name: 'Save plan' }).click();
    await section.getByRole('status').filter({ hasText: `Saved “${planName}”` }).waitFor();
    const saved = section.getByRole('listitem', { name: `Plan ${planName}` });
    await expect(saved.innerText()).resolves.toMatch(/6\.\s*Light the fire/);
    expect(eng.consoleErrors).toEqual([]);
    await screenshot(p, 'operating-plan-2-saved');
  });

  test('the engineer adds the plan to a study', async () => {
    const p = eng.page;
    await visit(p, `${studyUrl}?edit=1`);
    await p.getByRole('button', { name: '+ Operating plan' }).click();
    await p.getByLabel('Operating plan of block 3').selectOption({ label: `${rigName}: ${planName}` });
    await p.getByRole('status').filter({ hasText: /Saved \(revision/ }).waitFor({ timeout: 15_000 });
    await p.locator('[data-block="operating-plan"]').getByText(`Operating plan: ${planName}`).waitFor();
  });

  test('a viewer reads the plan in the study on a phone', async () => {
    const v = await openBrowser({ viewport: { width: 390, height: 844 } });
    try {
      await signInAs(v.page, 'viewer@cinder-hollow.test', undefined, studyUrl);
      const block = v.page.locator('[data-block="operating-plan"]');
      await block.getByText(`Operating plan: ${planName}`).waitFor();
      await expect(block.innerText()).resolves.toMatch(/Keep pumping until the coil is below 35 °C[\s\S]*No caution for this order of steps/);
      expect(await v.page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await screenshot(v.page, 'operating-plan-3-study-viewer-phone');
      expect((await axeFindings(v.page)).join('\n')).toBe('');
      // on the rig page the viewer reads the plan and cannot edit it
      await visit(v.page, rigUrl);
      const section = v.page.getByRole('region', { name: 'Operating plan' });
      await section.getByRole('listitem', { name: `Plan ${planName}` }).waitFor();
      await expect(section.getByRole('button', { name: /Edit plan|New plan/ }).count()).resolves.toBe(0);
      expect(v.consoleErrors).toEqual([]);
    } finally {
      await v.close();
    }
  });
});
