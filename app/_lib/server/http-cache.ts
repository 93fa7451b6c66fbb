import 'server-only';
import { createHash } from 'node:crypto';
import { NextResponse } from 'next/server';

/** What these read of a request: its headers (the route wrapper's request has no body). */
type RequestHeaders = { headers: Headers };

/**
 * HTTP caching of answers that are the same for the same inputs (study block data, exports): a
 * strong ETag of the body and `Cache-Control: private, no-cache` — a browser (never a shared
 * cache) may keep the answer but asks again each time, and an `If-None-Match` with the same tag
 * gets 304 with no body. The route authorizes before it builds the answer, so a 304 tells nothing
 * a 200 would not. `Vary: Cookie, Authorization`: the answer is the reader's.
 */
export const PRIVATE_REVALIDATE = 'private, no-cache';

/** A quoted strong ETag of these bytes (SHA-256, base64url, 128 bits). */
export function etagOf(bytes: string | Uint8Array): string {
  return `"${createHash('sha256').update(bytes).digest('base64url').slice(0, 22)}"`;
}

/** Whether the request's If-None-Match names this tag (or `*`); weak tags match by their opaque part (RFC 9110 §13.1.2). */
export function notModified(req: RequestHeaders, etag: string): boolean {
  const header = req.headers.get('if-none-match');
  if (!header) return false;
  if (header.trim() === '*') return true;
  return header.split(',').some((t) => t.trim().replace(/^W\//, '') === etag);
}

const cacheHeaders = (etag: string) => ({ ETag: etag, 'Cache-Control': PRIVATE_REVALIDATE, Vary: 'Cookie, Authorization' });

/** A JSON answer with its ETag; 304 when the request already holds it. */
export function cachedJson(req: RequestHeaders, body: unknown): NextResponse {
  const text = JSON.stringify(body);
  const etag = etagOf(text);
  if (notModified(req, etag)) return new NextResponse(null, { status: 304, headers: cacheHeaders(etag) });
  return new NextResponse(text, { status: 200, headers: { ...cacheHeaders(etag), 'Content-Type': 'application/json' } });
}

/**
 * A file answer whose bytes follow from `inputs` (e.g. an export's data and format): the tag is
 * the hash of the inputs' JSON, so a 304 is answered before the file is built.
 */
export async function cachedFile(req: RequestHeaders, inputs: unknown, build: () => Promise<Response>): Promise<Response> {
  const etag = etagOf(JSON.stringify(inputs));
  if (notModified(req, etag)) return new NextResponse(null, { status: 304, headers: cacheHeaders(etag) });
  const res = await build();
  for (const [k, v] of Object.entries(cacheHeaders(etag))) res.headers.set(k, v);
  return res;
}
