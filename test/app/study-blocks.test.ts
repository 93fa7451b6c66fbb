/**
 * Study blocks from the block-data routes, for lab members and through a share link, against the
 * running app and its PostgreSQL: the page's first paint holds every block; the share route never
 * carries member names, links into the lab or raw files; an expired or revoked link is 404; a
 * sensor log's display overview is written by the import and built again from the samples when
 * missing (a log imported before overviews existed).
 */
import ExcelJS from 'exceljs';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { getOrm } from '@/app/_lib/server/db';
import { pgPool } from '@/app/_lib/server/pg-pool';
import { Client, STRONG_PASSWORD, baseUrl, createAccount, signedIn, uniqueEmail } from './support/client';
import { importGeneratedLog } from './support/sensor-logs';

const db = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });

afterAll(async () => {
  await db.end();
  await pgPool().end();
  await (await getOrm()).close(true);
});

interface Setup {
  eng: Client;
  lab: { id: string };
  rig: { id: string; name: string };
  fit: { id: string };
  fileId: string;
  samples: number;
  study: { id: string; revision: number };
}

const blocks = (fitId: string, fileId: string) => [
  { id: 'txt', kind: 'text', data: { markdown: '## Pool loop\n\nWhat we **found**.' } },
  { id: 'fit', kind: 'fit', data: { fitId } },
  { id: 'cmp', kind: 'comparison', data: { fitId } },
  { id: 'fc', kind: 'forecast', data: { poolVolume: '15000 gal', startTemp: '68 degF', targetTemp: '82 degF', hours: 48, flow: '3 gpm', fitId, losses: false } },
  { id: 'cost', kind: 'costs', data: { fuel: 'propane', price: 3, efficiency: 0.82, currency: 'USD', heatFrom: 'forecast', forecastBlockId: 'fc' } },
  { id: 'log', kind: 'sensor-log', data: { sourceFileId: fileId } },
  { id: 'warn', kind: 'caution', data: { text: 'Vent the coil before every run.' } },
];

let s: Setup;

beforeAll(async () => {
  const eng = await signedIn('engineer@cinder-hollow.test');
  const lab = (await eng.get('/api/me')).body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
  const demo = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
  const ids = (await eng.get(`/api/rigs/${demo.id}/trials?pageSize=500`)).body.trials.filter((t: { origin: string }) => t.origin === 'demo').map((t: { id: string }) => t.id);
  const fit = (await eng.post(`/api/labs/${lab.id}/fits`, { rigId: demo.id, title: `blocks fit ${Date.now()}`, model: 'coil', trialIds: ids })).body.fit;
  const rig = (await eng.post(`/api/labs/${lab.id}/rigs`, { name: `Block log rig ${Date.now().toString(36)}`, heatSource: 'solar-collector' })).body.rig;
  expect(rig?.id).toBeTruthy();
  const samples = 12_000;
  const { fileId } = await importGeneratedLog(lab.id, rig.id, samples);
  const created = (await eng.post(`/api/labs/${lab.id}/studies`, { title: 'Blocks over the API' })).body.study;
  const put = await eng.request('PUT', `/api/studies/${created.id}`, { title: 'Blocks over the API', baseRevision: created.revision, blocks: blocks(fit.id, fileId) });
  expect(put.status, put.text).toBe(200);
  s = { eng, lab, rig, fit, fileId, samples, study: put.body.study };
}, 120_000);

describe('block data for lab members', () => {
  test('each block answers plain JSON in the member’s units: numbers, tables and the SVG of its plots', async () => {
    const viewer = await signedIn('viewer@cinder-hollow.test');
    const get = async (id: string) => {
      const r = await viewer.get(`/api/studies/${s.study.id}/blocks/${id}`);
      expect(r.status, r.text).toBe(200);
      expect(r.headers.get('content-type')).toMatch(/application\/json/);
      return r.body.block;
    };
    expect((await get('txt')).body.html).toContain('<strong>found</strong>');
    const fit = await get('fit');
    expect(fit.body.type).toBe('fit');
    expect(fit.body.head.fitId).toBe(s.fit.id);
    expect(fit.body.plot.svg).toMatch(/^<(svg|figure)/);
    expect(fit.body.fit.params.UA.value).toBeGreaterThan(0);
    expect(fit.body.fit).not.toHaveProperty('residuals'); // only what the tables show
    expect((await get('cmp')).body.comparison.ranking.length).toBeGreaterThan(0);
    expect((await get('fc')).body.plot.svg).toContain('<svg');
    // propane $3.00/gal at η 0.82 → $4.00 per useful therm (DOMAIN.md §8 #16, EIA [24])
    const cost = (await get('cost')).body.cost;
    expect(cost.perUsefulTherm).toBeCloseTo(4.0, 2);
    expect(cost.riseK).toBeCloseTo(14 / 1.8, 9);
    const log = (await get('log')).body;
    expect(log.type).toBe('sensor-log');
    expect(log.samples).toBe(s.samples);
    expect(log.shownPoints).toBeLessThanOrEqual(2000);
    expect(log.filename).toBe('pool-loop-log.csv');
    expect(log.segments.length).toBeGreaterThan(0);
    expect(log.plots).toHaveLength(2);
    expect((await get('warn')).body.items[0]).toBe('Vent the coil before every run.');
    const missing = await viewer.get(`/api/studies/${s.study.id}/blocks/nope`);
    expect(missing.status).toBe(404);
  });

  test('the page’s first paint already holds every block (server render with the SWR fallback)', async () => {
    const r = await fetch(`${baseUrl}/studies/${s.study.id}`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    const html = await r.text();
    expect(r.status).toBe(200);
    for (const kind of ['text', 'fit', 'comparison', 'forecast', 'costs', 'sensor-log', 'caution']) expect(html).toContain(`data-block="${kind}"`);
    expect(html).not.toContain('Loading this block');
    expect(html).toContain('Per useful therm');
    expect(html).toContain('Logged inlet and outlet temperatures');
  });

  test('an anonymous caller gets 401 (other labs: the authorization matrix)', async () => {
    expect((await new Client().get(`/api/studies/${s.study.id}/blocks/fit`)).status).toBe(401);
  });

  test('the XLSX Costs sheet carries the cost block’s numbers', async () => {
    const res = await fetch(`${baseUrl}/api/studies/${s.study.id}/export`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    const sheet = wb.getWorksheet('Costs')!;
    const header = (sheet.getRow(1).values as unknown[]).map(String);
    let perTherm: number | null = null;
    sheet.eachRow((row) => {
      if (row.getCell(header.indexOf('Item')).value === 'Cost per useful therm (100,000 Btu delivered)') perTherm = Number(row.getCell(header.indexOf('Amount')).value);
    });
    expect(perTherm).toBeCloseTo(4.0, 2); // DOMAIN.md §8 #16
  });

  test('the XLSX Forecast sheet carries the forecast block’s trajectory, ending at the final temperature the block shows', async () => {
    const block = (await s.eng.get(`/api/studies/${s.study.id}/blocks/fc`)).body.block.body;
    const res = await fetch(`${baseUrl}/api/studies/${s.study.id}/export`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await res.arrayBuffer());
    const sheet = wb.getWorksheet('Forecast')!;
    expect(sheet).toBeDefined();
    // the safety notice heads the sheet (DOMAIN.md §5 thresholds); the frozen row under it is the header
    expect(String(sheet.getCell(1, 1).value)).toMatch(/^Safety: temperatures at or above 40 °C \(104 °F\) spa limit/);
    const headerRow = (sheet.views[0] as { ySplit?: number }).ySplit ?? 1;
    expect(headerRow).toBeGreaterThan(1);
    // row values are 1-based (index 0 is empty), as the cells
    const header = Array.from(sheet.getRow(headerRow).values as unknown[], (v) => String(v ?? ''));
    const hoursCol = header.findIndex((h) => h.startsWith('Elapsed'));
    const poolCol = header.findIndex((h) => h.startsWith('Pool temperature'));
    expect(header[poolCol]).toBe('Pool temperature (°C)');
    let last: ExcelJS.Row | null = null;
    sheet.eachRow((row) => {
      if (row.getCell(header.indexOf('Forecast')).value === 'Forecast (block 4)') last = row;
    });
    expect(last).not.toBeNull();
    expect(Number(last!.getCell(hoursCol).value)).toBeCloseTo(48, 9);
    expect(Number(last!.getCell(poolCol).value)).toBeCloseTo(block.finalTempC, 9);
  });

  test('the CSV of a table starts with the safety notice as comment lines, and the forecast CSV keeps the forecast’s cautions', async () => {
    const block = (await s.eng.get(`/api/studies/${s.study.id}/blocks/fc`)).body.block.body;
    const res = await fetch(`${baseUrl}/api/studies/${s.study.id}/export?format=csv&table=Forecast`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(res.status).toBe(200);
    const lines = (await res.text()).split('\r\n');
    expect(lines[0]).toMatch(/^# Safety: temperatures at or above 40 °C/);
    const comments = lines.filter((l) => l.startsWith('# '));
    for (const c of block.cautions as { message: string }[]) {
      const head = c.message.slice(0, 60).split(',').join(';'); // the caution's opening words, delimiter swapped
      expect(comments.some((l) => l.includes(head)), c.message).toBe(true);
    }
    expect(lines.find((l) => !l.startsWith('#'))).toMatch(/^"forecast"/);
  });
});

describe('block data through a share link', () => {
  test('answers without sign-in, in the units the reader picks, with no member names, lab links or raw files', async () => {
    const made = await s.eng.post(`/api/studies/${s.study.id}/shares`, { days: 7 });
    expect(made.status, made.text).toBe(201);
    const token = made.body.url.split('/share/')[1];
    const anon = new Client();
    const texts: string[] = [];
    for (const id of ['txt', 'fit', 'cmp', 'fc', 'cost', 'log', 'warn']) {
      const r = await anon.get(`/api/share/${token}/blocks/${id}?units=us`);
      expect(r.status, r.text).toBe(200);
      expect(r.body.block.units).toBe('us');
      texts.push(r.text);
    }
    const all = texts.join('\n');
    expect(all).not.toContain('Demo Engineer');
    expect(all).not.toContain('engineer@cinder-hollow.test');
    expect(all).not.toContain(s.fileId); // no raw-file ids
    expect(all).not.toContain('pool-loop-log.csv');
    expect(all).not.toContain('/api/files/');
    expect(all).not.toContain(s.fit.id); // no links into the lab
    expect(JSON.parse(texts[5]).block.body.filename).toBeNull();
    expect(all).toContain('°F'); // the plots are drawn in US units
    const si = await anon.get(`/api/share/${token}/blocks/fc?units=si`);
    expect(si.body.block.units).toBe('si');
    expect(si.text).toContain('°C');
    expect((await anon.get(`/api/share/${token}/blocks/nope`)).status).toBe(404);
  });

  test('a signed-in reader starts in their own units and may still switch; a signed-out reader starts in SI', async () => {
    const made = await s.eng.post(`/api/studies/${s.study.id}/shares`, { days: 7 });
    const token = made.body.url.split('/share/')[1];
    const { client: reader } = await createAccount(uniqueEmail('share-reader'), STRONG_PASSWORD, 'Share Reader', 'Reader Bench');
    expect((await reader.request('PATCH', '/api/me', { unitSystem: 'us' })).status).toBe(200);
    const page = async (c: Client, query = '') => {
      const html = (await c.get(`/share/${token}${query}`)).text;
      return /<a[^>]*aria-current="true"[^>]*>([^<]*)</.exec(html)?.[1] ?? '';
    };
    expect(await page(reader)).toMatch(/^US customary/);
    expect(await page(reader, '?units=si')).toMatch(/^SI/);
    expect(await page(new Client())).toMatch(/^SI/);
    expect(await page(new Client(), '?units=us')).toMatch(/^US customary/);
    expect((await reader.get(`/api/share/${token}/blocks/fc`)).body.block.units).toBe('us');
    expect((await new Client().get(`/api/share/${token}/blocks/fc`)).body.block.units).toBe('si');
    // the reader's own preference is unchanged by reading in other units
    expect((await reader.get('/api/me')).body.user.unitSystem).toBe('us');
  });

  test('an expired or revoked link answers 404 on the block route and the page says so', async () => {
    const a = await s.eng.post(`/api/studies/${s.study.id}/shares`, { days: 1 });
    const expired = a.body.url.split('/share/')[1];
    await db.query(`UPDATE share_link SET expires_at = now() - interval '1 minute' WHERE id = $1`, [a.body.share.id]);
    const b = await s.eng.post(`/api/studies/${s.study.id}/shares`, { days: 1 });
    const revoked = b.body.url.split('/share/')[1];
    expect((await new Client().get(`/api/share/${revoked}/blocks/fit`)).status).toBe(200);
    expect((await s.eng.request('DELETE', `/api/shares/${b.body.share.id}`)).status).toBe(200);
    for (const token of [expired, revoked, 'shr_not-a-real-token']) {
      const r = await new Client().get(`/api/share/${token}/blocks/fit`);
      expect(r.status).toBe(404);
      expect(r.body.message).toMatch(/expired or was revoked/);
      expect(await (await fetch(`${baseUrl}/share/${token}`)).text()).toContain('This link cannot be used');
    }
  });
});

describe('the sensor-log overview', () => {
  test('is written by the import: at most 2,000 samples with both ends, and the segments', async () => {
    const o = (await db.query('SELECT samples, max_points, points, segments FROM sensor_overview WHERE source_file_id = $1', [s.fileId])).rows[0];
    expect(o.samples).toBe(s.samples);
    expect(o.points.tS.length).toBeLessThanOrEqual(2000);
    expect(o.points.tS[0]).toBe(0);
    expect(o.points.tS.at(-1)).toBe(s.samples - 1); // 1 Hz log: the last sample is n − 1 s after the first
    const trials = (await db.query('SELECT count(*)::int AS n FROM trial WHERE source_file_id = $1', [s.fileId])).rows[0].n;
    expect(o.segments.length).toBe(trials);
    // the highest outlet logged is among the points drawn (extremes are kept)
    const max = (await db.query('SELECT max(outlet_c) AS m FROM sensor_sample WHERE source_file_id = $1', [s.fileId])).rows[0].m;
    expect(Math.max(...o.points.outletTempC)).toBeCloseTo(max, 4);
  });

  test('is built from the stored samples on first read when a log has none (logs imported before)', async () => {
    const before = (await db.query('SELECT points, segments FROM sensor_overview WHERE source_file_id = $1', [s.fileId])).rows[0];
    await db.query('DELETE FROM sensor_overview WHERE source_file_id = $1', [s.fileId]);
    const r = await s.eng.get(`/api/studies/${s.study.id}/blocks/log`);
    expect(r.status, r.text).toBe(200);
    expect(r.body.block.body.samples).toBe(s.samples);
    const after = (await db.query('SELECT points, segments FROM sensor_overview WHERE source_file_id = $1', [s.fileId])).rows[0];
    // the same samples and the same criteria (stored with the trials) give the same overview
    expect(after.points).toEqual(before.points);
    expect(after.segments).toEqual(before.segments);
  });
});

describe('block data computed once (the block cache) and HTTP caching', () => {
  test('a fit block is kept under (kind, fit, version, units, software version); its review state still follows the fit', async () => {
    const viewer = await signedIn('viewer@cinder-hollow.test');
    const first = await viewer.get(`/api/studies/${s.study.id}/blocks/fit`);
    expect(first.status, first.text).toBe(200);
    // one entry for the fit block in SI (the viewer's units), owned by the fit and the lab
    const rows = (await db.query<{ key: string; lab_id: string; fit_id: string }>(`select key, lab_id, fit_id from block_cache where fit_id = $1 and key like 'fit-block|fit|' || $1 || '|1|si|%'`, [s.fit.id])).rows;
    expect(rows).toHaveLength(1);
    expect(rows[0].key).toMatch(/\|emberline \d/);
    expect(rows[0].lab_id).toBe(s.lab.id);
    // the head is not kept: submitting the fit for review shows at once
    expect(first.body.block.body.head.reviewState).toBe('draft');
    expect((await s.eng.post(`/api/fits/${s.fit.id}/review`, { move: 'submit' })).body.reviewState).toBe('in-review');
    const again = await viewer.get(`/api/studies/${s.study.id}/blocks/fit`);
    expect(again.body.block.body.head.reviewState).toBe('in-review');
    // the kept part answers the same as the first computation
    expect(again.body.block.body.plot).toEqual(first.body.block.body.plot);
    expect(again.body.block.body.fit).toEqual(first.body.block.body.fit);
  });

  test('a forecast block is kept under its settings: other settings, another entry and another answer', async () => {
    const viewer = await signedIn('viewer@cinder-hollow.test');
    const before = await viewer.get(`/api/studies/${s.study.id}/blocks/fc`);
    const count = async () => Number((await db.query(`select count(*) from block_cache where key like 'forecast-block|%' and lab_id = $1`, [s.lab.id])).rows[0].count);
    const n = await count();
    const study = (await s.eng.get(`/api/studies/${s.study.id}`)).body.study;
    const changed = study.blocks.map((b: { id: string; data: Record<string, unknown> }) => (b.id === 'fc' ? { ...b, data: { ...b.data, hours: 24 } } : b));
    const put = await s.eng.request('PUT', `/api/studies/${s.study.id}`, { title: study.title, baseRevision: study.revision, blocks: changed });
    expect(put.status, put.text).toBe(200);
    s.study = put.body.study;
    const after = await viewer.get(`/api/studies/${s.study.id}/blocks/fc`);
    expect(after.status, after.text).toBe(200);
    expect(await count()).toBe(n + 1);
    // half the hours at the same heat: the pool ends cooler (the forecast's own monotony)
    expect(after.body.block.body.finalTempC).toBeLessThan(before.body.block.body.finalTempC);
  });

  test('block data carry an ETag (private, revalidated) and answer 304 to If-None-Match; a share link too', async () => {
    const viewer = await signedIn('viewer@cinder-hollow.test');
    const r = await viewer.get(`/api/studies/${s.study.id}/blocks/cmp`);
    expect(r.status).toBe(200);
    const etag = r.headers.get('etag');
    expect(etag).toMatch(/^"[\w-]{22}"$/);
    expect(r.headers.get('cache-control')).toBe('private, no-cache');
    const not = await viewer.get(`/api/studies/${s.study.id}/blocks/cmp`, { 'If-None-Match': etag! });
    expect(not.status).toBe(304);
    expect(not.text).toBe('');
    expect(not.headers.get('etag')).toBe(etag);
    // another tag gets the whole answer again
    expect((await viewer.get(`/api/studies/${s.study.id}/blocks/cmp`, { 'If-None-Match': '"other"' })).status).toBe(200);
    // authorization comes first: a member of another lab holding the tag still gets 404, not 304
    const { client: outsider } = await createAccount(uniqueEmail('etag-outsider'), STRONG_PASSWORD);
    expect((await outsider.get(`/api/studies/${s.study.id}/blocks/cmp`, { 'If-None-Match': etag! })).status).toBe(404);
  });

  test('exports carry an ETag of their data and answer 304 without building the file', async () => {
    const r = await fetch(`${baseUrl}/api/studies/${s.study.id}/export?format=csv&table=Trials`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(r.status).toBe(200);
    const etag = r.headers.get('etag');
    expect(etag).toBeTruthy();
    expect(r.headers.get('cache-control')).toBe('private, no-cache');
    const not = await fetch(`${baseUrl}/api/studies/${s.study.id}/export?format=csv&table=Trials`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'If-None-Match': etag! } });
    expect(not.status).toBe(304);
    // another table is another file
    const other = await fetch(`${baseUrl}/api/studies/${s.study.id}/export?format=csv&table=Fit`, { headers: { Cookie: [...s.eng.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'If-None-Match': etag! } });
    expect(other.status).toBe(200);
  });
});
