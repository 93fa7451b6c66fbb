/**
 * One trial rule on every path (app/_lib/rigs/trial-rule.ts): the same trial typed into the API
 * (as the entry form and scripts send it), written in a CSV trial sheet, or found as a steady
 * period of a sensor log is accepted or refused alike, with the same flow, the same stored values
 * and the same message. The cases are ours; the bucket flow V / mean(t) is JCGM 100:2008 §4.2.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PASSWORD, baseUrl, type Client } from './support/client';
import { LOG_MAPPING, engineerWithRig, jobFinished, uploadRaw } from './support/sensor-logs';

const LPM = 1e-3 / 60;

interface Case {
  name: string;
  inletTempC: number;
  outletTempC: number;
  /** flow reading, L/min */
  flowLpm?: number;
  bucketL?: number;
  fillsS?: number[];
  notes?: string;
  /** irradiance in the collector plane, W/m², and wind, m/s (solar-collector trials) */
  irradianceWPerM2?: number;
  windMPerS?: number;
  /** accepted: the flow used, L/min, and the stored trial's warnings; refused: the rule's message */
  expect: { flowLpm: number; warnings: RegExp[] } | { refused: RegExp };
}

const CASES: Case[] = [
  { name: 'a bucket timed three times', inletTempC: 18.2, outletTempC: 37.4, bucketL: 20, fillsS: [62.4, 62.1, 62.6], expect: { flowLpm: (20 / ((62.4 + 62.1 + 62.6) / 3)) * 60, warnings: [] } },
  { name: 'a flow reading and a bucket that disagree: the bucket wins', inletTempC: 18.4, outletTempC: 36.9, flowLpm: 15, bucketL: 20, fillsS: [60], expect: { flowLpm: 20, warnings: [] } },
  { name: 'an outlet at 160 °C (a sensor or unit mistake)', inletTempC: 18, outletTempC: 160, flowLpm: 6, expect: { refused: /outlet temperature 160 °C is outside −40…150 °C/ } },
  { name: 'an outlet at 104 °C is kept, with the steam warning', inletTempC: 18, outletTempC: 104, flowLpm: 3, expect: { flowLpm: 3, warnings: [/at or above 100 °C/] } },
  { name: 'a zero flow reading (a dead-headed coil)', inletTempC: 18, outletTempC: 88, flowLpm: 0, expect: { refused: /flow must be more than 0/ } },
  { name: 'an outlet below the inlet is kept, with a warning', inletTempC: 30, outletTempC: 25, flowLpm: 8, expect: { flowLpm: 8, warnings: [/below inlet/] } },
  { name: 'notes of 3,000 characters', inletTempC: 18, outletTempC: 40, flowLpm: 9, notes: 'a'.repeat(3000), expect: { flowLpm: 9, warnings: [] } },
  { name: 'thirty fill times', inletTempC: 18, outletTempC: 40, bucketL: 10, fillsS: Array.from({ length: 30 }, (_, i) => 40 + (i % 3) * 0.1), expect: { flowLpm: (10 / 40.1) * 60, warnings: [] } },
  { name: 'no flow at all', inletTempC: 18, outletTempC: 40, expect: { refused: /no flow: give a flow reading, or a bucket volume/ } },
  { name: 'a collector trial with irradiance and wind', inletTempC: 25, outletTempC: 31, flowLpm: 2, irradianceWPerM2: 950, windMPerS: 3, expect: { flowLpm: 2, warnings: [] } },
  { name: 'a collector trial with irradiance and no wind', inletTempC: 40, outletTempC: 44.5, flowLpm: 2, irradianceWPerM2: 905.5, expect: { flowLpm: 2, warnings: [] } },
  // the solar constant is about 1,361 W/m² above the air (common practice): 2,000 on the ground is a unit mistake
  { name: 'an irradiance of 2,000 W/m²', inletTempC: 25, outletTempC: 31, flowLpm: 2, irradianceWPerM2: 2000, expect: { refused: /irradiance 2000 W\/m² is above 1500 W\/m²/ } },
  { name: 'a negative wind', inletTempC: 25, outletTempC: 31, flowLpm: 2, irradianceWPerM2: 900, windMPerS: -1, expect: { refused: /wind -1 m\/s is below 0/ } },
];

type Outcome = { ok: true; flowLpm: number; warnings: string[]; notes: string; irradianceWPerM2: number | null; windMPerS: number | null } | { ok: false; message: string };

const stored = (t: { flowM3PerS: number; warnings: string[]; notes: string; irradianceWPerM2: number | null; windMPerS: number | null }): Outcome => ({
  ok: true, flowLpm: t.flowM3PerS / LPM, warnings: t.warnings, notes: t.notes, irradianceWPerM2: t.irradianceWPerM2, windMPerS: t.windMPerS,
});

async function viaApi(eng: Client, rigId: string, c: Case): Promise<Outcome> {
  const body: Record<string, unknown> = { inlet: `${c.inletTempC} degC`, outlet: `${c.outletTempC} degC` };
  if (c.flowLpm !== undefined) body.flow = `${c.flowLpm} L/min`;
  if (c.bucketL !== undefined) body.bucketVolume = `${c.bucketL} L`;
  if (c.fillsS) body.fillTimesS = c.fillsS;
  if (c.notes) body.notes = c.notes;
  if (c.irradianceWPerM2 !== undefined) body.irradiance = `${c.irradianceWPerM2} W/m^2`;
  if (c.windMPerS !== undefined) body.wind = `${c.windMPerS} m/s`;
  const r = await eng.post(`/api/rigs/${rigId}/trials`, body);
  if (r.status !== 201) {
    expect(r.status, r.text).toBe(422);
    return { ok: false, message: Object.values(r.body.fields as Record<string, string>).join('; ') };
  }
  return stored((await eng.get(`/api/trials/${r.body.trials[0].id}`)).body.trial);
}

async function viaSheet(eng: Client, token: string, rigId: string, c: Case, tag: string): Promise<Outcome> {
  const fills = c.fillsS ?? [];
  const solar = c.irradianceWPerM2 !== undefined;
  const header = ['time', 'inlet (°C)', 'outlet (°C)', 'flow (L/min)', 'bucket (L)', ...fills.map((_, i) => `fill ${i + 1} (s)`), ...(solar ? ['irradiance (W/m²)', 'wind (m/s)'] : []), 'notes'];
  const row = ['2026-06-02 09:00', c.inletTempC, c.outletTempC, c.flowLpm ?? '', c.bucketL ?? '', ...fills, ...(solar ? [c.irradianceWPerM2, c.windMPerS ?? ''] : []), `"${c.notes ?? tag}"`];
  const form = new FormData();
  form.set('file', new Blob([`${header.join(',')}\n${row.join(',')}\n`], { type: 'text/csv' }), `${tag}.csv`);
  const res = await fetch(`${baseUrl}/api/rigs/${rigId}/imports`, { method: 'POST', headers: { Authorization: `Bearer ${token}` }, body: form });
  const body = await res.json();
  if (res.status !== 201) {
    expect(res.status, JSON.stringify(body)).toBe(422);
    return { ok: false, message: (body.issues as { message: string }[]).filter((i) => i).map((i) => i.message).join('; ') };
  }
  return stored((await eng.get(`/api/rigs/${rigId}/trials?pageSize=1&sort=createdAt&dir=desc`)).body.trials[0]);
}

/** A log of 600 steady samples at 1 Hz, imported with that one period chosen. */
async function viaLog(eng: Client, rigId: string, c: Case, tag: string): Promise<Outcome> {
  const solar = c.irradianceWPerM2 !== undefined;
  const lines = [`timestamp,T_in [C],T_out [C],flow [l/min],ambient [C]${solar ? ',G [W/m2],wind [m/s]' : ''}`];
  // the irradiance alternates ±0.5 W/m² about its value and the wind ±0.1 m/s: the period means are the values
  const extra = (i: number) => (solar ? `,${c.irradianceWPerM2! + (i % 2 ? 0.5 : -0.5)},${c.windMPerS === undefined ? '' : c.windMPerS + (i % 2 ? 0.1 : -0.1)}` : '');
  for (let i = 0; i < 600; i++) lines.push(`2026-06-02 10:${String(Math.floor(i / 60)).padStart(2, '0')}:${String(i % 60).padStart(2, '0')},${c.inletTempC},${c.outletTempC},${c.flowLpm},21.${i % 2}${extra(i)}`);
  const file = await uploadRaw(eng, rigId, `${tag}.csv`, Buffer.from(lines.join('\n') + '\n'));
  const mapping = solar
    ? { ...LOG_MAPPING, columns: [...LOG_MAPPING.columns, { column: 5, header: 'G [W/m2]', field: 'irradiance', unit: 'W/m^2' }, ...(c.windMPerS === undefined ? [] : [{ column: 6, header: 'wind [m/s]', field: 'wind', unit: 'm/s' }])] }
    : LOG_MAPPING;
  const started = await eng.post(`/api/rigs/${rigId}/uploads/${file.id}/log-import`, { mapping, preset: 'field', segments: [{ startLine: 2, endLine: 601 }] });
  expect(started.status, started.text).toBe(202);
  const job = await jobFinished(eng, started.body.job.id);
  if (job.state !== 'completed') return { ok: false, message: String(job.error) };
  return stored((await eng.get(`/api/rigs/${rigId}/trials?pageSize=1&sort=createdAt&dir=desc`)).body.trials[0]);
}

function check(out: Outcome, c: Case) {
  if ('refused' in c.expect) {
    expect(out.ok, JSON.stringify(out)).toBe(false);
    if (!out.ok) expect(out.message).toMatch(c.expect.refused);
    return;
  }
  expect(out.ok, JSON.stringify(out)).toBe(true);
  if (!out.ok) return;
  expect(out.flowLpm).toBeCloseTo(c.expect.flowLpm, 9);
  expect(out.warnings).toHaveLength(c.expect.warnings.length);
  c.expect.warnings.forEach((w, i) => expect(out.warnings[i]).toMatch(w));
  if (c.notes) expect(out.notes).toBe(c.notes);
  // a log's period mean of readings alternating about the value: equal to the value within rounding
  if (c.irradianceWPerM2 === undefined) expect(out.irradianceWPerM2).toBeNull();
  else expect(out.irradianceWPerM2).toBeCloseTo(c.irradianceWPerM2, 6);
  if (c.windMPerS === undefined) expect(out.windMPerS).toBeNull();
  else expect(out.windMPerS).toBeCloseTo(c.windMPerS, 6);
}

describe('the same trial meets the same rule on every path', () => {
  let token = '';
  beforeAll(async () => {
    const { eng, lab } = await engineerWithRig('Trial paths token');
    token = (await eng.post('/api/tokens', { name: 'trial paths', labId: lab.id, password: DEMO_PASSWORD })).body.secret;
    expect(token).toMatch(/^emb_/);
  });
  test.each(CASES.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    const { eng, rig } = await engineerWithRig('Trial paths');
    const tag = `${c.name.replace(/\W+/g, '-')}-${Date.now().toString(36)}`;
    const api = await viaApi(eng, rig.id, c);
    const sheet = await viaSheet(eng, token, rig.id, c, tag);
    check(api, c);
    check(sheet, c);
    if (api.ok && sheet.ok) expect(sheet.warnings).toEqual(api.warnings);
    // a sensor log has flow readings only: the cases with one go through a log period too
    if (c.flowLpm !== undefined && c.bucketL === undefined && !c.notes) {
      const log = await viaLog(eng, rig.id, c, tag);
      check(log, c);
      if (api.ok && log.ok) expect(log.warnings).toEqual(api.warnings);
    }
  }, 120_000);
});
