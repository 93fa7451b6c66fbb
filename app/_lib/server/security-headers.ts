/**
 * The security headers of every response, in one place: pages get them from `proxy.ts` (with a
 * Content-Security-Policy holding a fresh nonce per request), API routes from the route wrapper
 * (`app/_lib/server/route.ts`) and the health check. Which ones apply is decided from configuration
 * (APP_URL), never from request headers. OWASP ASVS 4.0.3 §14.4 (HTTP security headers).
 *
 * Pure (no server-only import) so that the proxy can load it.
 */

/**
 * SHA-256 of the `<style>` element Observable Plot (0.6.17) writes into every plot with its
 * default class `plot-d6a7b5` (display, max-width, `white-space: pre` for labels). It is the
 * same text for every plot, drawn on the server (plotToSvg) or in the browser, so the policy
 * allows exactly it instead of 'unsafe-inline' for style elements.
 * test/unit/security-headers.test.ts recomputes it from Plot's output: an upgrade of Plot that
 * changes the text fails there.
 */
export const PLOT_STYLE_SHA256 = 'jSYQUrW7J0b3jPqhZP9C2Xh1PyJKHKXd4s0fpGGKrww=';

/** Browser features the app never uses, switched off for it and anything it could embed. */
const PERMISSIONS_OFF = [
  'accelerometer', 'bluetooth', 'camera', 'display-capture', 'geolocation', 'gyroscope', 'hid', 'magnetometer',
  'microphone', 'midi', 'payment', 'publickey-credentials-get', 'screen-wake-lock', 'serial', 'usb', 'xr-spatial-tracking',
];

/** True when the configured public origin is https (then HSTS and upgrade-insecure-requests apply). */
export const isHttpsOrigin = (appUrl: string) => /^https:\/\//i.test(appUrl);

/** The headers every response carries, pages and API alike (no Content-Security-Policy). */
export function commonHeaders(appUrl: string): Record<string, string> {
  return {
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'strict-origin-when-cross-origin',
    'Permissions-Policy': PERMISSIONS_OFF.map((f) => `${f}=()`).join(', '),
    // one year, subdomains too (ASVS 14.4.5); only where the app is served over https
    ...(isHttpsOrigin(appUrl) ? { 'Strict-Transport-Security': 'max-age=31536000; includeSubDomains' } : {}),
  };
}

/**
 * The policy of an HTML page. Scripts: only those carrying the request's nonce (Next.js puts it
 * on its own scripts when it finds it in the request's policy) and what they load
 * ('strict-dynamic': the chunks Next loads, Observable Plot loaded on demand).
 * Styles: our stylesheets ('self': Tailwind and the @fontsource faces), inline `<style>`
 * elements only with the nonce (Next's own) or Plot's fixed one (its hash). Style attributes
 * ('unsafe-inline' in style-src-attr only) are needed by React `style` props (the width of
 * progress bars) and by Plot, which sets the font, colour and background of each plot in its
 * SVG's style attribute; an attribute cannot run script, and style elements (the CSS that
 * could read a page through selectors) stay closed.
 * Images: our own (rig photos from /api/files/…, the icon) and blob: URLs, through which the
 * "Download PNG" button draws a plot's SVG on a canvas. Fonts: @fontsource's files served by
 * the app. Requests: our own API only.
 */
export function pageCsp(nonce: string, appUrl: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`,
    `style-src 'self' 'nonce-${nonce}' 'sha256-${PLOT_STYLE_SHA256}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(isHttpsOrigin(appUrl) ? ['upgrade-insecure-requests'] : []),
  ].join('; ');
}

/** The policy of anything that is not a page (JSON from the API, static files): nothing may load or frame it. */
export const NO_CONTENT_CSP = "default-src 'none'; frame-ancestors 'none'";

/** A fresh nonce: 128 random bits, base64. */
export function newNonce(): string {
  return Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString('base64');
}

/** Sets the common headers and a policy (NO_CONTENT_CSP unless given) on a response's headers. */
export function setSecurityHeaders(headers: Headers, appUrl: string, csp = NO_CONTENT_CSP): void {
  for (const [k, v] of Object.entries(commonHeaders(appUrl))) headers.set(k, v);
  headers.set('Content-Security-Policy', csp);
}
