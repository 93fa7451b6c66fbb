/**
 * HTTP revalidation of block data and exports (app/_lib/server/http-cache.ts), by RFC 9110:
 * §8.8.3 (ETag: a quoted opaque tag), §13.1.2 (If-None-Match: a list of tags or "*", compared
 * weakly, so W/"x" matches "x"), §15.4.5 (304 Not Modified carries no body, but the ETag and
 * Cache-Control it would have sent).
 */
import { describe, expect, test } from 'vitest';
import { cachedFile, cachedJson, etagOf, notModified } from '../../../app/_lib/server/http-cache';

const req = (inm?: string) => ({ headers: new Headers(inm === undefined ? {} : { 'If-None-Match': inm }) });

describe('ETag and If-None-Match', () => {
  const tag = etagOf('{"a":1}');
  test('a tag is quoted and depends on every byte', () => {
    expect(tag).toMatch(/^"[\w-]{22}"$/);
    expect(etagOf('{"a":2}')).not.toBe(tag);
  });
  test.each([
    [undefined, false],
    [tag, true],
    [`W/${tag}`, true],
    [`"nope", ${tag}`, true],
    ['*', true],
    ['"nope"', false],
  ])('If-None-Match %s → not modified: %s', (inm, expected) => {
    expect(notModified(req(inm), tag)).toBe(expected);
  });
});

describe('answers', () => {
  test('JSON: 200 with the tag and private revalidation, then 304 without a body for the same tag', async () => {
    const first = cachedJson(req(), { a: 1 });
    expect(first.status).toBe(200);
    expect(first.headers.get('cache-control')).toBe('private, no-cache');
    expect(await first.json()).toEqual({ a: 1 });
    const again = cachedJson(req(first.headers.get('etag')!), { a: 1 });
    expect(again.status).toBe(304);
    expect(await again.text()).toBe('');
    expect(again.headers.get('etag')).toBe(first.headers.get('etag'));
  });
  test('a file is not built at all when the request already holds it', async () => {
    let built = 0;
    const build = async () => { built++; return new Response('x,y\n'); };
    const first = await cachedFile(req(), { table: 'Trials' }, build);
    const again = await cachedFile(req(first.headers.get('etag')!), { table: 'Trials' }, build);
    expect([first.status, again.status, built]).toEqual([200, 304, 1]);
  });
});
