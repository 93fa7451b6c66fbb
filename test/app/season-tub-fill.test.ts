/**
 * A cost sheet's season and the tub-fill block against the running app and its PostgreSQL: the
 * study block, the forecast API and the XLSX export show the same numbers, each against a closed
 * form worked here (losses × days / efficiency with the EIA heat contents of DOMAIN.md §6 [24];
 * fill time = V / V̇; the coil outlet by ε-NTU with Cr → 0, DOMAIN.md §1.2); bad settings are
 * refused with the field named and nothing stored.
 */
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { getOrm } from '@/app/_lib/server/db';
import { Client, baseUrl, signedIn } from './support/client';

afterAll(async () => {
  await (await getOrm()).close(true);
});

const BTU_J = 1055.05585262; // NIST SP 811
const THERM_J = 100_000 * BTU_J;
const CORD_J = 20e6 * BTU_J; // EIA [24], rough
const PROPANE_GAL_J = 91_452 * BTU_J; // EIA [24]
const DAYS = 100;
// walls only: 50 m² × 2 W/(m²·K) × (28 − 15) K = 1,300 W at the 28 °C target
const USEFUL_J = 1300 * 86_400 * DAYS;

const forecastData = (fitId: string) => ({
  poolVolume: '40 m^3', startTemp: '20 degC', targetTemp: '28 degC', hours: 24, flow: '12 L/min', fitId,
  losses: {
    surfaceArea: '32 m^2', weather: { airTemp: '20 degC', relativeHumidity: 0.5 }, evaporation: false, convection: false, radiation: false, solar: false,
    walls: { area: '50 m^2', U: '2 W/(m^2*K)', groundTemp: '15 degC' },
  },
});
const season = { days: DAYS, hoursPerDay: 8, targetTemp: '28 degC', cover: false, buildPrice: 2000, purchased: { price: 1500, fuel: 'propane', fuelPrice: 3.5, efficiency: 0.82 } };
const studyBlocks = (fitId: string) => [
  { id: 'fc', kind: 'forecast', data: forecastData(fitId) },
  { id: 'cost', kind: 'costs', data: { fuel: 'wood', price: 250, efficiency: 0.3, currency: 'USD', heatFrom: 'forecast', forecastBlockId: 'fc', season } },
  { id: 'tub', kind: 'tub-fill', data: { fitId, tubVolume: '1200 L', flow: '6 L/min', supplyTemp: '15 degC', targetTemp: '38 degC' } },
];

let eng: Client;
let lab: { id: string };
let fit: { id: string; params: Record<string, { value: number }> };
let study: { id: string; revision: number };

beforeAll(async () => {
  eng = await signedIn('engineer@cinder-hollow.test');
  lab = (await eng.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
  const demo = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
  const ids = (await eng.get(`/api/rigs/${demo.id}/trials?pageSize=500`)).body.trials.filter((t: { origin: string }) => t.origin === 'demo').map((t: { id: string }) => t.id);
  const made = (await eng.post(`/api/labs/${lab.id}/fits`, { rigId: demo.id, title: `season fit ${Date.now()}`, model: 'coil', trialIds: ids })).body.fit;
  const full = (await eng.get(`/api/fits/${made.id}`)).body;
  fit = { id: made.id, params: full.fit?.result?.fit?.params ?? full.result?.fit?.params ?? full.params };
  const created = (await eng.post(`/api/labs/${lab.id}/studies`, { title: 'Season and tub' })).body.study;
  const put = await eng.request('PUT', `/api/studies/${created.id}`, { title: 'Season and tub', baseRevision: created.revision, blocks: studyBlocks(fit.id) });
  expect(put.status, put.text).toBe(200);
  study = put.body.study;
}, 120_000);

describe('a cost sheet’s season in a study', () => {
  test('the block shows the season’s heat, fuel, cost and payback against closed forms', async () => {
    const r = await eng.get(`/api/studies/${study.id}/blocks/cost`);
    expect(r.status, r.text).toBe(200);
    expect(r.body.block.body.type).toBe('costs');
    const s = r.body.block.body.cost.season;
    expect(s.lossW).toBeCloseTo(1300, 6);
    expect(s.usefulJ).toBeCloseTo(USEFUL_J, 0);
    expect(s.fuelUnits).toBeCloseTo(USEFUL_J / 0.3 / CORD_J, 9); // cords
    expect(s.annualCost).toBeCloseTo((USEFUL_J / 0.3 / CORD_J) * 250, 6);
    // payback: (2,000 − 1,500) / (therms × (propane − wood per useful therm)), DOMAIN.md §6 cost per useful therm
    const wood = (250 * THERM_J) / (CORD_J * 0.3), propane = (3.5 * THERM_J) / (PROPANE_GAL_J * 0.82);
    expect(s.payback.years).toBeCloseTo(500 / ((USEFUL_J / THERM_J) * (propane - wood)), 9);
    expect(s.payback.verdict).toMatch(/seasons/);
  });

  test('a bad season setting is refused naming the field, and nothing is stored', async () => {
    const bad = studyBlocks(fit.id).map((b) => (b.id === 'cost' ? { ...b, data: { ...b.data, season: { ...season, days: 400 } } } : b));
    const put = await eng.request('PUT', `/api/studies/${study.id}`, { title: 'Season and tub', baseRevision: study.revision, blocks: bad });
    expect(put.status).toBe(422);
    expect(put.text).toMatch(/season\.days/);
    expect(put.text).toMatch(/at most 366 days/);
    const now = (await eng.get(`/api/studies/${study.id}`)).body.study;
    expect(now.revision).toBe(study.revision);
    expect(now.blocks.find((b: { id: string }) => b.id === 'cost').data.season.days).toBe(DAYS);
  });

  test('a season whose forecast block is missing becomes a note naming forecastBlockId (the rest of the study still shows)', async () => {
    const other = (await eng.post(`/api/labs/${lab.id}/studies`, { title: 'Season without forecast' })).body.study;
    const put = await eng.request('PUT', `/api/studies/${other.id}`, { title: 'Season without forecast', baseRevision: other.revision, blocks: [{ id: 'c', kind: 'costs', data: { fuel: 'wood', price: 250, heatFrom: 'energy', heat: '100 therm', season } }] });
    expect(put.status, put.text).toBe(200);
    const r = await eng.get(`/api/studies/${other.id}/blocks/c`);
    expect(r.body.block.body.type).toBe('note');
    expect(r.body.block.body.message).toMatch(/forecastBlockId/);
  });
});

describe('the season on the forecast page (POST /api/labs/:id/forecast)', () => {
  test('cost.season gives the same heat and cost as the closed form', async () => {
    const { fitId, ...body } = forecastData(fit.id);
    const r = await eng.post(`/api/labs/${lab.id}/forecast`, { ...body, fitId, cost: { fuel: 'wood', pricePerUnit: 250, efficiency: 0.3, season } });
    expect(r.status, r.text).toBe(200);
    expect(r.body.cost.season.usefulJ).toBeCloseTo(USEFUL_J, 0);
    expect(r.body.cost.season.fuelKWh).toBeCloseTo(USEFUL_J / 0.3 / 3.6e6, 6);
  });

  test('a bad season answers 422 naming cost.season.hoursPerDay', async () => {
    const r = await eng.post(`/api/labs/${lab.id}/forecast`, { ...forecastData(fit.id), cost: { fuel: 'wood', pricePerUnit: 250, season: { ...season, hoursPerDay: 30 } } });
    expect(r.status).toBe(422);
    expect(r.body.fields).toHaveProperty(['cost.season.hoursPerDay']);
    // a target the season refuses after reading it: named as the body names it too
    const hot = await eng.post(`/api/labs/${lab.id}/forecast`, { ...forecastData(fit.id), cost: { fuel: 'wood', pricePerUnit: 250, season: { ...season, targetTemp: '90 degC' } } });
    expect(hot.status).toBe(422);
    expect(hot.body.fields).toHaveProperty(['cost.season.targetTemp']);
  });
});

describe('the tub-fill block', () => {
  test('fill time V/V̇ and the coil outlet by ε-NTU from the saved fit; the tub above 40 °C is flagged', async () => {
    const r = await eng.get(`/api/studies/${study.id}/blocks/tub`);
    expect(r.status, r.text).toBe(200);
    expect(r.body.block.body.type).toBe('tub-fill');
    const f = r.body.block.body.fill;
    expect(f.fillTimeS).toBeCloseTo(1.2 / (6 / 60_000), 6); // 1,200 L at 6 L/min: 200 min
    // Tout = Tin + (Ts − Tin)(1 − exp(−UA/(ṁ cp))), ṁ = ρ V̇ (ρ 999.1 kg/m³ at 15 °C, cp ≈ 4,186 J/(kg·K): handbook values, 0.5 K tolerance)
    const Ts = fit.params.Ts.value, UA = fit.params.UA.value;
    const out = 15 + (Ts - 15) * (1 - Math.exp(-UA / (999.1 * 1e-4 * 4186)));
    expect(Math.abs(f.outletTempC - out)).toBeLessThan(0.5);
    expect(f.finalTempC).toBeCloseTo(f.outletTempC, 9);
    if (f.finalTempC >= 40) expect(f.cautions.length).toBeGreaterThan(0);
    expect(f.target.targetTempC).toBeCloseTo(38, 9);
    expect(r.body.block.body.head.fitId).toBe(fit.id);
  });

  test('through a share link: the same numbers, no link to the fit', async () => {
    const made = await eng.post(`/api/studies/${study.id}/shares`, { days: 7 });
    const token = made.body.url.split('/share/')[1];
    const r = await new Client().get(`/api/share/${token}/blocks/tub?units=us`);
    expect(r.status, r.text).toBe(200);
    expect(r.body.block.body.head.fitId).toBeNull();
    expect(r.body.block.body.fill.fillTimeS).toBeCloseTo(12_000, 6);
  });

  test('a setting of the wrong type is refused naming the field; nothing is stored', async () => {
    const bad = studyBlocks(fit.id).map((b) => (b.id === 'tub' ? { ...b, data: { ...b.data, tubVolume: 5 } } : b));
    const put = await eng.request('PUT', `/api/studies/${study.id}`, { title: 'Season and tub', baseRevision: study.revision, blocks: bad });
    expect(put.status).toBe(422);
    expect(put.text).toMatch(/tubVolume/);
    expect((await eng.get(`/api/studies/${study.id}`)).body.study.revision).toBe(study.revision);
  });
});

describe('the study export', () => {
  test('the XLSX has the season on the Costs sheet and a Tub fill sheet with its safety notice', async () => {
    const res = await fetch(`${baseUrl}/api/studies/${study.id}/export`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    const costs = wb.getWorksheet('Costs')!;
    const header = (costs.getRow(1).values as unknown[]).map(String);
    const items = new Map<string, unknown>();
    costs.eachRow((row) => {
      if (row.getCell(header.indexOf('Section')).value === 'Season') items.set(String(row.getCell(header.indexOf('Item')).value), row.getCell(header.indexOf('Amount')).value);
    });
    expect(Number(items.get('Running cost of the season'))).toBeCloseTo((USEFUL_J / 0.3 / CORD_J) * 250, 6);
    expect(items.get('Payback in words')).toMatch(/seasons/);
    const tub = wb.getWorksheet('Tub fill')!;
    expect(tub).toBeTruthy();
    const text: string[] = [];
    tub.eachRow((row) => text.push((row.values as unknown[]).map(String).join(' ')));
    expect(text[0]).toMatch(/^.*Safety/);
    expect(text.join('\n')).toMatch(/Tub fill \(block 3\)/);
    const csv = await fetch(`${baseUrl}/api/studies/${study.id}/export?format=csv&table=${encodeURIComponent('Tub fill')}`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(csv.status).toBe(200);
    expect((await csv.text()).startsWith('# Safety')).toBe(true);
  });
});
