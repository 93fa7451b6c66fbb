/**
 * Body limits hold for bodies without a Content-Length: a chunked request (Transfer-Encoding:
 * chunked, as scripts and proxies send) that passes a route's limit is answered 413 (RFC 9110
 * §15.5.14, Content Too Large; from memory) while it is still coming in, for a JSON route, a
 * multipart import and a raw upload, and the server goes on serving. The limits are the routes'
 * own (64 KiB for JSON, IMPORT_MAX_BYTES for uploads). Multipart bodies used to be read whole
 * before any limit was looked at; the JSON and raw-upload readers already counted, and their
 * cases guard against any reader that buffers first (as Next.js does for requests its proxy
 * handles, which is why proxy.ts leaves /api out).
 */
import http from 'node:http';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, test } from 'vitest';
import { getEm } from '@/app/_lib/server/db';
import { SourceFile } from '@/entities';
import { baseUrl, signedIn, type Client } from './support/client';

const MiB = 1024 * 1024;
/** The server's upload limit: scripts/test.mjs passes the same environment to the app and to vitest. */
const UPLOAD_LIMIT = Number(process.env.IMPORT_MAX_BYTES ?? 100 * MiB);
/** `config.maxJsonBytes`: the limit of every JSON route that names no other. */
const JSON_LIMIT = 64 * 1024;
/**
 * Sent past the limit at most. A server that answers once the limit is passed has read at most
 * the limit plus what the loopback socket buffers hold (a few MiB); one that reads the whole
 * body first has read all of it.
 */
const BEYOND = 48 * MiB;

interface ChunkedReply {
  status: number;
  body: { error?: string; message?: string } | null;
  /** bytes of the body written before the answer came */
  sentBytes: number;
  totalBytes: number;
}

/** A piece of a body: text, or `fill` bytes of filler ("aaaa…": valid inside a JSON string and as CSV text). */
type Segment = string | { fill: number };

/**
 * POSTs the segments with Transfer-Encoding: chunked (no Content-Length), in pieces of at most
 * 1 MiB with back-pressure, and stops writing as soon as the server answers. Rejects when the
 * connection fails before an answer.
 */
function postChunked(url: string, headers: Record<string, string>, segments: Segment[]): Promise<ChunkedReply> {
  const u = new URL(baseUrl + url);
  const filler = Buffer.alloc(MiB, 0x61);
  function* pieces(): Generator<Buffer> {
    for (const s of segments) {
      if (typeof s === 'string') {
        const b = Buffer.from(s);
        for (let i = 0; i < b.length; i += MiB) yield b.subarray(i, i + MiB);
      } else {
        for (let left = s.fill; left > 0; left -= MiB) yield filler.subarray(0, Math.min(MiB, left));
      }
    }
  }
  const totalBytes = segments.reduce((n, s) => n + (typeof s === 'string' ? Buffer.byteLength(s) : s.fill), 0);
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const req = http.request({ host: u.hostname, port: u.port, path: u.pathname + u.search, method: 'POST', headers: { ...headers, 'Transfer-Encoding': 'chunked' } });
    req.on('response', (res) => {
      answered = true;
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('error', reject);
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        let body: ChunkedReply['body'] = null;
        try {
          body = JSON.parse(text);
        } catch {
          /* not JSON */
        }
        req.destroy();
        resolve({ status: res.statusCode ?? 0, body, sentBytes: sent, totalBytes });
      });
    });
    req.on('error', (e) => {
      if (!answered) reject(new Error(`the connection failed before an answer, after ${sent} bytes: ${e.message}`));
    });
    const source = pieces();
    const pump = () => {
      while (!answered) {
        const next = source.next();
        if (next.done) return void req.end();
        sent += next.value.length;
        if (!req.write(next.value)) return void req.once('drain', pump);
      }
    };
    pump();
  });
}

const browserHeaders = (c: Client, type: string) => ({
  Origin: baseUrl,
  Cookie: [...c.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
  'X-Forwarded-For': c.ip,
  'Content-Type': type,
});

async function expectServing() {
  const res = await fetch(`${baseUrl}/api/health`);
  expect(res.status).toBe(200);
  expect(await res.json()).toEqual({ ok: true });
}

let eng: Client;
let labId: string;
let rigId: string;

beforeAll(async () => {
  eng = await signedIn('engineer@cinder-hollow.test');
  labId = (await eng.get('/api/me')).body.labs[0].id;
  const name = `Body-limit rig ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  rigId = (await eng.post(`/api/labs/${labId}/rigs`, { name, heatSource: 'wood-fire' })).body.rig.id;
});

const trialCount = async () => (await eng.get(`/api/rigs/${rigId}/trials?pageSize=1`)).body.total as number;
const fileCount = async () => (await getEm()).count(SourceFile, { rig: rigId });

describe('bodies without a Content-Length', () => {
  test('a chunked JSON body over 64 KiB is answered 413 while it streams, and the server goes on serving', async () => {
    const r = await postChunked(`/api/labs/${labId}/rigs`, browserHeaders(eng, 'application/json'), ['{"name":"', { fill: JSON_LIMIT + BEYOND }, '","heatSource":"wood-fire"}']);
    expect(r.status).toBe(413);
    expect(r.body?.error).toBe('too_large');
    expect(r.sentBytes).toBeLessThan(r.totalBytes);
    await expectServing();
  });

  test('a chunked multipart import over the upload limit is answered 413 while it streams; nothing is stored', async () => {
    const boundary = 'emberline-body-limit';
    const before = await trialCount();
    const r = await postChunked(`/api/rigs/${rigId}/imports`, browserHeaders(eng, `multipart/form-data; boundary=${boundary}`), [
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\nflow,inlet,outlet\r\n`,
      { fill: UPLOAD_LIMIT + BEYOND },
      `\r\n--${boundary}--\r\n`,
    ]);
    expect(r.status).toBe(413);
    expect(r.body?.error).toBe('too_large');
    expect(r.sentBytes).toBeLessThan(r.totalBytes);
    expect(await trialCount()).toBe(before);
    expect(await fileCount()).toBe(0);
    await expectServing();
  });

  test('a multipart body with a second file, or a text field over 64 KiB, is refused while it streams; nothing is stored', async () => {
    const boundary = 'emberline-parts';
    const file = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\nflow,inlet,outlet\r\n`;
    // two files of 60 % of the limit each: the second one is refused at its header, before the body is all sent
    const twoFiles = await postChunked(`/api/rigs/${rigId}/imports`, browserHeaders(eng, `multipart/form-data; boundary=${boundary}`), [
      file,
      { fill: Math.ceil(UPLOAD_LIMIT * 0.6) },
      `\r\n${file.replace('a.csv', 'b.csv')}`,
      { fill: Math.ceil(UPLOAD_LIMIT * 0.6) },
      `\r\n--${boundary}--\r\n`,
    ]);
    expect(twoFiles.status).toBe(400);
    expect(twoFiles.body?.message).toMatch(/too many files/);
    expect(twoFiles.sentBytes).toBeLessThan(twoFiles.totalBytes);
    // a "mapping" field of 1 MiB + 64 KiB before the file
    const bigField = await postChunked(`/api/rigs/${rigId}/imports`, browserHeaders(eng, `multipart/form-data; boundary=${boundary}`), [
      `--${boundary}\r\nContent-Disposition: form-data; name="mapping"\r\n\r\n`,
      { fill: MiB + JSON_LIMIT },
      `\r\n${file}1,2,3\r\n--${boundary}--\r\n`,
    ]);
    expect(bigField.status).toBe(413);
    expect(bigField.body?.error).toBe('too_large');
    expect(await fileCount()).toBe(0);
    await expectServing();
  });

  test('a chunked raw upload over the upload limit is answered 413 while it streams; nothing is stored', async () => {
    const r = await postChunked(`/api/rigs/${rigId}/uploads?filename=big.csv`, browserHeaders(eng, 'text/csv'), ['flow,inlet,outlet\n', { fill: UPLOAD_LIMIT + BEYOND }, '\n']);
    expect(r.status).toBe(413);
    expect(r.body?.error).toBe('too_large');
    expect(r.sentBytes).toBeLessThan(r.totalBytes);
    expect(await fileCount()).toBe(0);
    await expectServing();
  });

  test('a chunked multipart import under the limit is read whole and imported', async () => {
    // fixtures/import/trials-imperial.csv: four trials in US units (fixtures/import/README.md); a unique
    // trailing blank line makes new bytes for this run
    const csv = readFileSync(path.resolve(__dirname, '..', '..', 'fixtures', 'import', 'trials-imperial.csv'), 'utf8') + '\n'.repeat(2 + (Date.now() % 5));
    const boundary = 'emberline-small';
    const r = await postChunked(`/api/rigs/${rigId}/imports`, browserHeaders(eng, `multipart/form-data; boundary=${boundary}`), [
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="trials-imperial.csv"\r\nContent-Type: text/csv\r\n\r\n${csv}`,
      `\r\n--${boundary}--\r\n`,
    ]);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect((r.body as { imported?: number }).imported).toBe(4);
    expect(r.sentBytes).toBe(r.totalBytes);
  });
});
