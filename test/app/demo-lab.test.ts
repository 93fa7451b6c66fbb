/**
 * The demo lab as `npm start` and `npm test` load it (scripts/seed.ts, fixtures/README.md): saved
 * fits in every review state with the reviewer's comment on the one in review, a study in review
 * with fit, forecast, cost and caution blocks, a live share link, a sensor log imported by a
 * completed job, a comparison of the two coils, and for each role a landing that shows what it
 * does next. The coils were generated with UA 430 and 560 W/K on the same fire (fixtures/demo-lab.ts),
 * so the comparison must find the longer coil ahead (DOMAIN.md §1.2: q rises with UA at a given flow).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { demoWork } from '@/fixtures/demo-lab';
import { demoPlan } from '@/fixtures/demo-plan';
import { signedIn, type Client } from './support/client';

let eng: Client;
let labId: string;
beforeAll(async () => {
  eng = await signedIn('engineer@cinder-hollow.test');
  labId = (await eng.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow').id;
});

describe('the demo lab', () => {
  test('has saved fits in each review state; the one in review carries a reviewer\'s comment', async () => {
    const fits = (await eng.get(`/api/labs/${labId}/fits`)).body.fits as { id: string; title: string; reviewState: string; createdBy: string }[];
    for (const f of demoWork.fits) {
      const row = fits.find((x) => x.title === f.title && x.createdBy === 'Demo Engineer');
      expect(row, f.title).toBeTruthy();
      expect(row!.reviewState, f.title).toBe(f.state);
    }
    expect(new Set(demoWork.fits.map((f) => f.state))).toEqual(new Set(['draft', 'in-review', 'approved', 'changes-requested']));
    const inReview = fits.find((x) => x.title === demoWork.fits.find((f) => f.state === 'in-review')!.title)!;
    const trail = (await eng.get(`/api/fits/${inReview.id}/comments`)).body;
    expect(trail.comments.some((c: { by: string }) => c.by === 'Demo Reviewer')).toBe(true);
    expect(trail.events.map((e: { to: string }) => e.to)).toEqual(['in-review']);
  });

  test('its coil rig has an operating plan in the safe order, which raises no caution (DOMAIN.md §5; common practice)', async () => {
    const rigs = (await eng.get(`/api/labs/${labId}/rigs`)).body.rigs as { id: string; name: string }[];
    const rig = rigs.find((r) => r.name === demoPlan.rig)!;
    const plans = (await eng.get(`/api/rigs/${rig.id}/plans`)).body.plans as { name: string; steps: unknown[]; cautions: unknown[] }[];
    expect(plans.map((p) => p.name)).toEqual([demoPlan.name]);
    expect(plans[0].steps).toHaveLength(demoPlan.steps.length);
    expect(plans[0].cautions).toEqual([]);
  });

  test('has a study in review with fit, forecast, cost and caution blocks that all compute, and a live share link', async () => {
    const studies = (await eng.get(`/api/labs/${labId}/studies`)).body.studies as { id: string; title: string; reviewState: string }[];
    const s = studies.find((x) => x.title === demoWork.study.title)!;
    expect(s.reviewState).toBe('in-review');
    const study = (await eng.get(`/api/studies/${s.id}`)).body.study;
    const kinds = study.blocks.map((b: { kind: string }) => b.kind);
    for (const k of ['fit', 'forecast', 'costs', 'caution', 'design-comparison', 'tub-fill']) expect(kinds).toContain(k);
    for (const b of study.blocks) {
      const r = await eng.get(`/api/studies/${s.id}/blocks/${b.id}`);
      expect(r.status, r.text).toBe(200);
      expect(r.body.block.body.type, `${b.kind}: ${JSON.stringify(r.body.block.body).slice(0, 300)}`).not.toBe('note');
      // the cost sheet's season compares the build (the rig's cost) with a purchased heater
      if (b.kind === 'costs') expect(r.body.block.body.cost.season.payback.buildBasis).toMatch(/the build cost of the rig/);
    }
    const shares = (await eng.get(`/api/studies/${s.id}/shares`)).body.shares as { revokedAt: string | null; expiresAt: string }[];
    expect(shares.some((l) => !l.revokedAt && Date.parse(l.expiresAt) > Date.now())).toBe(true);
  });

  test('has a sensor log imported by a completed background job, whose periods became trials', async () => {
    const rig = (await eng.get(`/api/labs/${labId}/rigs`)).body.rigs.find((r: { name: string }) => r.name === demoWork.log.rig);
    const jobs = (await eng.get(`/api/rigs/${rig.id}/jobs`)).body.jobs as { state: string; result: { trials: number; samples: number } | null }[];
    const done = jobs.find((j) => j.state === 'completed');
    expect(done, JSON.stringify(jobs)).toBeTruthy();
    // four plateaus of 900 s at 1 Hz (fixtures/demo-lab.ts demoSensorLogCsv)
    expect(done!.result!.samples).toBe(3600);
    expect(done!.result!.trials).toBe(4);
  });

  test('has a comparison of the two coils that finds the longer coil ahead, with a reviewer\'s comment', async () => {
    const list = (await eng.get(`/api/labs/${labId}/comparisons`)).body.comparisons as { id: string; title: string }[];
    const c = list.find((x) => x.title === demoWork.comparison.title)!;
    const v = (await eng.get(`/api/comparisons/${c.id}`)).body.view;
    expect(v.designs.map((d: { label: string }) => d.label)).toEqual(demoWork.comparison.rigs);
    expect(v.pairs[0].uaRatio.ciLow).toBeGreaterThan(1);
    expect(v.pairs[0].verdict).toMatch(/^Stovepipe Coil B delivers [\d.]+–[\d.]+ % more heat at 10 L\/min than Stovepipe Coil A\.$/);
    expect(v.designs.every((d: { heatPerMetreW: number | null; heatPerCostW: number | null }) => d.heatPerMetreW !== null && d.heatPerCostW !== null)).toBe(true);
    expect((await eng.get(`/api/comparisons/${c.id}/comments`)).body.comments[0].by).toBe('Demo Reviewer');
  });

  test.each([
    ['engineer', 'Your open work', 'Burner loop, July'],
    ['reviewer', 'Your review queue', 'Long coil, first firing'],
    ['viewer', 'Studies to read', 'Which coil for the backyard pool'],
    ['owner', 'Your team', 'viewer@cinder-hollow.test'],
  ])('signing in as the %s lands on "%s"', async (role, heading, item) => {
    const c = await signedIn(`${role}@cinder-hollow.test`);
    const signIn = await c.get('/sign-in');
    expect(signIn.status).toBeGreaterThanOrEqual(300);
    expect(signIn.status).toBeLessThan(400);
    expect(signIn.headers.get('location')).toMatch(/\/start$/);
    const page = await c.get('/start');
    expect(page.status).toBe(200);
    expect(page.text).toContain(heading);
    expect(page.text).toContain(item);
  });
});
