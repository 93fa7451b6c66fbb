import { describe, expect, test } from 'vitest';
import { signedIn, mailTo } from './support/client';
import { fitCurvePlot } from '../../app/_plots';
import { plotToSvg } from '../../app/_lib/plots/plot-svg';

describe('fitting on the server and saved fits', () => {
  test('the demo coil rig: the coil model wins and the exponential shows patterned residuals', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rig = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Blue Ring Burner Loop');
    // only the generated demo trials (other tests add trials of their own to this rig)
    const all = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=500`)).body.trials as { id: string; origin: string }[];
    const trialIds = all.filter((t) => t.origin === 'demo').map((t) => t.id);
    const r = await eng.post(`/api/rigs/${rig.id}/analyze`, { models: ['coil', 'exp-inlet'], trialIds });
    expect(r.status, r.text).toBe(200);
    // The demo trials were generated from the coil model with Ts = 135 °C, UA = 260 W/K
    // (fixtures/README.md): the fit must recover them within its own 95 % intervals.
    const coil = r.body.fits.find((f: { model: string }) => f.model === 'coil');
    expect(coil.params.Ts.ciLow).toBeLessThan(135);
    expect(coil.params.Ts.ciHigh).toBeGreaterThan(135);
    expect(coil.params.UA.ciLow).toBeLessThan(260);
    expect(coil.params.UA.ciHigh).toBeGreaterThan(260);
    expect(r.body.comparison.ranking[0].model).toBe('coil');
    // the page draws the curve from the answer's numbers with the one builder (app/_plots); rendered here as the server would
    const svg = plotToSvg(fitCurvePlot(r.body.plots.curve, 'si').options);
    expect(svg).toMatch(/^<svg/);
    expect(svg).not.toMatch(/NaN/);
    expect(r.body.plots.curve.trials).toHaveLength(trialIds.length);
    // the coil model has no interior optimum (DOMAIN.md §1.2): a ceiling-fraction flow instead
    expect(r.body.choice.optimum).toBeNull();
    expect(r.body.choice.ceiling.fraction).toBe(0.9);
  });

  test('the analysis answers what the page draws; every point\'s diagnostics only with ?detail=full', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rig = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Blue Ring Burner Loop');
    const all = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=500`)).body.trials as { id: string; origin: string }[];
    const trialIds = all.filter((t) => t.origin === 'demo').map((t) => t.id);
    const lean = await eng.post(`/api/rigs/${rig.id}/analyze`, { models: ['coil'], trialIds });
    expect(lean.status, lean.text).toBe(200);
    expect(lean.body.detail).toBe('display');
    expect(lean.body.fits[0]).not.toHaveProperty('residuals');
    expect(lean.body.fits[0]).not.toHaveProperty('leverage');
    const full = await eng.post(`/api/rigs/${rig.id}/analyze?detail=full`, { models: ['coil'], trialIds });
    expect(full.status, full.text).toBe(200);
    expect(full.body.fits[0].residuals).toHaveLength(trialIds.length);
    expect(full.body.fits[0].leverage).toHaveLength(trialIds.length);
    // the same fit either way
    expect(full.body.fits[0].params).toEqual(lean.body.fits[0].params);
    expect(JSON.stringify(lean.body).length).toBeLessThan(JSON.stringify(full.body).length);
    const bad = await eng.post(`/api/rigs/${rig.id}/analyze?detail=everything`, { models: ['coil'], trialIds });
    expect(bad.status).toBe(422);
    expect(bad.body.fields.detail).toBeDefined();
  });

  test('a saved fit is recomputed from stored trials, versioned by title, reviewed, and the author is told', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rig = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
    const ids = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=500&excluded=included`)).body.trials.map((t: { id: string }) => t.id);
    const title = `review walk ${Date.now()}`;
    const v1 = await eng.post(`/api/labs/${lab.id}/fits`, { rigId: rig.id, title, model: 'coil', trialIds: ids, compareWith: ['exp-inlet'] });
    expect(v1.status, v1.text).toBe(201);
    const v2 = await eng.post(`/api/labs/${lab.id}/fits`, { rigId: rig.id, title, model: 'coil', trialIds: ids.slice(1) });
    expect(v2.body.fit.version).toBe(2);
    const saved = (await eng.get(`/api/fits/${v1.body.fit.id}`)).body.fit;
    expect(saved.trialIds).toEqual(ids);
    expect(saved.trialsHash).toMatch(/^[0-9a-f]{64}$/);
    expect(saved.softwareVersion).toMatch(/^emberline /);
    expect(saved.result.fit.params.UA.value).toBeGreaterThan(0);

    expect((await eng.post(`/api/fits/${v1.body.fit.id}/review`, { move: 'submit' })).body.reviewState).toBe('in-review');
    const rev = await signedIn('reviewer@cinder-hollow.test');
    expect((await rev.post(`/api/fits/${v1.body.fit.id}/comments`, { body: 'Residuals look random; Ts well determined.' })).status).toBe(201);
    const approved = await rev.post(`/api/fits/${v1.body.fit.id}/review`, { move: 'approve', note: 'Fine.' });
    expect(approved.body.reviewState).toBe('approved');
    const again = await rev.post(`/api/fits/${v1.body.fit.id}/review`, { move: 'approve' });
    expect(again.status).toBe(409);
    const trail = (await eng.get(`/api/fits/${v1.body.fit.id}`)).body;
    expect(trail.events.map((e: { to: string }) => e.to)).toEqual(['in-review', 'approved']);
    expect(trail.comments[0].by).toBe('Demo Reviewer');
    await new Promise((r) => setTimeout(r, 300));
    expect(mailTo('engineer@cinder-hollow.test').some((m) => m.subject === `Approved: ${title} v1`)).toBe(true);
    const xlsx = await fetch(`${process.env.EMBERLINE_URL}/api/fits/${v1.body.fit.id}/export`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(xlsx.status).toBe(200);
    expect(xlsx.headers.get('content-type')).toMatch(/spreadsheetml/);
  });
});

describe('fit exports', () => {
  test('CSV of a table carries units in the header and neutralises formula-like text (OWASP CSV injection)', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rig = (await eng.post(`/api/labs/${lab.id}/rigs`, { name: `CSV rig ${Date.now()}`, heatSource: 'electric' })).body.rig;
    // trials from the coil model of DOMAIN.md §1.2 (Ts 90 °C, UA 500 W/K, Tin 20 °C, ρ 1000, cp 4186), rounded to 0.01 K
    const trials = [3, 6, 9, 12, 15].map((lpm) => ({
      flow: `${lpm} L/min`,
      inlet: 20,
      outlet: Math.round((90 - 70 * Math.exp(-500 / ((lpm / 60) * 4186))) * 100) / 100,
      notes: lpm === 3 ? '=HYPERLINK("http://attacker.example","x")' : '',
    }));
    const made = await eng.post(`/api/rigs/${rig.id}/trials`, { trials });
    expect(made.status, made.text).toBe(201);
    const fit = (await eng.post(`/api/labs/${lab.id}/fits`, { rigId: rig.id, title: 'csv', model: 'coil', trialIds: made.body.trials.map((t: { id: string }) => t.id) })).body.fit;
    const get = (q: string) => fetch(`${process.env.EMBERLINE_URL}/api/fits/${fit.id}/export${q}`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    const res = await get('?format=csv&table=Trials');
    expect(res.status).toBe(200);
    const csv = await res.text();
    // the safety notice comes first as "# " comment lines (DOMAIN.md §5 thresholds), then the header
    const lines = csv.split('\r\n');
    expect(lines[0]).toMatch(/^# Safety: temperatures at or above 40 °C/);
    expect(lines.find((l) => !l.startsWith('#'))).toMatch(/flow_L_per_min/);
    expect(csv).not.toMatch(/(^|,)"?=HYPERLINK/m);
    expect(csv).toContain("'=HYPERLINK");
    expect((await get('?format=csv&table=Nope')).status).toBe(422);
  });
});

describe('fits on data that cannot decide a parameter', () => {
  // Flat outlets at every flow cannot tell UA (closed form, DOMAIN.md §1.2: Tout → Ts at low flow, →
  // Tin at high flow; with neither seen, any UA with Ts at the level fits as well).
  test('the analysis says "not identifiable: UA" in its warnings, and the saved fit keeps it', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const rig = (await eng.post(`/api/labs/${lab.id}/rigs`, { name: `Flat rig ${Date.now()}`, heatSource: 'wood-fire' })).body.rig;
    const trials = [3, 5, 7, 9, 11, 13, 15, 17].map((lpm, i) => ({ flow: `${lpm} L/min`, inlet: '18 degC', outlet: `${45 + (i % 2 ? 0.02 : -0.02)} degC` }));
    expect((await eng.post(`/api/rigs/${rig.id}/trials`, { trials })).status).toBe(201);
    const a = await eng.post(`/api/rigs/${rig.id}/analyze`, { models: ['coil'] });
    expect(a.status, a.text).toBe(200);
    const w = a.body.fits[0].warnings.find((x: { code: string }) => x.code === 'not-identifiable');
    expect(w.message).toMatch(/^not identifiable: UA/);
    expect(w.parameter).toBe('UA');
  });
});
