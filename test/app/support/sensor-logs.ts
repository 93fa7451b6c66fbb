/**
 * Shared pieces of the sensor-log integration tests: the generator's mapping, generated logs,
 * a rig of one's own, raw uploads and waiting for a background job.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'vitest';
import { writeSensorLogCsv } from '../../../bench/import-parse';
import { Client, baseUrl, signedIn } from './client';

/** The mapping of logs written by `writeSensorLogCsv`. */
export const LOG_MAPPING = {
  shape: 'sensorLog',
  decimal: '.',
  columns: [
    { column: 0, header: 'timestamp', field: 'time', unit: 'datetime' },
    { column: 1, header: 'T_in [C]', field: 'inletTemp', unit: 'degC' },
    { column: 2, header: 'T_out [C]', field: 'outletTemp', unit: 'degC' },
    { column: 3, header: 'flow [l/min]', field: 'flow', unit: 'L/min' },
    { column: 4, header: 'ambient [C]', field: 'ambientTemp', unit: 'degC' },
  ],
};

/** A folder of generated logs; `remove()` in afterAll. */
export function logFolder(tag: string) {
  const dir = mkdtempSync(path.join(os.tmpdir(), `emberline-${tag}-`));
  let seq = 0;
  return {
    /** A generated 1 Hz log; the seed varies per call so that each upload is new bytes. */
    async make(rows: number, edit?: (lines: string[]) => void): Promise<Buffer> {
      const file = path.join(dir, `log-${seq++}.csv`);
      await writeSensorLogCsv(file, { rows, seed: (Date.now() % 100_000) + seq * 7919 });
      if (edit) {
        const lines = readFileSync(file, 'utf8').split('\n');
        edit(lines);
        writeFileSync(file, lines.join('\n'));
      }
      return readFileSync(file);
    },
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}

/** The demo engineer with a new rig of her own. */
export async function engineerWithRig(tag: string, heatSource = 'propane-burner') {
  const eng = await signedIn('engineer@cinder-hollow.test');
  const lab = (await eng.get('/api/me')).body.labs[0];
  const name = `${tag} ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const rig = (await eng.post(`/api/labs/${lab.id}/rigs`, { name, heatSource })).body.rig;
  expect(rig?.id).toBeTruthy();
  return { eng, lab, rig };
}

/** Uploads raw bytes as the browser does (POST …/uploads?filename=). */
export async function uploadRaw(c: Client, rigId: string, name: string, body: Buffer) {
  const res = await fetch(`${baseUrl}/api/rigs/${rigId}/uploads?filename=${encodeURIComponent(name)}`, {
    method: 'POST',
    headers: { Origin: baseUrl, Cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'Content-Type': 'text/csv', 'X-Forwarded-For': c.ip },
    body: new Uint8Array(body),
  });
  const json = await res.json();
  expect(res.status, JSON.stringify(json)).toBe(201);
  return json.file as { id: string; sizeBytes: number };
}

/** Polls a job until it has finished (the worker picks it up within about a second). */
export async function jobFinished(c: Client, jobId: string, limitMs = 90_000) {
  const until = Date.now() + limitMs;
  for (;;) {
    const r = await c.get(`/api/jobs/${jobId}`);
    expect(r.status, r.text).toBe(200);
    if (['completed', 'failed', 'cancelled'].includes(r.body.job.state)) return r.body.job;
    if (Date.now() > until) throw new Error(`job ${jobId} still ${r.body.job.state} after ${limitMs} ms`);
    await new Promise((res) => setTimeout(res, 250));
  }
}
