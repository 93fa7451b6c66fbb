/**
 * A small HTTP client for integration tests against the running app: a cookie jar, our own
 * Origin on every request (as a browser sends it), and its own client address (X-Forwarded-For,
 * which `npm test` tells the app to believe as from one proxy: TRUST_PROXY_HOPS=1) so that the
 * per-address rate limits of one test do not spill into another.
 */
import { randomBytes } from 'node:crypto';
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import path from 'node:path';

export const baseUrl = process.env.EMBERLINE_URL ?? 'http://127.0.0.1:3000';
export const DEMO_PASSWORD = 'ember-demo-lab-2026';

// Client addresses from the IPv6 documentation prefix (RFC 3849), with a random part per test
// file, so that no two test files (or runs) ever share an address and its rate limits.
const addressPrefix = `2001:db8:${randomBytes(2).toString('hex')}:${randomBytes(2).toString('hex')}`;
let nextAddress = 1;

/** A client address of its own (a test client, or a browser: see test/e2e/support/browser.ts). */
export const newClientAddress = () => `${addressPrefix}::${(nextAddress++).toString(16)}`;

export interface Reply {
  status: number;
  headers: Headers;
  body: any;
  text: string;
}

export class Client {
  cookies = new Map<string, string>();
  bearer?: string;
  readonly ip: string;
  origin: string | null;
  /** the server this client talks to (the app of `npm test` unless another is given) */
  readonly base: string;

  constructor(ip?: string, base = baseUrl, origin: string | null = baseUrl) {
    this.ip = ip ?? newClientAddress();
    this.base = base;
    this.origin = origin;
  }

  async request(method: string, url: string, body?: unknown, headers: Record<string, string> = {}): Promise<Reply> {
    const h: Record<string, string> = { 'X-Forwarded-For': this.ip, ...headers };
    if (this.origin) h.Origin = this.origin;
    if (this.cookies.size) h.Cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (this.bearer) h.Authorization = `Bearer ${this.bearer}`;
    let payload: string | Uint8Array<ArrayBuffer> | FormData | undefined;
    if (body instanceof FormData) payload = body; // fetch sets the multipart boundary
    else if (body instanceof Uint8Array) {
      payload = new Uint8Array(body);
      h['Content-Type'] ??= 'application/octet-stream';
    } else if (body !== undefined) {
      payload = typeof body === 'string' ? body : JSON.stringify(body);
      h['Content-Type'] ??= 'application/json';
    }
    const res = await fetch(this.base + url, { method, headers: h, body: payload, redirect: 'manual' });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i);
      const value = pair.slice(i + 1);
      if (!value || /max-age=0/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    const text = await res.text();
    let parsed: unknown = null;
    try {
      parsed = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, headers: res.headers, body: parsed, text };
  }

  get = (url: string, headers?: Record<string, string>) => this.request('GET', url, undefined, headers);
  post = (url: string, body: unknown = {}) => this.request('POST', url, body);

  async signIn(email: string, password = DEMO_PASSWORD): Promise<Reply> {
    const r = await this.post('/api/auth/sign-in', { email, password });
    if (r.status !== 200) throw new Error(`sign-in of ${email} failed: ${r.status} ${r.text}`);
    return r;
  }
}

export async function signedIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const c = new Client();
  await c.signIn(email, password);
  return c;
}

let counter = 0;
/** A fresh, unique e-mail address for a test account. */
export const uniqueEmail = (tag: string) => `${tag}-${Date.now().toString(36)}-${counter++}@example.test`;
export const STRONG_PASSWORD = 'copper coil over a slow fire';

/** Messages captured by the SMTP fake (MAIL_CAPTURE_DIR), optionally to one address, newest last. */
export function mailTo(address?: string): { to: string[]; subject: string; text: string; html: string }[] {
  const dir = process.env.MAIL_CAPTURE_DIR;
  if (!dir || !existsSync(dir)) return [];
  return readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => JSON.parse(readFileSync(path.join(dir, f), 'utf8')))
    .filter((m) => !address || m.to.includes(address));
}

/** Waits for a message to the address whose subject matches, and returns the first link in its text. */
export async function waitForMailLink(address: string, subject: RegExp): Promise<{ link: string; mail: ReturnType<typeof mailTo>[number] }> {
  for (let i = 0; i < 50; i++) {
    const m = mailTo(address).filter((x) => subject.test(x.subject)).at(-1);
    if (m) {
      const link = /https?:\/\/\S+/.exec(m.text)?.[0];
      if (!link) throw new Error(`no link in mail "${m.subject}"`);
      return { link, mail: m };
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${address} matching ${subject}`);
}

/**
 * Makes an account the way a person does: sign up (the answer is 202 either way), follow the link
 * mailed to the address, confirm. Returns the client, signed in, and the new lab's id.
 */
export async function createAccount(email: string, password = STRONG_PASSWORD, name = 'Test Person', labName?: string, client = new Client()): Promise<{ client: Client; labId: string }> {
  const r = await client.post('/api/auth/sign-up', { email, name, password, ...(labName ? { labName } : {}) });
  if (r.status !== 202) throw new Error(`sign-up of ${email}: ${r.status} ${r.text}`);
  const { link } = await waitForMailLink(email, /finish signing up/i);
  const token = new URL(link).searchParams.get('token')!;
  const done = await client.post('/api/auth/sign-up/confirm', { token });
  if (done.status !== 201) throw new Error(`sign-up confirmation of ${email}: ${done.status} ${done.text}`);
  const me = await client.get('/api/me');
  return { client, labId: me.body.labs[0].id as string };
}
