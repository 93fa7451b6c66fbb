/**
 * The collector efficiency test in the app (ISO 9806 steady-state form): a solar-collector rig,
 * trials with irradiance and ambient, the analysis route, a saved collector fit (immutable,
 * reviewable, exportable) and the refusals. The trials are made from the curve of the Solar
 * Keymark data sheet DS 3663 (ISO 9806:2017, gross area 2.02 m²: η0 = 1480/2020, a1 3.51 W/(m²·K),
 * a2 0.017 W/(m²·K²); DOMAIN.md §4 and check value #14 [16]), so the fit must give them back.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { collectorOutlet, type CollectorParameters } from '@/analysis/performance/collector-efficiency';
import { signedIn, type Client } from './support/client';

const DS3663: CollectorParameters = { areaM2: 2.02, areaBasis: 'gross', peakPowerW: 1480, a1WPerM2K: 3.51, a2WPerM2K2: 0.017 };
const CP = 4186;
const RHO = 1000;
const APERTURE_M2 = 1.8;

/** Four inlet temperatures, the first near ambient, four irradiances each, 0.02 kg/(s·m²) (ISO 9806-1:1994 plan, DOMAIN.md §2.4 [11]). */
function trials() {
  const m = 0.02 * DS3663.areaM2;
  const out: Record<string, unknown>[] = [];
  let k = 0;
  for (const tin of [22, 40, 60, 80]) {
    for (const g of [850, 900, 950, 1000]) {
      const o = collectorOutlet(DS3663, { inletTempC: tin, ambientTempC: 21, irradianceWPerM2: g, massFlowKgPerS: m, cpJPerKgK: CP });
      out.push({ startedAt: new Date(Date.UTC(2026, 6, 2, 9, k++ * 15)).toISOString(), flow: m / RHO, inlet: tin, outlet: o.outletTempC, ambient: 21, irradiance: g, wind: 3 });
    }
  }
  return out;
}

describe('collector efficiency test of a solar-collector rig', () => {
  let eng: Client;
  let viewer: Client;
  let labId = '';
  let rigId = '';
  beforeAll(async () => {
    eng = await signedIn('engineer@cinder-hollow.test');
    viewer = await signedIn('viewer@cinder-hollow.test');
    labId = (await eng.get('/api/me')).body.labs[0].id;
    const rig = await eng.post(`/api/labs/${labId}/rigs`, {
      name: `Collector test ${Date.now().toString(36)}`, heatSource: 'solar-collector',
      details: { grossAreaM2: 2.02, apertureAreaM2: APERTURE_M2, tiltDeg: 35, azimuthDeg: 180, fluid: 'water', fluidCpJPerKgK: CP, fluidDensityKgPerM3: RHO, flowPerAreaM3PerSM2: 0.02 / RHO },
    });
    expect(rig.status, rig.text).toBe(201);
    rigId = rig.body.rig.id;
    const bulk = await eng.post(`/api/rigs/${rigId}/trials`, { trials: trials() });
    expect(bulk.status, bulk.text).toBe(201);
    // a trial without irradiance (a cloudy note) is skipped by the test, not fitted
    expect((await eng.post(`/api/rigs/${rigId}/trials`, { flow: 0.04 / RHO, inlet: 30, outlet: 31, ambient: 21 })).status).toBe(201);
  });

  test('gives back the DS 3663 coefficients on the gross area, with the trial without irradiance listed as skipped', async () => {
    const r = await eng.post(`/api/rigs/${rigId}/collector`, { areaBasis: 'gross' });
    expect(r.status, r.text).toBe(200);
    expect(r.body.areaBasis).toBe('gross');
    expect(r.body.areaM2).toBe(2.02);
    expect(r.body.n).toBe(16);
    expect(r.body.eta0.value).toBeCloseTo(1480 / 2020, 8); // η0 = P0/(A·G*), EN 12975 power curve [14]
    expect(r.body.a1WPerM2K.value).toBeCloseTo(3.51, 6);
    expect(r.body.a2WPerM2K2.value).toBeCloseTo(0.017, 7);
    expect(r.body.covariance).toHaveLength(3);
    expect(r.body.skipped).toEqual([expect.objectContaining({ reason: 'no irradiance' })]);
    expect(r.body.plots.curve.svg).toMatch(/^<svg/);
  });

  test('on the aperture area the same power gives coefficients × A_gross/A_aperture (the area basis is stated: ISO 9806 [13c])', async () => {
    const r = await eng.post(`/api/rigs/${rigId}/collector`, { areaBasis: 'aperture' });
    expect(r.status, r.text).toBe(200);
    const k = 2.02 / APERTURE_M2;
    expect(r.body.areaBasis).toBe('aperture');
    expect(r.body.eta0.value).toBeCloseTo((1480 / 2020) * k, 8);
    expect(r.body.a1WPerM2K.value).toBeCloseTo(3.51 * k, 6);
    expect(r.body.a2WPerM2K2.value).toBeCloseTo(0.017 * k, 7);
  });

  test('bad settings and wrong rigs get a clear 422 and nothing is stored', async () => {
    expect((await eng.post(`/api/rigs/${rigId}/collector`, { areaBasis: 'absorber' })).status).toBe(422);
    expect((await eng.post(`/api/rigs/${rigId}/collector`, { order: 3 })).status).toBe(422);
    const fire = await eng.post(`/api/labs/${labId}/rigs`, { name: `Not a collector ${Date.now().toString(36)}`, heatSource: 'wood-fire' });
    const r = await eng.post(`/api/rigs/${fire.body.rig.id}/collector`, {});
    expect(r.status).toBe(422);
    expect(r.body.message).toMatch(/not a solar collector/);
    const bare = await eng.post(`/api/labs/${labId}/rigs`, { name: `Bare collector ${Date.now().toString(36)}`, heatSource: 'solar-collector' });
    const noArea = await eng.post(`/api/rigs/${bare.body.rig.id}/collector`, { areaBasis: 'gross' });
    expect(noArea.status).toBe(422);
    expect(noArea.body.fields.areaBasis).toMatch(/no gross area/);
    const bigAperture = await eng.post(`/api/labs/${labId}/rigs`, { name: `Odd collector ${Date.now().toString(36)}`, heatSource: 'solar-collector', details: { grossAreaM2: 1, apertureAreaM2: 2 } });
    expect(bigAperture.status).toBe(422);
    expect(bigAperture.body.fields['details.apertureAreaM2']).toMatch(/cannot be larger than the gross area/);
  });

  test('a saved collector fit is immutable, has kind collector, reads back and exports; a viewer reads and exports but cannot save', async () => {
    const saved = await eng.post(`/api/rigs/${rigId}/collector/fits`, { title: 'DS 3663 curve', areaBasis: 'gross' });
    expect(saved.status, saved.text).toBe(201);
    expect(saved.body.fit.kind).toBe('collector');
    const id = saved.body.fit.id;
    const read = await viewer.get(`/api/fits/${id}`);
    expect(read.status).toBe(200);
    expect(read.body.fit.result.test.a1WPerM2K.value).toBeCloseTo(3.51, 6);
    expect(read.body.fit.modelLabel).toMatch(/ISO 9806/);
    const csv = await viewer.get(`/api/fits/${id}/export?format=csv&table=Collector`);
    expect(csv.status, csv.text).toBe(200);
    expect(csv.text).toMatch(/η0/);
    const xlsx = await viewer.get(`/api/fits/${id}/export`);
    expect(xlsx.status).toBe(200);
    expect(xlsx.headers.get('content-type')).toMatch(/spreadsheetml/);
    expect((await viewer.post(`/api/rigs/${rigId}/collector/fits`, { title: 'not mine', areaBasis: 'gross' })).status).toBe(403);
    const again = await eng.post(`/api/rigs/${rigId}/collector/fits`, { title: 'DS 3663 curve', areaBasis: 'gross' });
    expect(again.body.fit.version).toBe(2);
    const page = await viewer.get(`/fits/${id}`);
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/gross area/);
  });
});
