/**
 * Shared pieces of the sensor-log tests: the generator's mapping, generated logs (test/support/sensor-log-file.ts
 * `writeSensorLogCsv`: 1 Hz plateaus of 1200 s, outlet 30 + 3k °C, flow 9 + 3k L/min, seeded
 * noise), a rig of one's own, raw uploads, waiting for a background job, and a log imported
 * directly by the real `importSensorLog` from a local file (as the import benchmark does).
 */
import { randomBytes } from 'node:crypto';
import { createReadStream, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'vitest';
import { writeSensorLogCsv, SENSOR_LOG_MAPPING } from '../../support/sensor-log-file';
import { getEm } from '@/app/_lib/server/db';
import { importSensorLog, logImportInput, type SensorImportResult } from '@/app/_lib/imports/sensor-import';
import { Lab, Rig, SourceFile } from '@/entities';
import { Client, baseUrl, signedIn } from './client';

/** The mapping of logs written by `writeSensorLogCsv`. */
export const LOG_MAPPING = SENSOR_LOG_MAPPING;

/** A folder of generated logs; `remove()` in afterAll. */
export function logFolder(tag: string) {
  const dir = mkdtempSync(path.join(os.tmpdir(), `emberline-${tag}-`));
  let seq = 0;
  // a fixed seed per folder and log: the same logs every run, new bytes for each log of a run
  const tagSeed = [...tag].reduce((h, c) => (h * 31 + c.charCodeAt(0)) % 100_000, 17);
  return {
    /** A generated 1 Hz log; the seed is fixed per folder and call, so each upload is new bytes and every run the same. */
    async make(rows: number, edit?: (lines: string[]) => void): Promise<Buffer> {
      const file = path.join(dir, `log-${seq++}.csv`);
      await writeSensorLogCsv(file, { rows, seed: tagSeed + seq * 7919 });
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
  const res = await fetch(`${c.base}/api/rigs/${rigId}/uploads?filename=${encodeURIComponent(name)}`, {
    method: 'POST',
    headers: { Origin: c.origin ?? baseUrl, Cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '), 'Content-Type': 'text/csv', 'X-Forwarded-For': c.ip },
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

/** Imports `rows` generated samples into the rig; returns the source file id and the import result. */
export async function importGeneratedLog(labId: string, rigId: string, rows: number, seed = 7): Promise<{ fileId: string; result: SensorImportResult }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-study-log-'));
  try {
    const file = path.join(dir, 'pool-loop-log.csv');
    const bytes = await writeSensorLogCsv(file, { rows, seed });
    const em = await getEm();
    const lab = await em.findOneOrFail(Lab, { id: labId });
    const rig = await em.findOneOrFail(Rig, { id: rigId, lab });
    const source = em.create(SourceFile, {
      lab, rig, filename: 'pool-loop-log.csv', contentType: 'text/csv', sizeBytes: bytes, sha256: randomBytes(32).toString('hex'), storageKey: 'test/local-file',
    });
    await em.flush();
    const result = await importSensorLog(
      { fileId: source.id, rigId, labId, filename: source.filename, storageKey: source.storageKey, sizeBytes: bytes, uploadedAt: new Date() },
      logImportInput.parse({ mapping: SENSOR_LOG_MAPPING, preset: 'field' }),
      { open: async () => createReadStream(file, { highWaterMark: 1 << 16 }) },
    );
    return { fileId: source.id, result };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
