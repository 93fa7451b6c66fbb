/**
 * Where to go after signing in or up: only a path of our own origin. The value is resolved with
 * `URL` against the origin and kept only when the result has that same origin, so `//host`,
 * `/\host`, `https://host` and `javascript:` all fall back. Isomorphic (pages and client forms).
 * @example safeNextPath('/rigs?tab=1', 'http://127.0.0.1:3000', '/rigs') // '/rigs?tab=1'
 * @example safeNextPath('/\\example.com', 'http://127.0.0.1:3000', '/rigs') // '/rigs'
 */
export function safeNextPath(next: string | null | undefined, origin: string, fallback: string): string {
  if (!next || next.length > 500 || !next.startsWith('/')) return fallback;
  try {
    const u = new URL(next, origin);
    if (u.origin !== new URL(origin).origin) return fallback;
    return `${u.pathname}${u.search}${u.hash}`;
  } catch {
    return fallback;
  }
}
