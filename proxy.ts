import { NextResponse, type NextRequest } from 'next/server';
import { config as appConfig } from '@/app/_lib/server/config';
import { newNonce, pageCsp, setSecurityHeaders } from '@/app/_lib/server/security-headers';

/**
 * Security headers for pages and static files (app/_lib/server/security-headers.ts). Each page request
 * gets a fresh nonce: it is put in the request's Content-Security-Policy, where Next.js finds it
 * and writes it on its own scripts and styles while it renders (the pages are rendered per
 * request: the root layout is force-dynamic), and in the response's.
 *
 * API routes are left out on purpose: for a request the proxy handles, Next.js clones the body
 * and buffers it in memory (up to proxyClientMaxBodySize, silently cutting the rest) before the
 * route runs, which would defeat the streamed body limits of the route wrapper. The wrapper sets
 * the same headers on API responses.
 */
/**
 * The files of public/ (icons, robots.txt, the manifest) sit at the top level and have an
 * extension; no page has one. They are served to anyone: nothing in this proxy signs in.
 */
const PUBLIC_FILE = /^\/[\w.-]+\.(?:ico|png|svg|txt|webmanifest)$/;
const isPublicFile = (pathname: string) => PUBLIC_FILE.test(pathname);

export function proxy(request: NextRequest) {
  const appUrl = appConfig.appUrl;
  if (request.nextUrl.pathname.startsWith('/_next/') || isPublicFile(request.nextUrl.pathname)) {
    // scripts, styles, fonts and images of the build, and the files of public/: a policy that loads nothing
    const res = NextResponse.next();
    setSecurityHeaders(res.headers, appUrl);
    return res;
  }
  const csp = pageCsp(newNonce(), appUrl);
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set('Content-Security-Policy', csp);
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  setSecurityHeaders(res.headers, appUrl, csp);
  return res;
}

export const config = {
  // everything but /api and /api/…
  matcher: ['/((?!api/|api$).*)'],
};
