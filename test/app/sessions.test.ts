/**
 * Test sessions through the real API: planning (the plan's runs are analysis/plan planSession's,
 * checked there against published designs and brute force), readings from the phone (the one trial
 * rule, idempotent by the phone's id, questioned outside the prediction interval, the drift check),
 * a logger streaming a synthetic 1 Hz log for 40 simulated minutes (sped up) with the steady signal
 * flipping and the steady periods becoming trials, a dropped and retried batch stored once, bad
 * batches refused with nothing stored, the live event stream, closing and the study.
 *
 * The synthetic rig follows the constant-source coil model (DOMAIN.md §1.2): Tout = Ts − (Ts − Tin)·e^(−UA/(ṁ·cp)),
 * Ts = 85 °C, UA = 400 W/K, Tin = 18 °C (round numbers of our own, as test/app/support/authz.ts).
 */
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PASSWORD, coilOutletC } from '@/fixtures/demo-lab';
import { generatePlateauLog } from '@/analysis/segment';
import { planSession } from '@/analysis/plan/plan-session';
import { baseUrl, Client, createAccount, uniqueEmail, type Reply } from './support/client';
import { labA, rigWithTrials, setAddressRange } from './support/authz';

setAddressRange('203.0.113.');

const LPM = 1 / 60000;
const TS = 85, UA = 400, TIN = 18;
const outletAt = (flowM3PerS: number) => coilOutletC(TS, TIN, UA, flowM3PerS * 990, 4180);

function ok(r: Reply, status: number, what: string) {
  expect(r.status, `${what}: ${r.text.slice(0, 500)}`).toBe(status);
  return r.body;
}

let eng: Client;
let viewer: Client;
let labId: string;
let rigId: string;
let fitId: string;
let tokenA: Client;
let tokenB: Client;

const planBody = { prior: { Ts: `${TS} degC`, UA: `${UA} W/K` }, inletTemp: `${TIN} degC`, flowRange: ['2 L/min', '20 L/min'], maxOutletTemp: '95 degC', trials: 8, seed: 7 };

function bearer(secret: string) {
  const c = new Client();
  c.origin = null;
  c.bearer = secret;
  return c;
}

beforeAll(async () => {
  const a = await labA();
  eng = a.clients.engineer;
  viewer = a.clients.viewer;
  labId = a.labId;
  const r = await rigWithTrials(eng, labId, `Session rig ${Date.now().toString(36)}`);
  rigId = r.rig.id;
  fitId = ok(await eng.post(`/api/labs/${labId}/fits`, { rigId, title: `Session prior ${Date.now().toString(36)}`, model: 'coil', trialIds: r.trialIds }), 201, 'fit').fit.id;
  tokenA = bearer(ok(await eng.post('/api/tokens', { name: `logger ${Date.now().toString(36)}`, labId, password: DEMO_PASSWORD }), 201, 'token A').secret);
  const outsider = await createAccount(uniqueEmail('session-outsider'), undefined, 'Outside Logger', `Other Bench ${Date.now().toString(36)}`);
  tokenB = bearer(ok(await outsider.client.post('/api/tokens', { name: 'logger B', labId: outsider.labId, password: 'copper coil over a slow fire' }), 201, 'token B').secret);
});

describe('planning a session', () => {
  test('a preview answers the plan of analysis/plan planSession at the same input and stores nothing', async () => {
    const before = ok(await eng.get(`/api/rigs/${rigId}/sessions`), 200, 'list').sessions.length;
    const r = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, preview: true }), 200, 'preview');
    const direct = planSession({ model: 'coil', prior: { values: { Ts: TS, UA } }, inletTempC: TIN, flowRangeM3PerS: [2 * LPM, 20 * LPM], maxOutletTempC: 95, trials: 8, seed: 7 });
    expect(direct.ok).toBe(true);
    if (!direct.ok) return;
    expect(r.runs.map((x: { flowM3PerS: number }) => x.flowM3PerS)).toEqual(direct.runs.map((x) => x.flowM3PerS));
    expect(r.plan.dEfficiency).toBeCloseTo(direct.dEfficiency, 12);
    expect(r.plan.evenlySpaced.dEfficiency).toBeLessThan(r.plan.dEfficiency);
    expect(Object.keys(r.plan.expectedStdErr)).toEqual(['Ts', 'UA']);
    for (const run of r.runs) expect(run.piHighC).toBeLessThanOrEqual(95);
    expect(ok(await eng.get(`/api/rigs/${rigId}/sessions`), 200, 'list').sessions).toHaveLength(before);
  });

  test('saved with the rig, from a guess or from a saved fit of the lab', async () => {
    const s = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, title: 'Guess plan' }), 201, 'save').session;
    expect(s.state).toBe('planned');
    expect(s.runs).toHaveLength(8);
    expect(s.runs[0].purpose).toBe('reference');
    expect(s.runs[7].purpose).toBe('reference');
    expect(s.settings.prior.source).toBe('guess');
    const f = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, prior: { fitId }, title: 'Fit plan' }), 201, 'from fit').session;
    expect(f.settings.prior.source).toBe('fit');
    expect(f.settings.prior.fitId).toBe(fitId);
    const listed = ok(await viewer.get(`/api/rigs/${rigId}/sessions`), 200, 'list').sessions.map((x: { id: string }) => x.id);
    expect(listed).toEqual(expect.arrayContaining([s.id, f.id]));
  });

  test.each([
    ['trials', { ...planBody, trials: 3 }],
    ['flowRange', { ...planBody, flowRange: ['20 L/min', '2 L/min'] }],
    ['prior.UA', { ...planBody, prior: { Ts: '85 degC' } }],
    ['inletTemp', { ...planBody, inletTemp: 'warm' }],
    ['', { ...planBody, trials: 8, extra: 1 }],
  ])('a bad plan → 422 naming "%s"', async (field, body) => {
    const r = await eng.post(`/api/rigs/${rigId}/sessions`, body);
    expect(r.status, r.text).toBe(422);
    if (field) expect(Object.keys(r.body.fields ?? {}).join(' ')).toContain(field);
  });

  test('no safe flow → 422 with the reason; a viewer may not plan (403); a fit of another lab is not found', async () => {
    const hot = await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, prior: { Ts: '140 degC', UA: '2000 W/K' }, flowRange: ['1 L/min', '2 L/min'], maxOutletTemp: '60 degC' });
    expect(hot.status, hot.text).toBe(422);
    expect(hot.body.message).toMatch(/no flow|safe/i);
    expect((await viewer.post(`/api/rigs/${rigId}/sessions`, planBody)).status).toBe(403);
    expect((await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, prior: { fitId: randomUUID() } })).status).toBe(404);
  });
});

describe('readings from the phone', () => {
  let s: any;
  beforeAll(async () => {
    s = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, title: 'Phone session' }), 201, 'session').session;
  });
  const reading = (run: any, outlet: number, id = randomUUID(), inlet = TIN) => ({ id, runKey: run.key, flow: run.flowM3PerS, inlet, outlet, startedAt: new Date().toISOString() });

  test('a reading inside the interval is saved as a trial of the session; the same id again is the same trial', async () => {
    const run = s.runs[0];
    const body = reading(run, Math.round(run.predictedOutletTempC * 10) / 10);
    const a = ok(await eng.post(`/api/sessions/${s.id}/readings`, body), 201, 'reading');
    expect(a.check.inside).toBe(true);
    expect(a.trial.id).toBe(body.id);
    expect(a.trial.isReference).toBe(true);
    expect(a.session.runs[0].state).toBe('done');
    expect(a.session.state).toBe('running');
    const again = ok(await eng.post(`/api/sessions/${s.id}/readings`, body), 200, 'retry');
    expect(again.duplicate).toBe(true);
    expect(again.session.trials).toHaveLength(1);
  });

  test('a reading outside the interval is questioned, never refused: kept with a note', async () => {
    const run = s.runs[1];
    const r = ok(await eng.post(`/api/sessions/${s.id}/readings`, reading(run, run.piHighC + 5)), 201, 'outside');
    expect(r.check.inside).toBe(false);
    expect(r.check.message).toMatch(/above the predicted/);
    expect(r.trial.notes).toMatch(/Outside the predicted .* kept/);
  });

  test('the prediction moves with the inlet read (coil: ∂Tout/∂Tin = 1 − ε, DOMAIN.md §1.2)', async () => {
    const run = s.runs[2];
    const eps = (run.predictedOutletTempC - TIN) / (TS - TIN);
    const warmer = TIN + 5;
    const expected = TS - (TS - warmer) * (1 - eps);
    const r = ok(await eng.post(`/api/sessions/${s.id}/readings`, reading(run, Math.round(expected * 10) / 10, randomUUID(), warmer)), 201, 'warmer inlet');
    expect(r.check.inside).toBe(true);
    // within 0.3 K: the model's water density and cp follow the inlet too (IAPWS-IF97), which fixed-property 1 − ε leaves out
    expect(Math.abs(r.check.predictedOutletTempC - expected)).toBeLessThan(0.3);
    expect(r.check.predictedOutletTempC).toBeGreaterThan(run.predictedOutletTempC + 5 * (1 - eps) * 0.9);
  });

  test('the trial rule refuses what no trial may hold (422 naming the field); an unknown run is refused', async () => {
    const r = await eng.post(`/api/sessions/${s.id}/readings`, { ...reading(s.runs[3], 40), outlet: 'hot' });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.fields)).toContain('outlet');
    const z = await eng.post(`/api/sessions/${s.id}/readings`, { ...reading(s.runs[3], 40), flow: 0 });
    expect(z.status).toBe(422);
    expect(z.body.fields.flow).toMatch(/dead-headed/);
    expect((await eng.post(`/api/sessions/${s.id}/readings`, { ...reading(s.runs[3], 40), runKey: 'r999' })).status).toBe(422);
  });

  test('the drift check when the reference flow comes back: 3 K lower is drift beyond the 2.3 K of two rises (k = 2, u = 1/√3 K)', async () => {
    const ref = s.runs[s.runs.length - 1];
    expect(ref.purpose).toBe('reference');
    const first = Math.round(s.runs[0].predictedOutletTempC * 10) / 10;
    const r = ok(await eng.post(`/api/sessions/${s.id}/readings`, reading(ref, first - 3)), 201, 'reference again');
    expect(r.drift.ready).toBe(true);
    expect(r.drift.expandedUK).toBeCloseTo(4 / Math.sqrt(3), 9);
    expect(r.drift.drifted).toBe(true);
    expect(r.drift.driftK).toBeCloseTo(-3, 6);
  });

  test('skip, repeat and add adapt the plan; a flow over the outlet limit cannot be added', async () => {
    const n = s.runs.length;
    const skip = ok(await eng.post(`/api/sessions/${s.id}/runs`, { action: 'skip', runKey: s.runs[4].key }), 200, 'skip').session;
    expect(skip.runs.find((x: any) => x.key === s.runs[4].key).state).toBe('skipped');
    const rep = ok(await eng.post(`/api/sessions/${s.id}/runs`, { action: 'repeat', runKey: s.runs[1].key }), 200, 'repeat').session;
    expect(rep.runs).toHaveLength(n + 1);
    const add = ok(await eng.post(`/api/sessions/${s.id}/runs`, { action: 'add', flow: '12 L/min' }), 200, 'add').session;
    expect(add.runs).toHaveLength(n + 2);
    expect(add.runs.at(-1).purpose).toBe('added');
    expect(add.runs.at(-1).predictedOutletTempC).toBeCloseTo(outletAt(12 * LPM), 0);
    const hot = await eng.post(`/api/sessions/${s.id}/runs`, { action: 'add', flow: '2 L/min' });
    expect(hot.status, hot.text).toBe(422);
    expect((await viewer.post(`/api/sessions/${s.id}/runs`, { action: 'skip', runKey: s.runs[5].key })).status).toBe(403);
  });
});

describe('a logger streaming at 1 Hz (40 simulated minutes, sped up)', () => {
  let s: any;
  let plateaus: { flowM3PerS: number; outletTempC: number }[];
  const log = { epoch0: 0, g: null as ReturnType<typeof generatePlateauLog> | null };
  const batch = (from: number, to: number) => ({
    samples: Array.from({ length: to - from }, (_, k) => {
      const i = from + k, g = log.g!;
      return { t: new Date(Math.round((log.epoch0 + g.timeS[i]) * 1000)).toISOString(), inletTempC: +g.inletTempC[i].toFixed(3), outletTempC: +g.outletTempC[i].toFixed(3), flowM3PerS: g.flowM3PerS[i] };
    }),
  });

  beforeAll(async () => {
    s = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, title: 'Logger session', preset: 'field' }), 201, 'session').session;
    const flows: number[] = [];
    for (const r of s.runs) if (!flows.some((f) => Math.abs(f / r.flowM3PerS - 1) < 0.05)) flows.push(r.flowM3PerS);
    plateaus = flows.slice(0, 4).map((f) => ({ flowM3PerS: f, outletTempC: outletAt(f) }));
    // ten minutes per plateau: the field preset needs 5 min steady (DOMAIN.md §2.4); the outlet settles with τ = 20 s
    log.g = generatePlateauLog(plateaus.map((p) => ({ durationS: 600, inletTempC: TIN, outletTempC: p.outletTempC, flowM3PerS: p.flowM3PerS })), { intervalS: 1, tauS: 20, seed: 3, noise: { tempK: 0.02, flowFraction: 0.002 } });
    log.epoch0 = Math.floor(Date.now() / 1000) - 3 * 3600;
  });

  test('the steady signal flips as the flows change, a dropped batch sent again is stored once, and the steady periods become the right trials', async () => {
    const states: string[] = [];
    const made: any[] = [];
    const n = log.g!.timeS.length;
    expect(n).toBe(2400);
    for (let from = 0, k = 0; from < n; from += 60, k++) {
      const body = batch(from, Math.min(n, from + 60));
      const r = ok(await tokenA.post(`/api/sessions/${s.id}/samples`, body), 201, `batch ${k}`);
      expect(r.stored).toBe(body.samples.length);
      if (k === 12) {
        // the answer was lost on the way: the logger sends the same batch again
        const again = ok(await tokenA.post(`/api/sessions/${s.id}/samples`, body), 200, 'retried batch');
        expect(again).toMatchObject({ stored: 0, duplicates: 60 });
      }
      states.push(r.live.state);
      made.push(...r.trials);
    }
    // settling at first, steady then "record" on each plateau, "changed" after each flow step
    expect(states[0]).toMatch(/waiting|settling/);
    expect(states).toContain('steady');
    expect(states).toContain('record');
    expect(states).toContain('changed');
    const flips = states.filter((x, i) => i > 0 && x === 'record' && states[i - 1] !== 'record').length;
    expect(flips).toBeGreaterThanOrEqual(3);
    // the first three plateaus ended while streaming; the last one becomes a trial when the session closes
    expect(made).toHaveLength(3);
    const closed = ok(await eng.post(`/api/sessions/${s.id}/close`, {}), 200, 'close').session;
    expect(closed.sampleCount).toBe(2400);
    const trials = closed.trials.filter((t: any) => t.origin === 'log-segment');
    expect(trials).toHaveLength(4);
    trials.forEach((t: any, i: number) => {
      expect(t.flowM3PerS / plateaus[i].flowM3PerS).toBeCloseTo(1, 2);
      expect(Math.abs(t.outletTempC - plateaus[i].outletTempC)).toBeLessThan(0.2);
      expect(t.sourceFileId).toBeTruthy();
    });
    const done = closed.runs.filter((r: any) => r.state === 'done');
    expect(done.length).toBe(4);
    expect(closed.closing.fit.ok).toBe(true);
    // four trials on the coil model itself: the fit gives back Ts and UA (to the settling bias of the periods)
    expect(closed.closing.fit.params.UA.value).toBeGreaterThan(UA * 0.9);
    expect(closed.closing.fit.params.UA.value).toBeLessThan(UA * 1.1);
    expect(Math.abs(closed.closing.fit.params.Ts.value - TS)).toBeLessThan(3);
    expect(closed.closing.nextRun.ok).toBe(true);
    expect(closed.closing.nextRun.flowM3PerS).toBeGreaterThanOrEqual(2 * LPM * (1 - 1e-9));
    // closed: more samples are refused
    const late = await tokenA.post(`/api/sessions/${s.id}/samples`, batch(0, 1));
    expect(late.status).toBe(409);
  });

  test('one click makes a study of the closed session (a saved fit, its trials, the sensor log), and the same again', async () => {
    const a = ok(await eng.post(`/api/sessions/${s.id}/study`, {}), 201, 'study');
    const b = ok(await eng.post(`/api/sessions/${s.id}/study`, {}), 201, 'study again');
    expect(b.studyId).toBe(a.studyId);
    const study = ok(await eng.get(`/api/studies/${a.studyId}`), 200, 'study').study;
    expect(study.blocks.map((x: { kind: string }) => x.kind)).toEqual(['text', 'fit', 'trials', 'sensor-log', 'caution']);
    const fitBlock = study.blocks.find((x: { kind: string }) => x.kind === 'fit');
    const block = ok(await eng.get(`/api/studies/${a.studyId}/blocks/${fitBlock.id}`), 200, 'fit block');
    expect(JSON.stringify(block)).toContain('UA');
    const logBlock = study.blocks.find((x: { kind: string }) => x.kind === 'sensor-log');
    const lb = ok(await eng.get(`/api/studies/${a.studyId}/blocks/${logBlock.id}`), 200, 'log block');
    expect(JSON.stringify(lb)).toContain('2,400 samples');
    expect((await viewer.post(`/api/sessions/${s.id}/study`, {})).status).toBe(403);
  });
});

describe('bad batches get a clear answer and store nothing', () => {
  let s: any;
  const t0 = Math.floor(Date.now() / 1000) - 3600;
  const sample = (i: number, extra: Record<string, unknown> = {}) => ({ t: t0 + i, inletTempC: 18, outletTempC: 50, flowM3PerS: 1e-4, ...extra });
  const count = async () => ok(await eng.get(`/api/sessions/${s.id}`), 200, 'session').session.sampleCount;
  beforeAll(async () => {
    s = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, title: 'Bad batches' }), 201, 'session').session;
    ok(await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [10, 11, 12].map((i) => sample(i)) }), 201, 'first batch');
  });

  test('a batch from before the latest stored sample that was never sent → 409 out_of_order', async () => {
    const r = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(5), sample(13)] });
    expect(r.status, r.text).toBe(409);
    expect(r.body.error).toBe('out_of_order');
    expect(r.body.message).toMatch(/samples\.0\.t/);
    expect(await count()).toBe(3);
  });
  test('a batch out of order inside itself → 422 naming the sample', async () => {
    const r = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(20), sample(19)] });
    expect(r.status).toBe(422);
    expect(Object.keys(r.body.fields)).toEqual(['samples.1.t']);
    expect(await count()).toBe(3);
  });
  test('an unknown channel → 422 naming it', async () => {
    const r = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(20), sample(21, { pressureKPa: 101 })] });
    expect(r.status).toBe(422);
    expect(r.body.error).toBe('unknown_channel');
    expect(r.body.message).toMatch(/pressureKPa/);
    const csv = await tokenA.request('POST', `/api/sessions/${s.id}/samples`, `t,inletTempC,outletTempC,flowM3PerS,pressure\n${t0 + 30},18,50,0.0001,101\n`, { 'Content-Type': 'text/csv' });
    expect(csv.status).toBe(422);
    expect(csv.body.message).toMatch(/pressure/);
    expect(await count()).toBe(3);
  });
  test('a token of another lab → 404 (the session is not theirs); a viewer → 403; no token → 401', async () => {
    expect((await tokenB.post(`/api/sessions/${s.id}/samples`, { samples: [sample(40)] })).status).toBe(404);
    expect((await viewer.post(`/api/sessions/${s.id}/samples`, { samples: [sample(40)] })).status).toBe(403);
    expect((await new Client().post(`/api/sessions/${s.id}/samples`, { samples: [sample(40)] })).status).toBe(401);
    expect(await count()).toBe(3);
  });
  test('the same time with other values → 409 sample_differs; a bad number → 422', async () => {
    const r = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(12, { outletTempC: 51 })] });
    expect(r.status).toBe(409);
    expect(r.body.error).toBe('sample_differs');
    const b = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(50, { outletTempC: 'hot' })] });
    expect(b.status).toBe(422);
    const future = await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: [sample(0, { t: '2099-01-01T00:00:00Z' })] });
    expect(future.status).toBe(422);
    expect(await count()).toBe(3);
  });
  test('a CSV batch is read as the JSON one', async () => {
    const csv = `t,inletTempC,outletTempC,flowM3PerS\n${t0 + 13},18,50,0.0001\n${t0 + 14},18,50.1,0.0001\n`;
    const r = await tokenA.request('POST', `/api/sessions/${s.id}/samples`, csv, { 'Content-Type': 'text/csv' });
    expect(r.status, r.text).toBe(201);
    expect(r.body.stored).toBe(2);
    expect(await count()).toBe(5);
  });
});

describe('the live event stream', () => {
  test('sends the session and the live signal, and again when a batch arrives (read from PostgreSQL)', async () => {
    const s = ok(await eng.post(`/api/rigs/${rigId}/sessions`, { ...planBody, title: 'Live stream' }), 201, 'session').session;
    const ac = new AbortController();
    const res = await fetch(`${baseUrl}/api/sessions/${s.id}/events`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'X-Forwarded-For': eng.ip }, signal: ac.signal });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/event-stream/);
    const reader = res.body!.getReader();
    const dec = new TextDecoder();
    let buf = '';
    const nextEvent = async () => {
      for (;;) {
        const m = /event: session\ndata: (.*)\n\n/.exec(buf);
        if (m) { buf = buf.slice(m.index + m[0].length); return JSON.parse(m[1]); }
        const { value, done } = await reader.read();
        if (done) throw new Error('stream ended');
        buf += dec.decode(value, { stream: true });
      }
    };
    const first = await nextEvent();
    expect(first.session.id).toBe(s.id);
    expect(first.live.state).toBe('waiting');
    expect(first.live.nextRun.key).toBe('r1');
    const t0 = Math.floor(Date.now() / 1000) - 600;
    ok(await tokenA.post(`/api/sessions/${s.id}/samples`, { samples: Array.from({ length: 30 }, (_, i) => ({ t: t0 + i, inletTempC: 18, outletTempC: 50, flowM3PerS: 1e-4 })) }), 201, 'batch');
    const second = await nextEvent();
    expect(second.session.sampleCount).toBe(30);
    expect(second.recent.outletTempC).toHaveLength(30);
    ac.abort();
    // another lab's member cannot open it
    expect((await tokenB.get(`/api/sessions/${s.id}/events`)).status).toBe(404);
  });
});
