import { describe, expect, test } from 'vitest';
import { configProblems, ownOrigins, readConfig } from '../../app/_lib/server/config';
import { safeNextPath } from '../../app/_contracts/safe-next';

const secret = 'x'.repeat(40);

// OWASP ASVS 4.0.3 V3.4 (cookie attributes) and RFC 6265bis §4.1.3.2 (the __Host- prefix).
describe('session cookies are Secure by configuration, never by a request header', () => {
  test('an https APP_URL gives Secure cookies named with the __Host- prefix', () => {
    const c = readConfig({ NODE_ENV: 'production', APP_URL: 'https://emberline.example.com/', SESSION_SECRET: secret });
    expect(c.secureCookies).toBe(true);
    expect(c.sessionCookie).toBe('__Host-emberline_session');
    expect(c.appUrl).toBe('https://emberline.example.com');
  });
  test('the loopback demo on plain http keeps plain cookies', () => {
    const c = readConfig({ NODE_ENV: 'production', EMBERLINE_DEMO: 'true', APP_URL: 'http://127.0.0.1:3000', SESSION_SECRET: secret });
    expect(c.secureCookies).toBe(false);
    expect(c.sessionCookie).toBe('emberline_session');
    expect(configProblems(c)).toEqual([]);
  });
});

describe('a production server refuses to start without its configuration', () => {
  test('no APP_URL', () => {
    expect(configProblems(readConfig({ NODE_ENV: 'production', SESSION_SECRET: secret })).join(' ')).toMatch(/APP_URL must be set/);
  });
  test('an http APP_URL on a public host', () => {
    expect(configProblems(readConfig({ NODE_ENV: 'production', APP_URL: 'http://emberline.example.com', SESSION_SECRET: secret })).join(' ')).toMatch(/https/);
  });
  test('a short SESSION_SECRET', () => {
    expect(configProblems(readConfig({ NODE_ENV: 'production', APP_URL: 'https://emberline.example.com', SESSION_SECRET: 'short' })).join(' ')).toMatch(/SESSION_SECRET/);
  });
  test('development needs none of it', () => {
    expect(configProblems(readConfig({ NODE_ENV: 'development' }))).toEqual([]);
  });
});

describe('our own origins', () => {
  test('a loopback origin also answers to the other loopback names, never to another host', () => {
    const o = ownOrigins(readConfig({ APP_URL: 'http://127.0.0.1:3000' }));
    expect(o.has('http://localhost:3000')).toBe(true);
    expect(o.has('http://127.0.0.1:3001')).toBe(false);
    expect(o.has('http://evil.example')).toBe(false);
  });
  test('a public origin is only itself', () => {
    expect([...ownOrigins(readConfig({ APP_URL: 'https://emberline.example.com' }))]).toEqual(['https://emberline.example.com']);
  });
});

// OWASP ASVS 4.0.3 V5.1.5 (open redirects), CWE-601; the backslash form is how browsers read `/\host` (WHATWG URL).
describe('after sign-in, only paths of our own origin are followed', () => {
  const origin = 'http://127.0.0.1:3000';
  test.each([
    ['//evil.example/x'],
    ['/\\evil.example/x'],
    ['/\t/evil.example'],
    ['https://evil.example/'],
    ['javascript:alert(1)'],
    ['rigs'],
  ])('%s falls back', (next) => {
    expect(safeNextPath(next, origin, '/rigs')).toBe('/rigs');
  });
  test('a path with its query and hash is kept', () => {
    expect(safeNextPath('/invitations/inv_abc?x=1#top', origin, '/rigs')).toBe('/invitations/inv_abc?x=1#top');
  });
});
