/**
 * Trial-sheet import against the real PostgreSQL and the S3 fake: upload, recognise the same file,
 * map and check rows, refuse errors with nothing written, import in one transaction, scripts' multipart.
 * Fixture files are described in fixtures/import/README.md.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';
import { DEMO_PASSWORD, baseUrl, signedIn, type Client } from './support/client';

// A run-unique trailing blank line makes each upload new bytes (other tests import the same fixtures into this lab).
const fixture = (name: string) => Buffer.concat([readFileSync(path.resolve(__dirname, '..', '..', 'fixtures', 'import', name)), Buffer.from(`\n`.repeat(1 + (Date.now() % 7)))]);

async function setup() {
  const eng = await signedIn('engineer@cinder-hollow.test');
  const lab = (await eng.get('/api/me')).body.labs[0];
  const name = `Import rig ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const rig = (await eng.post(`/api/labs/${lab.id}/rigs`, { name, heatSource: 'wood-fire' })).body.rig;
  return { eng, lab, rig };
}

async function upload(c: Client, rigId: string, name: string, body: Buffer, type = 'text/csv') {
  const res = await fetch(`${baseUrl}/api/rigs/${rigId}/uploads?filename=${encodeURIComponent(name)}`, {
    method: 'POST',
    headers: { Origin: baseUrl, Cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'Content-Type': type, 'X-Forwarded-For': c.ip },
    body: new Uint8Array(body),
  });
  return { status: res.status, body: await res.json() };
}

const count = async (c: Client, rigId: string) => (await c.get(`/api/rigs/${rigId}/trials?pageSize=1`)).body.total as number;

describe('trial-sheet import', () => {
  test('a semicolon CSV with decimal commas is mapped, converted to SI and imported with links to its lines', async () => {
    const { eng, rig } = await setup();
    const sameBytes = fixture('trials-de.csv');
    const up = await upload(eng, rig.id, 'trials-de.csv', sameBytes);
    expect(up.status).toBe(201);
    expect(up.body.file.sha256).toMatch(/^[0-9a-f]{64}$/);
    const pv = await eng.post(`/api/rigs/${rig.id}/uploads/${up.body.file.id}/preview`, {});
    expect(pv.status, pv.text).toBe(200);
    expect(pv.body.dialect).toMatchObject({ delimiter: ';', decimal: ',' });
    expect(pv.body.check.errorCount).toBe(0);
    const ok = await eng.post(`/api/rigs/${rig.id}/uploads/${up.body.file.id}/confirm`, { mapping: pv.body.mapping });
    expect(ok.status, ok.text).toBe(201);
    expect(ok.body.imported).toBe(5);
    const rows = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=10`)).body.trials;
    const first = rows.find((t: { sourceLine: number }) => t.sourceLine === 2);
    // 10 L in a mean of (42.3 + 41.8)/2 s (the file's first row): V̇ = V / t̄
    expect(first.flowM3PerS).toBeCloseTo(0.01 / 42.05, 12);
    expect(first.inletTempC).toBeCloseTo(14.2, 10);
    expect(first.notes).toBe('Holz nachgelegt');
    // the same bytes again: recognised, and not imported twice
    const again = await upload(eng, rig.id, 'copy-of-trials.csv', sameBytes);
    expect(again.body.duplicate).toBe(true);
    const twice = await eng.post(`/api/rigs/${rig.id}/uploads/${again.body.file.id}/confirm`, { mapping: pv.body.mapping });
    expect(twice.status).toBe(409);
    expect(await count(eng, rig.id)).toBe(5);
  });

  test('rows with errors are listed with their lines; nothing is written until they are excluded', async () => {
    const { eng, rig } = await setup();
    const up = await upload(eng, rig.id, 'trials-errors.csv', fixture('trials-errors.csv'));
    const pv = (await eng.post(`/api/rigs/${rig.id}/uploads/${up.body.file.id}/preview`, {})).body;
    expect(pv.check.errorCount).toBeGreaterThan(0);
    const errorLines = [...new Set(pv.check.issues.filter((i: { severity: string }) => i.severity === 'error').map((i: { line: number }) => i.line))] as number[];
    expect(errorLines).toContain(3); // "n/a" in the outlet column
    const refused = await eng.post(`/api/rigs/${rig.id}/uploads/${up.body.file.id}/confirm`, { mapping: pv.mapping });
    expect(refused.status).toBe(422);
    expect(refused.body.message).toMatch(/Nothing was imported/);
    expect(await count(eng, rig.id)).toBe(0);
    const ok = await eng.post(`/api/rigs/${rig.id}/uploads/${up.body.file.id}/confirm`, { mapping: pv.mapping, excludedLines: errorLines });
    expect(ok.status, ok.text).toBe(201);
    expect(await count(eng, rig.id)).toBe(ok.body.imported);
  });

  test('a script imports a sheet in US units in one multipart call with its token, and the mapping is remembered', async () => {
    const { eng, lab, rig } = await setup();
    const secret = (await eng.post('/api/tokens', { name: 'import script', labId: lab.id, password: DEMO_PASSWORD })).body.secret;
    const form = new FormData();
    // new bytes for this run (other tests import the same fixture into the demo lab): trailing blank lines
    form.set('file', new Blob([Buffer.concat([fixture('trials-imperial.csv'), Buffer.from('\n'.repeat(7 + (Date.now() % 5)))])], { type: 'text/csv' }), 'trials-imperial.csv');
    const res = await fetch(`${baseUrl}/api/rigs/${rig.id}/imports`, { method: 'POST', headers: { Authorization: `Bearer ${secret}` }, body: form });
    const body = await res.json();
    expect(res.status, JSON.stringify(body)).toBe(201);
    expect(body.imported).toBe(4);
    const t = (await eng.get(`/api/rigs/${rig.id}/trials?sort=inletTempC&dir=asc&pageSize=1`)).body.trials[0];
    expect(t.inletTempC).toBeCloseTo(15, 10); // 59 °F = 15 °C exactly
    expect(t.bucketVolumeM3).toBeCloseTo(5 * 3.785411784e-3, 12); // NIST SP 811: 1 gal = 3.785411784 L
  });

  test('an empty file and a binary file named .csv get clear messages and store nothing', async () => {
    const { eng, rig } = await setup();
    const empty = await upload(eng, rig.id, 'empty.csv', Buffer.alloc(0));
    expect(empty.status).toBe(422);
    expect(empty.body.message).toMatch(/empty/);
    const bin = await upload(eng, rig.id, 'photo.csv', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0x0d, 0xff, 0x00, 0x13]));
    const pv = await eng.post(`/api/rigs/${rig.id}/uploads/${bin.body.file.id}/preview`, {});
    expect(pv.status).toBe(422);
    expect(pv.body.message).toMatch(/not a text file/);
    expect(await count(eng, rig.id)).toBe(0);
  });
});

describe('rig photos', () => {
  // the 8-byte PNG signature (ISO/IEC 15948 §5.2) followed by filler: enough for the magic-number check
  const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 1)]);
  const post = (c: Client, rigId: string, body: Buffer, type: string) =>
    fetch(`${baseUrl}/api/rigs/${rigId}/photos?filename=rig.png`, {
      method: 'POST',
      headers: { Origin: baseUrl, Cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'Content-Type': type, 'X-Forwarded-For': c.ip },
      body: new Uint8Array(body),
    });
  test('a photo is stored unchanged and served to members only; a text file posing as a PNG is refused', async () => {
    const { eng, rig } = await setup();
    const up = await post(eng, rig.id, png, 'image/png');
    expect(up.status).toBe(201);
    const { photo } = await up.json();
    const got = await fetch(`${baseUrl}/api/files/${photo.id}`, { headers: { Cookie: [...eng.cookies].map(([k, v]) => `${k}=${v}`).join('; ') } });
    expect(got.headers.get('content-type')).toBe('image/png');
    expect(Buffer.from(await got.arrayBuffer()).equals(png)).toBe(true);
    expect((await fetch(`${baseUrl}/api/files/${photo.id}`)).status).toBe(401);
    const fake = await post(eng, rig.id, Buffer.from('hello, not a picture'), 'image/png');
    expect(fake.status).toBe(422);
  });
});
