import 'server-only';
import { createHash } from 'node:crypto';

/** Settings of one server process, derived from its environment (see {@link readConfig}). */
export interface Config {
  /** Demo mode: demo sign-ins are shown and a lab's owners read the invitations it sent under "Captured mail". */
  demo: boolean;
  production: boolean;
  /**
   * The public origin (scheme, host, port) of the app, from `APP_URL`: every link in e-mail and the
   * same-origin check use it, never a request header. Empty when it is not configured (allowed
   * only outside production: then {@link appOrigin} falls back to the loopback origin).
   */
  appUrl: string;
  smtpUrl: string;
  mailFrom: string;
  /** Folder where the local SMTP fake stores captured messages (demo mode only). */
  mailCaptureDir: string;
  /** Largest JSON body any route reads, in bytes. */
  maxJsonBytes: number;
  /**
   * How many proxies in front of the app append to `X-Forwarded-For` (`TRUST_PROXY_HOPS`, default 0).
   * With 0 the client address is the socket's peer; with N it is the N-th address from the right.
   */
  trustProxyHops: number;
  /** Session and lab cookies carry `Secure` (and the session cookie the `__Host-` prefix). */
  secureCookies: boolean;
  /** Name of the session cookie: `__Host-emberline_session` when secure, else `emberline_session`. */
  sessionCookie: string;
  /** SESSION_SECRET has at least 32 characters. */
  sessionSecretSet: boolean;
}

/** Problems that stop a production server from starting (empty when it may start). */
export function configProblems(c: Config): string[] {
  const out: string[] = [];
  if (!c.production) return out;
  if (!c.sessionSecretSet) out.push('SESSION_SECRET must be set to at least 32 random characters in production: it signs the session cookies.');
  if (!c.appUrl) out.push('APP_URL must be set in production to the public origin of the app (for example https://emberline.example.com): links in e-mail and the same-origin check use it.');
  else if (!c.demo && !c.appUrl.startsWith('https://') && !isLoopbackOrigin(c.appUrl)) {
    out.push(`APP_URL must be an https origin in production (got ${c.appUrl}): session cookies are Secure.`);
  }
  return out;
}

export function isLoopbackOrigin(origin: string): boolean {
  try {
    const h = new URL(origin).hostname;
    return h === '127.0.0.1' || h === 'localhost' || h === '[::1]';
  } catch {
    return false;
  }
}

function originOf(url: string): string {
  if (!url) return '';
  try {
    return new URL(url).origin;
  } catch {
    return '';
  }
}

/** Derives the settings from an environment (pure, for tests). */
export function readConfig(env: Record<string, string | undefined>): Config {
  const demo = env.EMBERLINE_DEMO === 'true';
  const production = env.NODE_ENV === 'production';
  const appUrl = originOf((env.APP_URL ?? '').trim());
  const hops = Number(env.TRUST_PROXY_HOPS ?? 0);
  const secureCookies = appUrl.startsWith('https://') || (production && !demo && !isLoopbackOrigin(appUrl));
  return {
    demo,
    production,
    appUrl,
    smtpUrl: env.SMTP_URL ?? '',
    mailFrom: env.MAIL_FROM ?? 'Emberline <no-reply@emberline.invalid>',
    mailCaptureDir: env.MAIL_CAPTURE_DIR ?? '',
    maxJsonBytes: 64 * 1024,
    trustProxyHops: Number.isInteger(hops) && hops >= 0 && hops <= 10 ? hops : 0,
    secureCookies,
    sessionCookie: secureCookies ? '__Host-emberline_session' : 'emberline_session',
    sessionSecretSet: (env.SESSION_SECRET ?? '').length >= 32,
  };
}

/** The settings of this process, read from its environment once. */
export const config: Config = readConfig(process.env);

/**
 * The public origin for links in e-mail and for the same-origin check: `APP_URL`, or outside
 * production the loopback origin of this server (`http://127.0.0.1:$PORT`).
 * @throws Error in production without `APP_URL` (the server refuses to start before that).
 */
export function appOrigin(c: Config = config): string {
  if (c.appUrl) return c.appUrl;
  if (c.production) throw new Error('APP_URL is not set');
  return `http://127.0.0.1:${process.env.PORT ?? 3000}`;
}

/**
 * The origins whose requests count as our own: the configured origin and, when it is a loopback
 * origin, the same scheme and port on the other loopback names (a browser on this machine may
 * use localhost or 127.0.0.1; no other site can send those origins).
 */
export function ownOrigins(c: Config = config): Set<string> {
  const origin = appOrigin(c);
  const out = new Set([origin]);
  if (isLoopbackOrigin(origin)) {
    const u = new URL(origin);
    for (const host of ['127.0.0.1', 'localhost', '[::1]']) out.add(`${u.protocol}//${host}${u.port ? `:${u.port}` : ''}`);
  }
  return out;
}

let secretKey: Uint8Array | undefined;

/** The HMAC key that signs session JWTs (SESSION_SECRET, at least 32 characters). */
export function sessionKey(): Uint8Array {
  if (secretKey) return secretKey;
  const secret = process.env.SESSION_SECRET ?? '';
  if (secret.length < 32) throw new Error('SESSION_SECRET must be set to at least 32 random characters');
  secretKey = new Uint8Array(createHash('sha256').update(secret).digest());
  return secretKey;
}
