import 'server-only';
import { EventEmitter } from 'node:events';
import pg from 'pg';
import { TestSession } from '@/entities';
import { databaseUrl } from '../server/database-url';
import { getEm } from '../server/db';
import { rateLimited } from '../server/errors';
import { SESSION_CHANNEL, liveAndRecord } from './samples';
import { sessionListDto } from './sessions';

/**
 * The live stream of a session page (server-sent events). Every instance keeps one PostgreSQL
 * connection that LISTENs on SESSION_CHANNEL (ingestSamples NOTIFYs it when a batch commits, on
 * whichever instance took it); each open stream then reads the session from the database — so it
 * works across instances — and sends a snapshot when something changed. Without notifications
 * (the listener is down) each stream reads on its own with a backoff from 2 s to 30 s, so a page
 * left open costs one small read every 30 s at most: no polling storm. A stream ends after
 * MAX_STREAM_MS (EventSource reconnects by itself).
 */

export const MAX_STREAM_MS = 15 * 60_000;
/** Most open streams per instance. */
export const MAX_STREAMS = 200;
/** The live plot shows the last this many seconds. */
export const RECENT_S = 600;
const MIN_WAIT_MS = 2000;
const MAX_WAIT_MS = 30_000;

const g = globalThis as typeof globalThis & { __emberlineSessionBus?: EventEmitter; __emberlineStreams?: number };

function bus(): EventEmitter {
  if (g.__emberlineSessionBus) return g.__emberlineSessionBus;
  const b = new EventEmitter();
  b.setMaxListeners(0);
  g.__emberlineSessionBus = b;
  const connect = (delayMs: number) => {
    const client = new pg.Client({ connectionString: databaseUrl() });
    let retried = false;
    const retry = () => {
      if (retried) return;
      retried = true;
      client.end().catch(() => undefined);
      setTimeout(() => connect(Math.min(delayMs * 2, 60_000)), delayMs).unref();
    };
    client.on('notification', (m) => { if (m.payload) b.emit(m.payload); });
    client.on('error', retry);
    client.on('end', retry);
    client.connect().then(() => client.query(`LISTEN ${SESSION_CHANNEL}`)).catch(retry);
  };
  connect(1000);
  return b;
}

/** What the session page needs live: the session's progress, the live signal and the recent samples. */
export async function sessionSnapshot(sessionId: string) {
  const em = await getEm();
  const s = await em.findOne(TestSession, { id: sessionId }, { populate: ['rig'] });
  if (!s) return null;
  const { live, log } = await liveAndRecord(em, s, false, false);
  let recent: { tS: number[]; inletTempC: number[]; outletTempC: number[]; flowM3PerS: number[] } = { tS: [], inletTempC: [], outletTempC: [], flowM3PerS: [] };
  if (log && log.timeS.length) {
    const end = log.timeS[log.timeS.length - 1];
    let a = log.timeS.length - 1;
    while (a > 0 && log.timeS[a - 1] >= end - RECENT_S) a--;
    const step = Math.max(1, Math.ceil((log.timeS.length - a) / 600));
    const idx: number[] = [];
    for (let i = a; i < log.timeS.length; i += step) idx.push(i);
    const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
    recent = {
      tS: idx.map((i) => round(log.timeS[i] - end, 1)),
      inletTempC: idx.map((i) => round(log.inletTempC[i], 2)),
      outletTempC: idx.map((i) => round(log.outletTempC[i], 2)),
      flowM3PerS: idx.map((i) => log.flowM3PerS[i]),
    };
  }
  return { session: { ...sessionListDto(s), state: s.state, sampleCount: s.sampleCount, runs: s.runs }, live, recent };
}

/**
 * The event stream of a session (authorized by the caller). Sends `session` events with a
 * snapshot whenever it changed, a comment as a heartbeat otherwise. `once`: one snapshot, then the
 * stream ends (scripts, and the authorization tests).
 * @throws DomainError rate_limited when this instance already holds MAX_STREAMS streams
 */
export function sessionEventStream(sessionId: string, signal: AbortSignal, once = false): Response {
  if ((g.__emberlineStreams ?? 0) >= MAX_STREAMS) throw rateLimited(30, 'Too many live session pages are open on this server: try again in a moment.');
  g.__emberlineStreams = (g.__emberlineStreams ?? 0) + 1;
  const enc = new TextEncoder();
  const b = bus();
  let closed = false;
  let wake: (() => void) | null = null;
  const onNote = () => wake?.();
  const finish = () => {
    if (closed) return;
    closed = true;
    g.__emberlineStreams = Math.max(0, (g.__emberlineStreams ?? 1) - 1);
    b.off(sessionId, onNote);
    wake?.();
  };
  signal.addEventListener('abort', finish);
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      b.on(sessionId, onNote);
      const send = (s: string) => { if (!closed) controller.enqueue(enc.encode(s)); };
      send('retry: 3000\n\n');
      const until = Date.now() + MAX_STREAM_MS;
      let last = '';
      let wait = MIN_WAIT_MS;
      while (!closed && Date.now() < until) {
        try {
          const snap = await sessionSnapshot(sessionId);
          if (!snap) { send('event: gone\ndata: {}\n\n'); break; }
          const text = JSON.stringify(snap);
          if (text !== last) { send(`event: session\ndata: ${text}\n\n`); last = text; wait = MIN_WAIT_MS; }
          if (once) break;
          else { send(': still here\n\n'); wait = Math.min(MAX_WAIT_MS, wait * 2); }
        } catch (e) {
          console.error('session stream:', (e as Error).message);
          send('event: problem\ndata: {"message":"The live view could not be read; it will retry."}\n\n');
          wait = MAX_WAIT_MS;
        }
        await new Promise<void>((resolve) => {
          const t = setTimeout(resolve, wait);
          wake = () => { clearTimeout(t); resolve(); };
        });
        wake = null;
      }
      finish();
      try { controller.close(); } catch { /* already closed by the client */ }
    },
    cancel() { finish(); },
  });
  return new Response(stream, { headers: { 'Content-Type': 'text/event-stream; charset=utf-8', 'X-Accel-Buffering': 'no' } });
}
