/**
 * Operating plans through the API: an engineer saves a plan of a rig and gets its cautions back
 * (the checker of analysis/safety/operating-plan.ts, tested on its own in test/analysis/safety);
 * bad input names the field and stores nothing; a viewer reads but cannot write; a member of
 * another lab does not see it (404). The hazards are DOMAIN.md §5 practice (common practice).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { Client, createAccount, signedIn, uniqueEmail } from './support/client';

let eng: Client, viewer: Client, outsider: Client;
let labId = '';
let outsiderLabId = '';
let rigId = '';
const run = Date.now().toString(36);
const LPM = 1 / 60000;

/** Safe: flow before fire, pump until the coil is cold (common practice). */
const SAFE = [
  { kind: 'valve-open', valve: 'supply' }, { kind: 'pump-on' }, { kind: 'flow-set', flowM3PerS: 12 * LPM }, { kind: 'fire-lit' },
  { kind: 'wait', minutes: 60 }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 35 }, { kind: 'pump-off' },
];

beforeAll(async () => {
  eng = await signedIn('engineer@cinder-hollow.test');
  viewer = await signedIn('viewer@cinder-hollow.test');
  labId = (await eng.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow').id;
  const r = await eng.post(`/api/labs/${labId}/rigs`, { name: `Plan rig ${run}`, heatSource: 'wood-fire', description: 'Coil for the operating-plan tests.' });
  expect(r.status, r.text).toBe(201);
  rigId = r.body.rig.id;
  const o = await createAccount(uniqueEmail('plan-outsider'), undefined, 'Outside Planner', `Plan Bench ${run}`);
  outsider = o.client;
  outsiderLabId = o.labId;
});

const count = async () => (await eng.get(`/api/rigs/${rigId}/plans`)).body.plans.length as number;

describe('operating plans of a rig', () => {
  let planId = '';
  test('the engineer saves a plan with a hazard and gets the caution at its step; fixing it clears the cautions', async () => {
    const hazard = [{ kind: 'fire-lit' }, ...SAFE.filter((s) => s.kind !== 'fire-lit')];
    const r = await eng.post(`/api/rigs/${rigId}/plans`, { name: `Morning run ${run}`, loop: { loop: 'closed', relief: 'relief-valve' }, steps: hazard });
    expect(r.status, r.text).toBe(201);
    planId = r.body.plan.id;
    expect(r.body.plan.cautions.map((c: { code: string; step: number }) => [c.code, c.step])).toEqual([['pump-after-fire', 1]]);
    expect(r.body.plan.cautions[0].message).toMatch(/follow local codes/);
    const put = await eng.request('PUT', `/api/plans/${planId}`, { name: `Morning run ${run}`, loop: { loop: 'closed', relief: 'relief-valve' }, steps: SAFE });
    expect(put.status, put.text).toBe(200);
    expect(put.body.plan.cautions).toEqual([]);
    expect(put.body.plan.steps[2]).toEqual({ kind: 'flow-set', flowM3PerS: 12 * LPM });
  });
  test('a viewer reads the plan and its list but cannot write (403), and nothing changes', async () => {
    const g = await viewer.get(`/api/plans/${planId}`);
    expect(g.status, g.text).toBe(200);
    expect(g.body.plan.steps).toHaveLength(SAFE.length);
    expect((await viewer.get(`/api/rigs/${rigId}/plans`)).body.plans.map((p: { id: string }) => p.id)).toContain(planId);
    expect((await viewer.post(`/api/rigs/${rigId}/plans`, { name: 'x', loop: { loop: 'open', relief: 'none' }, steps: SAFE })).status).toBe(403);
    expect((await viewer.request('PUT', `/api/plans/${planId}`, { name: 'x', loop: { loop: 'open', relief: 'none' }, steps: [] })).status).toBe(403);
    expect((await viewer.request('DELETE', `/api/plans/${planId}`)).status).toBe(403);
    expect((await eng.get(`/api/plans/${planId}`)).body.plan.name).toBe(`Morning run ${run}`);
  });
  test('a member of another lab gets 404 for the plan and the rig', async () => {
    expect((await outsider.get(`/api/plans/${planId}`)).status).toBe(404);
    expect((await outsider.request('PUT', `/api/plans/${planId}`, { name: 'mine', loop: { loop: 'open', relief: 'none' }, steps: SAFE })).status).toBe(404);
    expect((await outsider.request('DELETE', `/api/plans/${planId}`)).status).toBe(404);
    expect((await outsider.post(`/api/rigs/${rigId}/plans`, { name: 'mine', loop: { loop: 'open', relief: 'none' }, steps: SAFE })).status).toBe(404);
  });
  test.each([
    ['a missing name', { name: ' ', loop: { loop: 'open', relief: 'none' }, steps: SAFE }, 'name'],
    ['a flow step without its flow', { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: [{ kind: 'flow-set' }] }, 'steps.0.flowM3PerS'],
    ['a negative flow', { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: [{ kind: 'pump-on' }, { kind: 'flow-set', flowM3PerS: -1 }] }, 'steps.1.flowM3PerS'],
    ['an unknown valve', { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: [{ kind: 'valve-closed', valve: 'drain' }] }, 'steps.0.valve'],
    ['61 steps', { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: Array.from({ length: 61 }, () => ({ kind: 'pump-on' })) }, 'steps'],
    ['a field of no step', { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: [{ kind: 'pump-on', sql: 'drop' }] }, 'steps.0'],
    ['a name over 120 characters', { name: 'x'.repeat(121), loop: { loop: 'open', relief: 'none' }, steps: SAFE }, 'name'],
    ['no loop facts', { name: 'p', steps: SAFE }, 'loop'],
  ])('%s → 422 naming the field, nothing stored', async (_what, body, field) => {
    const before = await count();
    const r = await eng.post(`/api/rigs/${rigId}/plans`, body);
    expect(r.status, r.text).toBe(422);
    expect(Object.keys(r.body.fields ?? {}).some((k) => k.startsWith(field)), JSON.stringify(r.body)).toBe(true);
    expect(await count()).toBe(before);
  });
  test('an invalid edit leaves the plan as it was', async () => {
    expect((await eng.request('PUT', `/api/plans/${planId}`, { name: 'p', loop: { loop: 'open', relief: 'none' }, steps: [{ kind: 'wait' }] })).status).toBe(422);
    expect((await eng.get(`/api/plans/${planId}`)).body.plan.steps).toHaveLength(SAFE.length);
  });
  test('a rig keeps at most 50 plans: the 51st is refused and nothing is stored', async () => {
    const rig = (await eng.post(`/api/labs/${labId}/rigs`, { name: `Many plans ${run}`, heatSource: 'wood-fire' })).body.rig;
    for (let i = 0; i < 50; i++) expect((await eng.post(`/api/rigs/${rig.id}/plans`, { name: `Plan ${i}`, loop: { loop: 'open', relief: 'none' }, steps: SAFE })).status).toBe(201);
    const r = await eng.post(`/api/rigs/${rig.id}/plans`, { name: 'One more', loop: { loop: 'open', relief: 'none' }, steps: SAFE });
    expect(r.status, r.text).toBe(422);
    expect(r.body.message).toMatch(/at most 50 operating plans/);
    expect((await eng.get(`/api/rigs/${rig.id}/plans`)).body.plans).toHaveLength(50);
  });
  test('the engineer deletes a plan', async () => {
    const r = await eng.post(`/api/rigs/${rigId}/plans`, { name: `Throwaway ${run}`, loop: { loop: 'open', relief: 'none' }, steps: SAFE });
    expect((await eng.request('DELETE', `/api/plans/${r.body.plan.id}`)).status).toBe(200);
    expect((await eng.get(`/api/plans/${r.body.plan.id}`)).status).toBe(404);
  });
});

describe('an operating plan in a study', () => {
  test('the block shows the plan with the cautions it raises now (not cached), for a viewer too; the export has its Plans table', async () => {
    const p = await eng.post(`/api/rigs/${rigId}/plans`, { name: `Study plan ${run}`, loop: { loop: 'open', relief: 'none' }, steps: SAFE });
    expect(p.status, p.text).toBe(201);
    const planId = p.body.plan.id;
    const created = (await eng.post(`/api/labs/${labId}/studies`, { title: `Plan study ${run}` })).body.study;
    const put = await eng.request('PUT', `/api/studies/${created.id}`, { title: `Plan study ${run}`, baseRevision: created.revision, blocks: [{ id: 'plan', kind: 'operating-plan', data: { planId } }, { id: 'none', kind: 'operating-plan', data: {} }] });
    expect(put.status, put.text).toBe(200);
    const first = await viewer.get(`/api/studies/${created.id}/blocks/plan`);
    expect(first.status, first.text).toBe(200);
    expect(first.body.block.body).toMatchObject({ type: 'operating-plan', name: `Study plan ${run}`, rigName: `Plan rig ${run}`, planId });
    expect(first.body.block.body.plan.cautions).toEqual([]);
    expect((await viewer.get(`/api/studies/${created.id}/blocks/none`)).body.block.body).toMatchObject({ type: 'note' });
    // the plan is edited: the block follows at once (a mutable object is never kept in the block cache)
    const hot = [...SAFE.slice(0, 5), { kind: 'pump-off' }, ...SAFE.slice(5)];
    expect((await eng.request('PUT', `/api/plans/${planId}`, { name: `Study plan ${run}`, loop: { loop: 'open', relief: 'none' }, steps: hot })).status).toBe(200);
    const second = (await viewer.get(`/api/studies/${created.id}/blocks/plan`)).body.block.body;
    expect(second.plan.cautions.map((c: { code: string; step: number }) => [c.code, c.step])).toEqual([['pump-stopped-hot', 6]]);
    const csv = await viewer.get(`/api/studies/${created.id}/export?format=csv&table=Plans`);
    expect(csv.status, csv.text).toBe(200);
    expect(csv.text).toMatch(/Danger: Step 6 \(pump off\): the pump stops while the fire is still lit/);
    expect(csv.text).toMatch(/follow local codes and licensed practice/);
    expect(csv.text).toMatch(/Set the flow to 12\.0 L\/min/);
    // another lab's member does not see the study's blocks
    expect((await outsider.get(`/api/studies/${created.id}/blocks/plan`)).status).toBe(404);
    // through a share link: the plan in US units, with no links into the lab
    const made = await eng.post(`/api/studies/${created.id}/shares`, { days: 7 });
    expect(made.status, made.text).toBe(201);
    const shared = await new Client().get(`/api/share/${made.body.url.split('/share/')[1]}/blocks/plan?units=us`);
    expect(shared.status, shared.text).toBe(200);
    expect(shared.body.block.body).toMatchObject({ type: 'operating-plan', planId: null, rigId: null });
    expect(shared.text).not.toContain(planId);
    expect(shared.text).not.toContain(rigId);
    expect(shared.body.block.body.plan.cautions).toHaveLength(1);
  });
  test('a block naming a plan of another lab shows a note, never that plan', async () => {
    const theirRig = (await outsider.post(`/api/labs/${outsiderLabId}/rigs`, { name: `Their rig ${run}`, heatSource: 'wood-fire' })).body.rig;
    const theirs = await outsider.post(`/api/rigs/${theirRig.id}/plans`, { name: `Their plan ${run}`, loop: { loop: 'open', relief: 'none' }, steps: SAFE });
    expect(theirs.status, theirs.text).toBe(201);
    const created = (await eng.post(`/api/labs/${labId}/studies`, { title: `Foreign plan ${run}` })).body.study;
    const put = await eng.request('PUT', `/api/studies/${created.id}`, { title: 'x', baseRevision: created.revision, blocks: [{ id: 'p', kind: 'operating-plan', data: { planId: theirs.body.plan.id } }] });
    expect(put.status, put.text).toBe(200);
    const r = await eng.get(`/api/studies/${created.id}/blocks/p`);
    expect(r.body.block.body).toMatchObject({ type: 'note' });
    expect(r.text).not.toContain(`Their plan ${run}`);
  });
  test('a block naming something that is not an id is refused on save', async () => {
    const created = (await eng.post(`/api/labs/${labId}/studies`, { title: `Bad plan block ${run}` })).body.study;
    const put = await eng.request('PUT', `/api/studies/${created.id}`, { title: 'x', baseRevision: created.revision, blocks: [{ id: 'p', kind: 'operating-plan', data: { planId: 'drop table' } }] });
    expect(put.status, put.text).toBe(422);
  });
});
