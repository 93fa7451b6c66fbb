import { describe, expect, test } from 'vitest';
import { clientAddress, PEER_HEADER } from '../../app/_lib/server/client-address';

// OWASP ASVS 4.0.3 V13.1 / the X-Forwarded-For semantics of RFC 7239 §5.2 (each proxy appends
// the address it saw; everything to its left is the client's word).
describe('the client address is the socket peer unless proxies are configured', () => {
  const h = (o: Record<string, string>) => new Headers(o);
  test('without configured hops, a client’s own X-Forwarded-For and X-Real-IP are ignored', () => {
    const headers = h({ 'x-forwarded-for': '203.0.113.9', 'x-real-ip': '203.0.113.10', [PEER_HEADER]: '192.0.2.44' });
    expect(clientAddress(headers, 0, true)).toBe('192.0.2.44');
  });
  test('the peer header counts only when our own server wrote it', () => {
    expect(clientAddress(h({ [PEER_HEADER]: '192.0.2.44', 'x-forwarded-for': '203.0.113.9' }), 0, false)).toBe('');
  });
  test('with one hop, the address our proxy appended (the last) is taken, not the client’s forged first one', () => {
    expect(clientAddress(h({ 'x-forwarded-for': '203.0.113.9, 198.51.100.23' }), 1, false)).toBe('198.51.100.23');
  });
  test('with two hops, the address the outer proxy saw', () => {
    expect(clientAddress(h({ 'x-forwarded-for': '203.0.113.9, 198.51.100.23, 10.0.0.5' }), 2, false)).toBe('198.51.100.23');
  });
});
