/**
 * Security headers as served by the running app, for a page, API routes (an answer and a
 * refusal) and a static file. The checks follow OWASP ASVS 4.0.3 §14.4 (from memory: 14.4.3
 * a Content-Security-Policy, 14.4.4 X-Content-Type-Options: nosniff, 14.4.5 HSTS, 14.4.6
 * Referrer-Policy, 14.4.7 frame-ancestors) and CSP Level 3 (W3C) for nonces and
 * 'strict-dynamic'. The test server has no https APP_URL, so no HSTS is sent (the https case is
 * in test/unit/security-headers.test.ts).
 */
import { describe, expect, test } from 'vitest';
import { baseUrl } from './support/client';

const directives = (csp: string | null) =>
  new Map((csp ?? '').split(';').map((d) => d.trim()).filter(Boolean).map((d) => [d.split(/\s+/)[0], d.split(/\s+/).slice(1)] as const));

function expectCommon(h: Headers) {
  expect(h.get('x-content-type-options')).toBe('nosniff');
  expect(h.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
  const pp = h.get('permissions-policy') ?? '';
  for (const feature of ['camera', 'microphone', 'geolocation', 'payment', 'usb']) expect(pp).toContain(`${feature}=()`);
  // APP_URL is not https here: HSTS would pin a plain-http origin (RFC 6797 §7.2: sent over secure transport only)
  expect(h.get('strict-transport-security')).toBeNull();
}

function expectNoContentPolicy(h: Headers) {
  const csp = directives(h.get('content-security-policy'));
  expect(csp.get('default-src')).toEqual(["'none'"]);
  expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
}

describe('security headers', () => {
  test('a page gets a nonce policy that its own scripts carry, fresh on every request', async () => {
    const get = () => fetch(`${baseUrl}/sign-in`);
    const res = await get();
    expect(res.status).toBe(200);
    expectCommon(res.headers);
    const csp = directives(res.headers.get('content-security-policy'));
    const script = csp.get('script-src') ?? [];
    const nonce = script.find((s) => s.startsWith("'nonce-"))?.slice(7, -1);
    expect(nonce).toMatch(/^[A-Za-z0-9+/]{22}==$/); // 128 random bits, base64
    expect(script).toContain("'strict-dynamic'");
    expect(script).not.toContain("'unsafe-inline'");
    expect(script).not.toContain("'unsafe-eval'");
    expect(csp.get('object-src')).toEqual(["'none'"]);
    expect(csp.get('base-uri')).toEqual(["'self'"]);
    expect(csp.get('form-action')).toEqual(["'self'"]);
    expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
    expect(csp.get('connect-src')).toEqual(["'self'"]);
    expect(csp.get('style-src')).not.toContain("'unsafe-inline'");
    // every script of the page, inline or not, carries this request's nonce (Next.js read it from the policy)
    const html = await res.text();
    const scripts = html.match(/<script\b[^>]*>/g) ?? [];
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
    const again = directives((await get()).headers.get('content-security-policy')).get('script-src');
    expect(again).not.toContain(`'nonce-${nonce}'`);
  });

  test('API routes get the common headers and a policy that loads nothing, on answers and refusals alike', async () => {
    const ok = await fetch(`${baseUrl}/api/health`);
    expect(ok.status).toBe(200);
    expectCommon(ok.headers);
    expectNoContentPolicy(ok.headers);
    const refused = await fetch(`${baseUrl}/api/me`);
    expect(refused.status).toBe(401);
    expectCommon(refused.headers);
    expectNoContentPolicy(refused.headers);
    // a path no route answers: JSON, not the HTML not-found page
    const missing = await fetch(`${baseUrl}/api/no-such-route`);
    expect(missing.status).toBe(404);
    expect(missing.headers.get('content-type')).toMatch(/^application\/json/);
    expectCommon(missing.headers);
    expectNoContentPolicy(missing.headers);
  });

  test('static files get the common headers and a policy that loads nothing', async () => {
    const html = await (await fetch(`${baseUrl}/sign-in`)).text();
    const asset = /(?:src|href)="(\/_next\/static\/[^"]+\.(?:js|css))"/.exec(html)?.[1];
    expect(asset).toBeDefined();
    const res = await fetch(baseUrl + asset);
    expect(res.status).toBe(200);
    expectCommon(res.headers);
    expectNoContentPolicy(res.headers);
  });

  test('the files of public/ are served without sign-in, with their types and a policy that loads nothing', async () => {
    // the page names them in its <head> (Next.js metadata), and a browser asks for /favicon.ico on its own
    const head = await (await fetch(`${baseUrl}/`)).text();
    for (const href of ['/favicon.ico', '/icon.svg', '/apple-touch-icon.png', '/manifest.webmanifest']) expect(head).toContain(`href="${href}"`);
    const files: [string, RegExp][] = [
      ['/favicon.ico', /^image\/(x-icon|vnd\.microsoft\.icon)/],
      ['/icon.svg', /^image\/svg\+xml/],
      ['/apple-touch-icon.png', /^image\/png/],
      ['/icon-192.png', /^image\/png/],
      ['/icon-512.png', /^image\/png/],
      ['/robots.txt', /^text\/plain/],
      ['/manifest.webmanifest', /^application\/manifest\+json/],
    ];
    for (const [file, type] of files) {
      const res = await fetch(baseUrl + file, { redirect: 'manual' });
      expect(res.status, file).toBe(200);
      expect(res.headers.get('content-type'), file).toMatch(type);
      expectCommon(res.headers);
      expectNoContentPolicy(res.headers);
    }
    // robots.txt keeps share links and the labs' pages out of search engines (RFC 9309)
    const robots = await (await fetch(`${baseUrl}/robots.txt`)).text();
    expect(robots).toMatch(/^Disallow: \/share\/$/m);
    expect(robots).toMatch(/^Disallow: \/$/m);
    expect(robots).toMatch(/^Allow: \/\$$/m);
  });
});
