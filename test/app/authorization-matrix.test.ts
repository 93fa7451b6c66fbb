/**
 * The authorization matrix: every API route and server action, called by each role of the demo
 * lab, an anonymous caller, a member of another lab and (where it applies) an API token. The
 * route files are enumerated from app/api, so a new route without an entry here fails the suite.
 * Mutating cases send bodies that pass authorization but change nothing (or nothing that matters).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, STRONG_PASSWORD, createAccount, signedIn, uniqueEmail } from './support/client';

const root = path.resolve(__dirname, '..', '..');
const ROLES = ['owner', 'engineer', 'reviewer', 'viewer'] as const;
type Caller = 'anon' | (typeof ROLES)[number] | 'outsider' | 'token';

interface Fixture {
  labId: string;
  rigId: string;
  trialId: string;
  fitId: string;
  studyId: string;
  cautionBlockId: string;
  ownerMemberId: string;
}

interface Case {
  method: string;
  url: (f: Fixture) => string;
  body?: (f: Fixture) => unknown;
  /** Sign in afresh for this case (it ends sessions). */
  fresh?: boolean;
  expect: Partial<Record<Caller, number>> & Record<'anon' | 'owner' | 'engineer' | 'reviewer' | 'viewer' | 'outsider', number>;
}

const all = (status: number) => ({ anon: status, owner: status, engineer: status, reviewer: status, viewer: status, outsider: status });
const members = (status: number, anon = 401, outsider = 404) => ({ anon, owner: status, engineer: status, reviewer: status, viewer: status, outsider });
/** Owners and engineers get `status`; reviewers and viewers 403; another lab's member 404. */
const writers = (status: number) => ({ anon: 401, owner: status, engineer: status, reviewer: 403, viewer: 403, outsider: 404 });
const uuid0 = '00000000-0000-4000-8000-000000000000';

const MATRIX: Record<string, Case[]> = {
  'app/api/health/route.ts': [{ method: 'GET', url: () => '/api/health', expect: { ...all(200), token: 200 } }],
  'app/api/auth/sign-up/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-up', body: () => ({ email: 'not-an-address' }), expect: all(422) }],
  'app/api/auth/sign-up/confirm/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-up/confirm', body: () => ({ token: 'sgn_not-a-real-token' }), expect: all(410) }],
  'app/api/auth/sign-in/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-in', body: () => ({ email: 'nobody' }), expect: all(422) }],
  'app/api/auth/forgot-password/route.ts': [
    { method: 'POST', url: () => '/api/auth/forgot-password', body: () => ({ email: uniqueEmail('forgot') }), expect: all(200) },
  ],
  'app/api/auth/reset-password/route.ts': [
    { method: 'POST', url: () => '/api/auth/reset-password', body: () => ({ token: 'rst_not-a-real-token', password: STRONG_PASSWORD }), expect: all(410) },
  ],
  'app/api/auth/password/route.ts': [
    {
      method: 'POST',
      url: () => '/api/auth/password',
      body: () => ({ currentPassword: 'not the password at all', newPassword: STRONG_PASSWORD }),
      expect: { ...members(422, 401, 422), token: 403 },
    },
  ],
  'app/api/auth/sign-out/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-out', fresh: true, expect: { ...members(200, 401, 200), token: 403 } }],
  'app/api/auth/sign-out-everywhere/route.ts': [
    { method: 'POST', url: () => '/api/auth/sign-out-everywhere', fresh: true, expect: { ...members(200, 401, 200), token: 403 } },
  ],
  'app/api/me/route.ts': [
    { method: 'GET', url: () => '/api/me', expect: { ...members(200, 401, 200), token: 200 } },
    { method: 'PATCH', url: () => '/api/me', body: () => ({ unitSystem: 'si' }), expect: { ...members(200, 401, 200), token: 403 } },
  ],
  'app/api/labs/route.ts': [
    { method: 'GET', url: () => '/api/labs', expect: { ...members(200, 401, 200), token: 200 } },
    { method: 'POST', url: () => '/api/labs', body: () => ({ name: '' }), expect: { ...members(422, 401, 422), token: 403 } },
  ],
  'app/api/labs/current/route.ts': [
    { method: 'POST', url: () => '/api/labs/current', body: (f) => ({ labId: f.labId }), expect: { ...members(200), token: 403 } },
  ],
  'app/api/labs/[labId]/members/route.ts': [{ method: 'GET', url: (f) => `/api/labs/${f.labId}/members`, expect: { ...members(200), token: 200 } }],
  'app/api/labs/[labId]/members/[memberId]/route.ts': [
    {
      method: 'PATCH',
      url: (f) => `/api/labs/${f.labId}/members/${f.ownerMemberId}`,
      body: () => ({ role: 'owner' }),
      expect: { anon: 401, owner: 200, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 },
    },
    {
      // The demo lab's only owner: the owner passes authorization and is stopped by the last-owner rule.
      method: 'DELETE',
      url: (f) => `/api/labs/${f.labId}/members/${f.ownerMemberId}`,
      expect: { anon: 401, owner: 409, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/labs/[labId]/invitations/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/invitations`, expect: { anon: 401, owner: 200, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 } },
    {
      method: 'POST',
      url: (f) => `/api/labs/${f.labId}/invitations`,
      body: () => ({ email: 'not-an-address', role: 'viewer' }),
      expect: { anon: 401, owner: 422, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/invitations/[token]/route.ts': [
    { method: 'POST', url: () => '/api/invitations/inv_not-a-real-token', expect: { ...members(410, 401, 410), token: 403 } },
  ],
  'app/api/labs/[labId]/audit/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/audit`, expect: { anon: 401, owner: 200, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 } },
  ],
  'app/api/labs/[labId]/mail/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/mail`, expect: { anon: 401, owner: 200, engineer: 403, reviewer: 403, viewer: 403, outsider: 404, token: 403 } },
  ],
  'app/api/labs/[labId]/rigs/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/rigs`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/rigs`, body: () => ({ name: '' }), expect: { ...writers(422), token: 422 } },
  ],
  'app/api/rigs/[rigId]/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rigId}`, expect: { ...members(200), token: 200 } },
    { method: 'PATCH', url: (f) => `/api/rigs/${f.rigId}`, body: () => ({}), expect: { ...writers(200), token: 200 } },
  ],
  'app/api/rigs/[rigId]/trials/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rigId}/trials`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/trials`, body: () => ({ inlet: 'warm', outlet: 'hot' }), expect: { ...writers(422), token: 422 } },
  ],
  'app/api/rigs/[rigId]/trials/bulk/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/trials/bulk`, body: () => ({ ids: ['not-a-trial'], patch: {} }), expect: { ...writers(422), token: 422 } },
  ],
  'app/api/rigs/[rigId]/analyze/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/analyze`, body: () => ({ models: ['coil'] }), expect: { ...members(200), token: 200 } },
  ],
  'app/api/labs/[labId]/fits/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/fits`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/fits`, body: () => ({ title: '' }), expect: { ...writers(422), token: 422 } },
  ],
  'app/api/fits/[fitId]/route.ts': [{ method: 'GET', url: (f) => `/api/fits/${f.fitId}`, expect: { ...members(200), token: 200 } }],
  'app/api/fits/[fitId]/export/route.ts': [{ method: 'GET', url: (f) => `/api/fits/${f.fitId}/export`, expect: { ...members(200), token: 200 } }],
  'app/api/fits/[fitId]/review/route.ts': [
    {
      // A draft cannot be approved: the reviewer passes authorization and meets the state rule (409);
      // the owner made this fit, and nobody decides on their own work (403).
      method: 'POST',
      url: (f) => `/api/fits/${f.fitId}/review`,
      body: () => ({ move: 'approve' }),
      expect: { anon: 401, owner: 403, engineer: 403, reviewer: 409, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/fits/[fitId]/comments/route.ts': [
    { method: 'GET', url: (f) => `/api/fits/${f.fitId}/comments`, expect: { ...members(200), token: 200 } },
    {
      method: 'POST',
      url: (f) => `/api/fits/${f.fitId}/comments`,
      body: () => ({ body: '' }),
      expect: { anon: 401, owner: 422, engineer: 422, reviewer: 422, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/rigs/[rigId]/uploads/route.ts': [{ method: 'POST', url: (f) => `/api/rigs/${f.rigId}/uploads`, expect: { ...writers(400), token: 400 } }],
  'app/api/rigs/[rigId]/uploads/[fileId]/preview/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/uploads/${uuid0}/preview`, expect: { anon: 401, owner: 404, engineer: 404, reviewer: 403, viewer: 403, outsider: 404, token: 404 } },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/confirm/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/uploads/${uuid0}/confirm`, expect: { anon: 401, owner: 404, engineer: 404, reviewer: 403, viewer: 403, outsider: 404, token: 404 } },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/log-import/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/uploads/${uuid0}/log-import`, expect: { anon: 401, owner: 404, engineer: 404, reviewer: 403, viewer: 403, outsider: 404, token: 404 } },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/segments/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/uploads/${uuid0}/segments`, expect: { anon: 401, owner: 404, engineer: 404, reviewer: 403, viewer: 403, outsider: 404, token: 404 } },
  ],
  'app/api/rigs/[rigId]/jobs/route.ts': [{ method: 'GET', url: (f) => `/api/rigs/${f.rigId}/jobs`, expect: { ...members(200), token: 200 } }],
  'app/api/jobs/[jobId]/route.ts': [
    // no such job: members and outsiders alike get 404 (test/app/sensor-import.test.ts checks a real job's lab scope)
    { method: 'GET', url: () => `/api/jobs/${uuid0}`, expect: { ...members(404, 401, 404), token: 404 } },
    { method: 'DELETE', url: () => `/api/jobs/${uuid0}`, expect: { ...members(404, 401, 404), token: 404 } },
  ],
  'app/api/rigs/[rigId]/imports/route.ts': [{ method: 'POST', url: (f) => `/api/rigs/${f.rigId}/imports`, expect: { ...writers(400), token: 400 } }],
  'app/api/labs/[labId]/forecast/route.ts': [
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/forecast`, body: () => ({ hours: 'soon' }), expect: { ...members(422), token: 422 } },
  ],
  'app/api/labs/[labId]/studies/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/studies`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/studies`, body: () => ({ title: '' }), expect: { ...writers(422), token: 403 } },
  ],
  'app/api/studies/[studyId]/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.studyId}`, expect: { ...members(200), token: 200 } },
    { method: 'PUT', url: (f) => `/api/studies/${f.studyId}`, body: () => ({ title: '' }), expect: { ...writers(422), token: 403 } },
  ],
  'app/api/studies/[studyId]/review/route.ts': [
    {
      method: 'POST',
      url: (f) => `/api/studies/${f.studyId}/review`,
      body: () => ({ move: 'approve' }),
      // the owner wrote this study: own work (403); the reviewer meets the state rule (409)
      expect: { anon: 401, owner: 403, engineer: 403, reviewer: 409, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/studies/[studyId]/comments/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.studyId}/comments`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/studies/${f.studyId}/comments`, body: () => ({ body: '' }), expect: { anon: 401, owner: 422, engineer: 422, reviewer: 422, viewer: 403, outsider: 404, token: 403 } },
  ],
  'app/api/studies/[studyId]/shares/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.studyId}/shares`, expect: { ...writers(200), token: 403 } },
    { method: 'POST', url: (f) => `/api/studies/${f.studyId}/shares`, body: () => ({ days: 0 }), expect: { ...writers(422), token: 403 } },
  ],
  'app/api/studies/[studyId]/blocks/[blockId]/route.ts': [
    // a new study's second block is its caution box (newStudy in app/_lib/studies.ts)
    { method: 'GET', url: (f) => `/api/studies/${f.studyId}/blocks/${f.cautionBlockId}`, expect: { ...members(200), token: 200 } },
    { method: 'GET', url: (f) => `/api/studies/${f.studyId}/blocks/no-such-block`, expect: { ...members(404), token: 404 } },
  ],
  'app/api/share/[token]/blocks/[blockId]/route.ts': [
    // valid links are checked in test/app/study-blocks.test.ts; here anyone, signed in or not, meets the same 404
    { method: 'GET', url: (f) => `/api/share/shr_not-a-real-token/blocks/${f.cautionBlockId}`, expect: { ...all(404), token: 404 } },
  ],
  'app/api/studies/[studyId]/export/route.ts': [{ method: 'GET', url: (f) => `/api/studies/${f.studyId}/export`, expect: { ...members(200), token: 200 } }],
  'app/api/shares/[shareId]/route.ts': [{ method: 'DELETE', url: () => `/api/shares/${uuid0}`, expect: { ...members(404, 401, 404), token: 403 } }],
  'app/api/share/[token]/export/route.ts': [{ method: 'GET', url: () => '/api/share/shr_not-a-real-token/export', expect: { ...all(404), token: 404 } }],
  'app/api/rigs/[rigId]/photos/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rigId}/photos`, expect: { ...members(200), token: 200 } },
    { method: 'POST', url: (f) => `/api/rigs/${f.rigId}/photos`, body: () => 'not a picture', expect: { ...writers(400), token: 400 } },
  ],
  'app/api/files/[fileId]/route.ts': [{ method: 'GET', url: () => `/api/files/${uuid0}`, expect: { ...members(404, 401, 404), token: 404 } }],
  'app/api/trials/[trialId]/route.ts': [
    { method: 'GET', url: (f) => `/api/trials/${f.trialId}`, expect: { ...members(200), token: 200 } },
    { method: 'PATCH', url: (f) => `/api/trials/${f.trialId}`, body: () => ({}), expect: { ...writers(200), token: 200 } },
  ],
  'app/api/tokens/route.ts': [
    { method: 'GET', url: () => '/api/tokens', expect: { ...members(200, 401, 200), token: 403 } },
    {
      method: 'POST',
      url: () => '/api/tokens',
      body: (f) => ({ name: 'matrix check', labId: f.labId, password: 'ember-demo-lab-2026' }),
      expect: { anon: 401, owner: 201, engineer: 201, reviewer: 403, viewer: 403, outsider: 404, token: 403 },
    },
  ],
  'app/api/tokens/[tokenId]/route.ts': [{ method: 'DELETE', url: () => `/api/tokens/${uuid0}`, expect: { ...members(404, 401, 404), token: 403 } }],
};

/** Server actions ('use server' files) and the cases that cover them; there are none yet. */
const SERVER_ACTIONS: Record<string, string[]> = {};

function walk(dir: string, out: string[] = []): string[] {
  for (const e of readdirSync(dir)) {
    const p = path.join(dir, e);
    if (statSync(p).isDirectory()) walk(p, out);
    else out.push(p);
  }
  return out;
}

const routeFiles = walk(path.join(root, 'app', 'api')).filter((f) => f.endsWith('route.ts'));
const methodsOf = (file: string) => [...readFileSync(file, 'utf8').matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);

describe('every route and server action has an entry in the matrix', () => {
  test.each(routeFiles.map((f) => [path.relative(root, f)]))('%s', (rel) => {
    const methods = methodsOf(path.join(root, rel)).sort();
    expect(MATRIX[rel], `add ${rel} to the authorization matrix`).toBeDefined();
    expect([...new Set(MATRIX[rel].map((c) => c.method))].sort()).toEqual(methods);
  });
  test('no matrix entry names a route that no longer exists', () => {
    const rels = new Set(routeFiles.map((f) => path.relative(root, f)));
    expect(Object.keys(MATRIX).filter((k) => !rels.has(k))).toEqual([]);
  });
  test('server actions are listed too', () => {
    const files = walk(path.join(root, 'app')).filter((f) => /\.(ts|tsx)$/.test(f) && /^['"]use server['"]/m.test(readFileSync(f, 'utf8')));
    expect(files.map((f) => path.relative(root, f)).filter((f) => !SERVER_ACTIONS[f])).toEqual([]);
  });
});

describe('authorization matrix', () => {
  const emails: Record<(typeof ROLES)[number], string> = {
    owner: 'owner@cinder-hollow.test',
    engineer: 'engineer@cinder-hollow.test',
    reviewer: 'reviewer@cinder-hollow.test',
    viewer: 'viewer@cinder-hollow.test',
  };
  const outsider = { email: uniqueEmail('outsider'), password: STRONG_PASSWORD };
  const clients = new Map<Caller, Client>();
  const bodies: string[] = [];
  const secrets: string[] = [];
  let fx: Fixture;

  async function clientFor(who: Caller, fresh: boolean): Promise<Client> {
    if (!fresh && clients.has(who)) return clients.get(who)!;
    let c: Client;
    if (who === 'anon') c = new Client();
    else if (who === 'outsider') c = await signedIn(outsider.email, outsider.password);
    else if (who === 'token') {
      c = new Client();
      c.origin = null; // scripts send no Origin
      c.bearer = secrets[0];
    } else c = await signedIn(emails[who]);
    const session = c.cookies.get('emberline_session');
    if (session) secrets.push(session);
    if (!fresh) clients.set(who, c);
    return c;
  }

  beforeAll(async () => {
    await createAccount(outsider.email, outsider.password, 'Outside Tester', 'Elsewhere Bench');
    const owner = await clientFor('owner', false);
    const me = await owner.get('/api/me');
    const lab = me.body.labs.find((l: { slug: string }) => l.slug === 'cinder-hollow');
    const rigs = await owner.get(`/api/labs/${lab.id}/rigs`);
    const mem = await owner.get(`/api/labs/${lab.id}/members`);
    // the demo rig, whatever other tests add to the lab meanwhile
    const demoRig = rigs.body.rigs.find((r: { name: string }) => r.name === 'Stovepipe Coil A');
    const trials = await owner.get(`/api/rigs/${demoRig.id}/trials?pageSize=500&excluded=included`);
    const saved = await owner.post(`/api/labs/${lab.id}/fits`, {
      rigId: demoRig.id,
      title: 'matrix fit',
      model: 'coil',
      trialIds: trials.body.trials.map((t: { id: string }) => t.id),
    });
    expect(saved.status, saved.text).toBe(201);
    const study = await owner.post(`/api/labs/${lab.id}/studies`, { title: 'matrix study' });
    expect(study.status, study.text).toBe(201);
    const cautionBlockId = (await owner.get(`/api/studies/${study.body.study.id}`)).body.study.blocks.find((b: { kind: string }) => b.kind === 'caution').id;
    fx = { labId: lab.id, rigId: demoRig.id, trialId: trials.body.trials[0].id, fitId: saved.body.fit.id, studyId: study.body.study.id, cautionBlockId, ownerMemberId: mem.body.members.find((m: { role: string }) => m.role === 'owner').id };
    const engineer = await clientFor('engineer', false);
    const tok = await engineer.post('/api/tokens', { name: 'matrix token', labId: fx.labId, password: 'ember-demo-lab-2026' });
    expect(tok.status).toBe(201);
    secrets.unshift(tok.body.secret);
  });

  const cases = Object.entries(MATRIX).flatMap(([file, list]) =>
    list.flatMap((c) => (Object.entries(c.expect) as [Caller, number][]).map(([who, status]) => ({ file, c, who, status }))),
  );
  // Cases that end sessions run last, each with a session of its own.
  cases.sort((a, b) => Number(!!a.c.fresh) - Number(!!b.c.fresh));

  test.each(cases.map((x) => [`${x.c.method} ${x.file.replace('app/api', '').replace('/route.ts', '') || '/'} as ${x.who} → ${x.status}`, x] as const))('%s', async (_name, x) => {
    const client = await clientFor(x.who, !!x.c.fresh);
    const r = await client.request(x.c.method, x.c.url(fx), x.c.body ? x.c.body(fx) : x.c.method === 'GET' ? undefined : {});
    bodies.push(r.text);
    expect(r.status, r.text.slice(0, 300)).toBe(x.status);
  });

  afterAll(() => {
    // No JSON response ever carries a password hash, a token hash, a session cookie or a secret.
    const forbidden = [
      ...secrets.filter(Boolean),
      ...secrets.filter(Boolean).map((s) => createHash('sha256').update(s).digest('hex')),
      process.env.SESSION_SECRET ?? 'no-secret-set',
    ];
    const all = bodies.join('\n');
    expect(all).not.toMatch(/\$argon2/);
    expect(all).not.toMatch(/passwordHash|password_hash|tokenHash|token_hash/);
    for (const s of forbidden) expect(all.includes(s), `a response contains a secret (${s.slice(0, 6)}…)`).toBe(false);
  });
});
