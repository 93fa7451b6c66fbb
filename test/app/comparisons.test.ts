/**
 * Design comparisons through the API: an engineer saves a comparison of two coil rigs, a reviewer
 * comments, a viewer reads and exports it; the bounds of the body and the lab of every design.
 * The trials are the constant-source coil of DOMAIN.md §1.2 (ε–NTU with Cr → 0) with the water
 * properties the app uses (IAPWS-IF97 ρ at the outlet, cp at the mean), so the fits recover the
 * generating Ts and UA; the numbers of the comparison itself are tested in test/analysis/compare.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { coilOutletC } from '@/fixtures/demo-lab';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '@/analysis/water/water-properties';
import { Client, signedIn } from './support/client';

const LPM = 1 / 60000;
const TIN = 18;

/** Trials of a coil (Ts °C, UA W/K) at round flows with a deterministic ±0.1 K wiggle (our own numbers). */
function coilTrials(ts: number, ua: number, tag: string) {
  const flows = [3, 4.5, 6, 8, 10, 12, 14, 16, 18, 10];
  const start = Date.UTC(2026, 6, 1, 9);
  return flows.map((q, i) => {
    let out = TIN + 20;
    for (let k = 0; k < 8; k++) out = coilOutletC(ts, TIN, ua, waterDensityKgPerM3(out) * q * LPM, waterCpJPerKgK((TIN + out) / 2));
    return { startedAt: new Date(start + i * 600_000).toISOString(), flow: q * LPM, inlet: TIN, outlet: Math.round((out + ((i % 3) - 1) * 0.1) * 100) / 100, notes: `${tag} ${i + 1}` };
  });
}

let eng: Client, reviewer: Client, viewer: Client;
let labId: string;
const rigs: Record<'a' | 'b', string> = { a: '', b: '' };
let comparisonId = '';
const run = Date.now().toString(36);

beforeAll(async () => {
  eng = await signedIn('engineer@cinder-hollow.test');
  reviewer = await signedIn('reviewer@cinder-hollow.test');
  viewer = await signedIn('viewer@cinder-hollow.test');
  labId = (await eng.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow').id;
  for (const [k, ua, len] of [['a', 400, 12], ['b', 520, 16]] as const) {
    const r = await eng.post(`/api/labs/${labId}/rigs`, {
      name: `Compare ${k.toUpperCase()} ${run}`, heatSource: 'wood-fire', description: 'Coil for the comparison tests.',
      details: { coilLengthM: len, buildCost: k === 'a' ? 80 : 104, buildCostCurrency: 'USD' },
    });
    expect(r.status, r.text).toBe(201);
    rigs[k] = r.body.rig.id;
    const t = await eng.post(`/api/rigs/${rigs[k]}/trials`, { trials: coilTrials(85, ua, `compare ${k}`) });
    expect(t.status, t.text).toBe(201);
  }
});

describe('a comparison of two coil rigs', () => {
  test('the engineer saves it; the numbers come back with intervals that hold the generating values', async () => {
    const r = await eng.post(`/api/labs/${labId}/comparisons`, {
      title: `Longer coil ${run}`, subjects: [{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: rigs.b }], inletTempC: TIN, flowM3PerS: 10 * LPM,
    });
    expect(r.status, r.text).toBe(201);
    comparisonId = r.body.comparison.id;
    const g = await viewer.get(`/api/comparisons/${comparisonId}`);
    expect(g.status, g.text).toBe(200);
    const v = g.body.view;
    expect(v.designs.map((d: { key: string }) => d.key)).toEqual(['A', 'B']);
    const pair = v.pairs[0];
    // UA_B/UA_A = 520/400 = 1.3 and Ts_B − Ts_A = 0 by construction: both inside their delta-method intervals
    expect(pair.uaRatio.ciLow).toBeLessThan(1.3);
    expect(pair.uaRatio.ciHigh).toBeGreaterThan(1.3);
    expect(pair.tsDifferenceK.ciLow).toBeLessThan(0);
    expect(pair.tsDifferenceK.ciHigh).toBeGreaterThan(0);
    expect(pair.uaRatio.bootstrap.ciLow).toBeLessThan(pair.uaRatio.value);
    expect(pair.uaRatio.bootstrap.ciHigh).toBeGreaterThan(pair.uaRatio.value);
    // heat at 10 L/min and 18 °C inlet from the closed form q = ṁ·cp·(Ts − Tin)·(1 − e^(−UA/ṁcp)) (DOMAIN.md §1.2):
    // the percentage difference does not depend on the ρ and cp taken, to first order
    const mcp = waterDensityKgPerM3(TIN) * 10 * LPM * waterCpJPerKgK(40);
    const q = (ua: number) => mcp * (85 - TIN) * (1 - Math.exp(-ua / mcp));
    const truePct = 100 * (q(520) / q(400) - 1);
    expect(pair.heatDifferencePercent.ciLow).toBeLessThan(truePct);
    expect(pair.heatDifferencePercent.ciHigh).toBeGreaterThan(truePct);
    expect(pair.verdict).toMatch(new RegExp(`^Compare B ${run} delivers \\d+(\\.\\d)?–\\d+(\\.\\d)? % more heat at 10 L/min than Compare A ${run}\\.$`));
    // per metre of tube and per unit of build cost, from the rigs' own records
    for (const d of v.designs) {
      expect(d.heatW.ciLow).toBeLessThan(q(d.key === 'A' ? 400 : 520) * 1.01);
      expect(d.heatW.ciHigh).toBeGreaterThan(q(d.key === 'A' ? 400 : 520) * 0.99);
      expect(d.heatPerMetreW).toBeCloseTo(d.heatW.value / (d.key === 'A' ? 12 : 16), 6);
      expect(d.heatPerCostW).toBeCloseTo(d.heatW.value / (d.key === 'A' ? 80 : 104), 6);
      expect(d.params.map((p: { name: string }) => p.name)).toEqual(['Ts', 'UA']);
    }
    expect(v.plots.outlet.svg).toMatch(/^<svg/);
    expect(v.plots.heat.svg).not.toMatch(/NaN/);
  });

  test('a reviewer comments; a viewer reads the comments and may not write one', async () => {
    const c = await reviewer.post(`/api/comparisons/${comparisonId}/comments`, { body: 'Say how the two coils were wound.' });
    expect(c.status, c.text).toBe(201);
    expect((await viewer.get(`/api/comparisons/${comparisonId}/comments`)).body.comments.map((x: { body: string }) => x.body)).toContain('Say how the two coils were wound.');
    expect((await viewer.post(`/api/comparisons/${comparisonId}/comments`, { body: 'hello' })).status).toBe(403);
  });

  test('a viewer exports it: the XLSX file and the Comparison table as CSV with its safety lines', async () => {
    const x = await viewer.get(`/api/comparisons/${comparisonId}/export`);
    expect(x.status).toBe(200);
    expect(x.headers.get('content-type')).toMatch(/spreadsheetml/);
    const csv = await viewer.get(`/api/comparisons/${comparisonId}/export?format=csv&table=Comparison`);
    expect(csv.status, csv.text).toBe(200);
    expect(csv.text).toMatch(/^# /);
    expect(csv.text).toMatch(/UA ratio/);
    expect(csv.text).toMatch(/Heat per length of tube/);
    expect(csv.text).toMatch(/Heat per unit of build cost/);
    expect(csv.text).toMatch(/delivers .* % more heat/);
  });

  test('a study shows it as a block, and its share link carries no ids into the lab', async () => {
    const created = (await eng.post(`/api/labs/${labId}/studies`, { title: `Comparison study ${run}` })).body.study;
    const loaded = (await eng.get(`/api/studies/${created.id}`)).body.study;
    const blocks = [...loaded.blocks, { id: 'cmp1', kind: 'design-comparison', data: { comparisonId } }];
    const saved = await eng.request('PUT', `/api/studies/${created.id}`, { title: created.title, baseRevision: loaded.revision, blocks });
    expect(saved.status, saved.text).toBe(200);
    const member = (await viewer.get(`/api/studies/${created.id}/blocks/cmp1`)).body.block.body;
    expect(member.type).toBe('design-comparison');
    expect(member.comparisonId).toBe(comparisonId);
    expect(member.view.designs[0].rigId).toBe(rigs.a);
    const share = await eng.post(`/api/studies/${created.id}/shares`, { days: 1 });
    const token = String(share.body.url).split('/share/')[1];
    const shared = (await new Client().get(`/api/share/${token}/blocks/cmp1?units=us`)).body.block.body;
    expect(shared.type).toBe('design-comparison');
    expect(shared.comparisonId).toBeNull();
    expect(shared.view.designs.map((d: { id: string | null; rigId: string | null }) => [d.id, d.rigId])).toEqual([[null, null], [null, null]]);
    expect(JSON.stringify(shared)).not.toContain(rigs.a);
    expect(shared.view.plots.outlet.svg).toMatch(/gpm/);
    // a comparison id that is no UUID is refused on save, naming the field
    const bad = await eng.request('PUT', `/api/studies/${created.id}`, { title: created.title, baseRevision: saved.body.study.revision, blocks: [{ id: 'cmp1', kind: 'design-comparison', data: { comparisonId: 'nope' } }] });
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body.fields)).toMatch(/comparisonId/);
  });

  test('it is listed for every member', async () => {
    const l = await viewer.get(`/api/labs/${labId}/comparisons`);
    expect(l.body.comparisons.some((c: { id: string }) => c.id === comparisonId)).toBe(true);
  });
});

describe('bounds and authorization of the body', () => {
  const body = (subjects: unknown[], extra: object = {}) => ({ title: `bounds ${run}`, subjects, ...extra });
  test('more than four designs, one design, the same design twice, a flow out of range: 422 naming the field', async () => {
    const five = Array.from({ length: 5 }, () => ({ kind: 'rig', id: rigs.a }));
    const r5 = await eng.post(`/api/labs/${labId}/comparisons`, body(five));
    expect(r5.status).toBe(422);
    expect(r5.body.fields.subjects).toMatch(/at most 4/);
    expect((await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }]))).body.fields.subjects).toMatch(/at least two/);
    const twice = await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: rigs.a }]));
    expect(twice.status).toBe(422);
    expect(twice.body.fields['subjects.1']).toMatch(/twice/);
    const flow = await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: rigs.b }], { flowM3PerS: 5 }));
    expect(flow.status).toBe(422);
    expect(flow.body.fields.flowM3PerS).toBeTruthy();
    const extra = await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: rigs.b }], { result: 'forged' }));
    expect(extra.status).toBe(422);
  });
  test('a design that is not in the lab (unknown id, or no UUID) is not found, and nothing is saved', async () => {
    const before = (await eng.get(`/api/labs/${labId}/comparisons`)).body.comparisons.length;
    expect((await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'fit', id: '00000000-0000-4000-8000-000000000000' }]))).status).toBe(404);
    expect((await eng.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: "x' or 1=1 --" }]))).status).toBe(404);
    expect((await eng.get(`/api/labs/${labId}/comparisons`)).body.comparisons.length).toBe(before);
  });
  test('a viewer may not save a comparison', async () => {
    expect((await viewer.post(`/api/labs/${labId}/comparisons`, body([{ kind: 'rig', id: rigs.a }, { kind: 'rig', id: rigs.b }]))).status).toBe(403);
  });
});
