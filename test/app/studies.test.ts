import ExcelJS from 'exceljs';
import { describe, expect, test } from 'vitest';
import { Client, baseUrl, signedIn } from './support/client';

async function labAndFit(eng: Client) {
  const lab = (await eng.get('/api/me')).body.labs[0];
  const rig = (await eng.get(`/api/labs/${lab.id}/rigs`)).body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
  const ids = (await eng.get(`/api/rigs/${rig.id}/trials?pageSize=500`)).body.trials.filter((t: { origin: string }) => t.origin === 'demo').map((t: { id: string }) => t.id);
  const fit = (await eng.post(`/api/labs/${lab.id}/fits`, { rigId: rig.id, title: `study fit ${Date.now()}`, model: 'coil', trialIds: ids })).body.fit;
  return { lab, fit };
}

describe('studies', () => {
  test('two editors: the second save against an old revision is refused and shown, never overwritten', async () => {
    const a = await signedIn('engineer@cinder-hollow.test');
    const b = await signedIn('owner@cinder-hollow.test');
    const { lab, fit } = await labAndFit(a);
    const s = (await a.post(`/api/labs/${lab.id}/studies`, { title: 'Conflict check' })).body.study;
    const loaded = (await b.get(`/api/studies/${s.id}`)).body.study;
    const blocks = [{ id: 'b1', kind: 'text', data: { markdown: 'first editor' } }, { id: 'b2', kind: 'fit', data: { fitId: fit.id } }];
    const first = await a.request('PUT', `/api/studies/${s.id}`, { title: 'Conflict check', blocks, baseRevision: loaded.revision });
    expect(first.status, first.text).toBe(200);
    expect(first.body.study.revision).toBe(loaded.revision + 1);
    const second = await b.request('PUT', `/api/studies/${s.id}`, { title: 'Conflict check', blocks: [{ id: 'x', kind: 'text', data: { markdown: 'second editor' } }], baseRevision: loaded.revision });
    expect(second.status).toBe(409);
    expect(second.body.current.blocks[0].data.markdown).toBe('first editor');
    expect((await a.get(`/api/studies/${s.id}`)).body.study.blocks).toHaveLength(2);
  });

  test('a share link shows the study without sign-in or member names, exports the same numbers, and stops when revoked', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const { lab, fit } = await labAndFit(eng);
    const s = (await eng.post(`/api/labs/${lab.id}/studies`, { title: 'Shared yard report' })).body.study;
    const cur = (await eng.get(`/api/studies/${s.id}`)).body.study;
    await eng.request('PUT', `/api/studies/${s.id}`, { title: cur.title, baseRevision: cur.revision, blocks: [...cur.blocks, { id: 'f1', kind: 'fit', data: { fitId: fit.id } }] });
    const made = await eng.post(`/api/studies/${s.id}/shares`, { days: 7 });
    expect(made.status, made.text).toBe(201);
    const token = made.body.url.split('/share/')[1];
    const page = await fetch(`${baseUrl}/share/${token}`);
    const html = await page.text();
    expect(html).toContain('Shared yard report');
    expect(html).not.toContain('Demo Engineer');
    const xlsx = await fetch(`${baseUrl}/api/share/${token}/export`);
    expect(xlsx.status).toBe(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(await xlsx.arrayBuffer());
    const sheet = wb.getWorksheet('Fit')!;
    const api = (await eng.get(`/api/fits/${fit.id}`)).body.fit.result.fit.params;
    const header = (sheet.getRow((sheet.views[0] as { ySplit?: number }).ySplit ?? 1).values as unknown[]).map(String); // the frozen header row, under the safety notice
    const col = (h: string) => header.indexOf(h);
    let uaRow: ExcelJS.Row | undefined;
    sheet.eachRow((r) => {
      if (r.getCell(col('Parameter')).value === 'UA') uaRow = r;
    });
    expect(Number(uaRow!.getCell(col('Estimate')).value)).toBeCloseTo(api.UA.value, 8); // UA in W/K, unchanged in SI
    await eng.request('DELETE', `/api/shares/${made.body.share.id}`);
    expect(await (await fetch(`${baseUrl}/share/${token}`)).text()).toContain('This link cannot be used');
    expect((await fetch(`${baseUrl}/api/share/${token}/export`)).status).toBe(404);
  });
});
