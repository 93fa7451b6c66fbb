/**
 * The authorization matrix of the pages: every page.tsx under app/ (enumerated from the tree, so a
 * new page without an entry fails), fetched with lab A's objects in its path by every caller of
 * test/app/support/authz.ts, without following redirects. Anonymous callers of member pages are
 * sent to /sign-in?next=<the page> (3xx); a member of lab B gets 404 for lab A's objects, and a
 * role without the page's action 404 (`requireLabAction` in app/_lib/accounts/viewer.ts: no hint of what
 * exists); public pages answer 200. Pages read the session cookie only: a Bearer token opens no
 * page, so the token callers are anonymous here. Pages that list the current lab's things, seen by
 * lab B's owner, hold nothing of lab A.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { baseUrl } from '../support/client';
import { CALLERS, ROLES, SESSION_CALLERS, buildLab, repoFiles, setAddressRange, type Caller, type LabFixture, type Role } from '../support/authz';

setAddressRange('192.0.2.');

/** 200, 404, 'sign-in' (3xx to /sign-in?next=<path>) or a redirect elsewhere. */
type Outcome = 200 | 404 | 'sign-in' | { to: string };
interface PageCase {
  path: (f: LabFixture) => string;
  expect: Record<Caller, Outcome>;
  /** text a 200 must show (it is the page asked for) and a 404 must not */
  marker?: (f: LabFixture) => string;
  /** a page of the current lab: lab B's owner sees nothing of lab A on it */
  listsLab?: boolean;
}

const NOT_SIGNED_IN: readonly Caller[] = CALLERS.filter((c) => !SESSION_CALLERS.includes(c));
const each = (fn: (c: Caller) => Outcome) => Object.fromEntries(CALLERS.map((c) => [c, fn(c)])) as Record<Caller, Outcome>;

/** Anyone, signed in or not. */
const publicPage = () => each(() => 200);
/** Any signed-in person, whatever their labs. */
const signedInPage = () => each((c) => (NOT_SIGNED_IN.includes(c) ? 'sign-in' : 200));
/**
 * A page of the current lab that `roles` may open (others 404). `outsider`: what lab B's owner
 * gets — 200 for a page of their own lab, 404 for one of lab A's objects.
 */
const labPage = (roles: readonly Role[], outsider: 200 | 404) =>
  each((c) => (NOT_SIGNED_IN.includes(c) ? 'sign-in' : c === 'outsider' ? outsider : roles.includes(c as Role) ? 200 : 404));

const WRITERS: readonly Role[] = ['owner', 'engineer'];

const PAGES: Record<string, PageCase> = {
  'app/page.tsx': { path: () => '/', expect: publicPage() },
  'app/sign-in/page.tsx': { path: () => '/sign-in', expect: each((c) => (NOT_SIGNED_IN.includes(c) ? 200 : { to: '/start' })) },
  'app/sign-up/page.tsx': { path: () => '/sign-up', expect: publicPage() },
  // opening a sign-up link changes nothing (mail scanners open links): the page only offers the button
  'app/sign-up/confirm/page.tsx': { path: () => '/sign-up/confirm?token=sgn_not-a-real-token', expect: publicPage() },
  'app/forgot-password/page.tsx': { path: () => '/forgot-password', expect: publicPage() },
  'app/reset-password/page.tsx': { path: () => '/reset-password?token=rst_not-a-real-token', expect: publicPage() },
  'app/help/permissions/page.tsx': { path: () => '/help/permissions', expect: publicPage() },
  'app/share/[token]/page.tsx': { path: (f) => `/share/${f.share.token}`, expect: publicPage(), marker: (f) => f.study.title },
  'app/invitations/[token]/page.tsx': { path: (f) => `/invitations/${encodeURIComponent(f.invitation.token)}`, expect: publicPage() },
  'app/account/page.tsx': { path: () => '/account', expect: signedInPage() },
  'app/notices/page.tsx': { path: () => '/notices', expect: signedInPage() },
  'app/labs/new/page.tsx': { path: () => '/labs/new', expect: signedInPage() },
  'app/rigs/page.tsx': { path: () => '/rigs', expect: labPage(ROLES, 200), marker: (f) => f.rig.name, listsLab: true },
  'app/rigs/new/page.tsx': { path: () => '/rigs/new', expect: labPage(WRITERS, 200), listsLab: true },
  'app/rigs/[rigId]/page.tsx': { path: (f) => `/rigs/${f.rig.id}`, expect: labPage(ROLES, 404), marker: (f) => f.rig.name },
  'app/rigs/[rigId]/entry/page.tsx': { path: (f) => `/rigs/${f.rig.id}/entry`, expect: labPage(WRITERS, 404), marker: (f) => f.rig.name },
  'app/rigs/[rigId]/fit/page.tsx': { path: (f) => `/rigs/${f.rig.id}/fit`, expect: labPage(ROLES, 404), marker: (f) => f.rig.name },
  'app/rigs/[rigId]/collector/page.tsx': { path: (f) => `/rigs/${f.rig.id}/collector`, expect: labPage(ROLES, 404), marker: (f) => f.rig.name },
  'app/rigs/[rigId]/import/page.tsx': { path: (f) => `/rigs/${f.rig.id}/import`, expect: labPage(WRITERS, 404), marker: (f) => f.rig.name },
  // lab A's rig named in the query: lab B's owner gets the page of their own lab, without it
  'app/trials/page.tsx': { path: (f) => `/trials?rig=${f.rig.id}`, expect: labPage(ROLES, 200), marker: (f) => f.rig.name, listsLab: true },
  'app/sessions/[sessionId]/page.tsx': { path: (f) => `/sessions/${f.sessions.open}`, expect: labPage(ROLES, 404), marker: (f) => `Authz session ${f.run}` },
  'app/fits/page.tsx': { path: () => '/fits', expect: labPage(ROLES, 200), marker: (f) => f.fit.title, listsLab: true },
  'app/fits/[fitId]/page.tsx': { path: (f) => `/fits/${f.fit.id}`, expect: labPage(ROLES, 404), marker: (f) => f.fit.title },
  'app/forecasts/page.tsx': { path: () => '/forecasts', expect: labPage(ROLES, 200), marker: (f) => f.fit.title, listsLab: true },
  'app/studies/page.tsx': { path: () => '/studies', expect: labPage(ROLES, 200), marker: (f) => f.study.title, listsLab: true },
  'app/start/page.tsx': { path: () => '/start', expect: labPage(ROLES, 200), listsLab: true },
  'app/comparisons/page.tsx': { path: () => '/comparisons', expect: labPage(ROLES, 200), marker: (f) => f.comparison.title, listsLab: true },
  'app/comparisons/[comparisonId]/page.tsx': { path: (f) => `/comparisons/${f.comparison.id}`, expect: labPage(ROLES, 404), marker: (f) => f.comparison.title },
  'app/studies/[studyId]/page.tsx': { path: (f) => `/studies/${f.study.id}`, expect: labPage(ROLES, 404), marker: (f) => f.study.title },
  'app/lab/members/page.tsx': { path: () => '/lab/members', expect: labPage(ROLES, 200), marker: (f) => f.labName, listsLab: true },
  'app/lab/audit/page.tsx': { path: () => '/lab/audit', expect: labPage(['owner'], 200), listsLab: true },
  'app/lab/mail/page.tsx': { path: () => '/lab/mail', expect: labPage(['owner'], 200), listsLab: true },
};

const pageFiles = repoFiles('app', (name) => name === 'page.tsx');

describe('every page has an entry in the matrix', () => {
  test.each(pageFiles.map((f) => [f]))('%s', (file) => {
    expect(PAGES[file], `add ${file} to the page matrix`).toBeDefined();
  });
  test('no matrix entry names a page that no longer exists', () => {
    expect(Object.keys(PAGES).filter((k) => !pageFiles.includes(k))).toEqual([]);
  });
  test('a page path is its file path with the segments filled in', () => {
    for (const [file, c] of Object.entries(PAGES)) {
      const pattern = file.replace(/^app/, '').replace(/\/page\.tsx$/, '').replace(/\[\w+\]/g, '[^/]+') || '/';
      const fake = { share: { token: 't' }, invitation: { token: 't' }, rig: { id: 'r' }, fit: { id: 'f' }, study: { id: 's' }, sessions: { open: 'o', closed: 'c' }, comparison: { id: 'c' } } as unknown as LabFixture;
      expect(c.path(fake).split('?')[0], file).toMatch(new RegExp(`^${pattern}$`));
    }
  });
});

describe('page matrix', () => {
  let f: LabFixture;
  const pages: string[] = [];

  beforeAll(async () => {
    f = await buildLab();
  }, 120_000);

  const cases = Object.entries(PAGES)
    .filter(([file]) => pageFiles.includes(file))
    .flatMap(([file, c]) => CALLERS.map((who) => ({ file, c, who, outcome: c.expect[who] })));
  const shown = (o: Outcome) => (typeof o === 'object' ? `→ ${o.to}` : o === 'sign-in' ? '→ sign-in' : String(o));

  test.each(cases.map((x) => [`${x.file.replace(/^app/, '').replace(/\/?page\.tsx$/, '') || '/'} as ${x.who} ${shown(x.outcome)}`, x] as const))('%s', async (_n, x) => {
    const client = f.clients[x.who];
    const url = x.c.path(f);
    const reply = await client.get(url, { Accept: 'text/html' });
    pages.push(reply.text);
    const where = reply.headers.get('location');
    const o = x.outcome;
    if (o === 'sign-in' || typeof o === 'object') {
      expect(reply.status, `${url}: ${reply.text.slice(0, 200)}`).toBeGreaterThanOrEqual(300);
      expect(reply.status).toBeLessThan(400);
      const to = new URL(where ?? '', baseUrl);
      if (o === 'sign-in') {
        expect(to.pathname).toBe('/sign-in');
        expect(to.searchParams.get('next')).toBe(url.split('?')[0]);
      } else expect(to.pathname).toBe(o.to);
      return;
    }
    expect(reply.status, `${url} (${where ?? 'no redirect'})`).toBe(o);
    const marker = x.c.marker?.(f);
    if (o === 404) {
      expect(reply.text).toContain('Nothing here');
      if (marker) expect(reply.text).not.toContain(marker);
    } else if (marker && x.who !== 'outsider') expect(reply.text).toContain(marker);
    if (x.who === 'outsider' && x.c.listsLab) {
      for (const a of [f.labName, f.rig.name, f.fit.title, f.study.title]) expect(reply.text, `lab A's "${a}" on ${url}`).not.toContain(a);
    }
  });

  afterAll(() => {
    if (!f) return;
    // No page carries a password hash, a token hash, a session cookie or an API token.
    const secrets = f.secrets.filter(Boolean);
    const all = pages.join('\n');
    expect(all).not.toMatch(/\$argon2/);
    for (const s of [...secrets, ...secrets.map((x) => createHash('sha256').update(x).digest('hex')), process.env.SESSION_SECRET ?? 'no-secret-set']) {
      expect(all.includes(s), `a page contains a secret (${s.slice(0, 6)}…)`).toBe(false);
    }
  });
});
