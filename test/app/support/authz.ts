/**
 * The callers and the objects of the authorization tests (test/app/authorization/).
 *
 * Lab A is the demo lab "Cinder Hollow Test Yard" (fixtures/demo-lab.ts) with its four members, one
 * per role; everything the cases touch in it is made here through the API, in a rig of our own, so
 * nothing depends on what other test files leave behind. Lab B is a fresh lab made by signing up
 * (its owner is the "outsider"). The callers are anonymous, lab B's owner and an API token of lab
 * B, an API token of lab A (the engineer's), each role of lab A, and an expired and a revoked token
 * of lab A.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { expect } from 'vitest';
import { DEMO_PASSWORD, coilOutletC, demoLab, demoUsers } from '@/fixtures/demo-lab';
import { Client, STRONG_PASSWORD, createAccount, uniqueEmail, waitForMailLink, type Reply } from './client';
import { LOG_MAPPING, jobFinished, logFolder } from './sensor-logs';

export const ROLES = ['owner', 'engineer', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];
export const CALLERS = ['anon', 'outsider', 'tokenB', 'tokenA', ...ROLES, 'expired', 'revoked'] as const;
export type Caller = (typeof CALLERS)[number];
/** Callers that send a session cookie (the others send nothing, or a Bearer token and no Origin). */
export const SESSION_CALLERS: readonly Caller[] = ['outsider', ...ROLES];

const root = path.resolve(__dirname, '..', '..', '..');

/** Files below a folder of the repository whose name passes `keep`, as repository paths ("app/api/me/route.ts"). */
export function repoFiles(dir: string, keep: (name: string) => boolean): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const e of readdirSync(d)) {
      const p = path.join(d, e);
      if (statSync(p).isDirectory()) walk(p);
      else if (keep(e)) out.push(path.relative(root, p).split(path.sep).join('/'));
    }
  };
  walk(path.join(root, dir));
  return out.sort();
}

export const emailOf = (role: Role) => demoUsers.find((u) => u.role === role)!.email;

let addressSeq = 0;
let addressPrefix = '198.51.100.';
/**
 * Client addresses of one test file (documentation ranges, RFC 5737), so that the per-address
 * rate limits of one file never spill into another's.
 */
export function setAddressRange(prefix: '198.51.100.' | '192.0.2.' | '203.0.113.') {
  addressPrefix = prefix;
}
export const newClient = () => new Client(`${addressPrefix}${(addressSeq++ % 250) + 1}`);

async function signIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const c = newClient();
  await c.signIn(email, password);
  return c;
}

function ok(r: Reply, status: number, what: string) {
  expect(r.status, `${what}: ${r.text.slice(0, 400)}`).toBe(status);
  return r.body;
}

/** The four members of lab A, signed in, with lab A as their current lab. */
export async function labA(): Promise<{ labId: string; clients: Record<Role, Client> }> {
  const clients = {} as Record<Role, Client>;
  for (const role of ROLES) clients[role] = await signIn(emailOf(role));
  const lab = ok(await clients.owner.get('/api/me'), 200, 'me').labs.find((l: { slug: string }) => l.slug === demoLab.slug);
  expect(lab, 'the demo lab is loaded').toBeTruthy();
  // pages show the current lab (the lab-switcher cookie): make it lab A, whatever else they belong to
  for (const role of ROLES) ok(await clients[role].post('/api/labs/current', { labId: lab.id }), 200, `current lab of ${role}`);
  return { labId: lab.id, clients };
}

/**
 * Trials of the constant-source coil model (DOMAIN.md §1.2, the model of the demo lab's trials) with
 * round numbers of our own: Ts = 85 °C, UA = 400 W/K, inlet 18 °C, flows 4…18 L/min, and a
 * deterministic wiggle of ±0.05 K so that the fit has residuals.
 */
export function coilTrials(n = 8) {
  const start = Date.UTC(2026, 5, 1, 9);
  return Array.from({ length: n }, (_, i) => {
    const flowM3PerS = ((4 + (14 * i) / (n - 1)) * 1e-3) / 60;
    const outlet = coilOutletC(85, 18, 400, flowM3PerS * 990, 4180) + ((i % 3) - 1) * 0.05;
    return { startedAt: new Date(start + i * 600_000).toISOString(), flow: flowM3PerS, inlet: 18, outlet: Math.round(outlet * 100) / 100, notes: `authz trial ${i + 1}` };
  });
}

/** A rig of the engineer's own in lab A with coil trials; returns it and the trial ids. */
export async function rigWithTrials(eng: Client, labId: string, name: string) {
  const rig = ok(
    await eng.post(`/api/labs/${labId}/rigs`, {
      name,
      heatSource: 'wood-fire',
      description: 'A copper coil over a fire pit, kept for the authorization tests.',
      notes: 'Every harmless case must leave these notes as they are.',
      details: { coilLengthM: 12, tubeInnerDiameterM: 0.0127, tubeMaterial: 'copper' },
    }),
    201,
    'new rig',
  ).rig;
  const trials = ok(await eng.post(`/api/rigs/${rig.id}/trials`, { trials: coilTrials() }), 201, 'trials').trials as { id: string }[];
  return { rig, trialIds: trials.map((t) => t.id) };
}

/** A safe operating plan (flow before fire, pump until cold), SI. */
export const AUTHZ_PLAN = {
  name: 'Authz plan',
  loop: { loop: 'open', relief: 'none' },
  steps: [{ kind: 'pump-on' }, { kind: 'flow-set', flowM3PerS: 2e-4 }, { kind: 'fire-lit' }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 35 }, { kind: 'pump-off' }],
};

export interface LabFixture {
  run: string;
  labId: string;
  labName: string;
  labBId: string;
  outsider: { email: string; password: string };
  clients: Record<Caller, Client>;
  memberIds: Record<Role, string>;
  /** the outsider's membership of lab B */
  outsiderMemberId: string;
  units: Partial<Record<Caller, 'si' | 'us'>>;
  rig: { id: string; name: string };
  trialIds: string[];
  fit: { id: string; title: string };
  /** a design comparison of the rig against its saved fit, with a reviewer's comment */
  comparison: { id: string; title: string };
  study: { id: string; title: string; revision: number; blockIds: { text: string; caution: string; fit: string } };
  /** test sessions of the rig: one planned, one closed (with no trials) */
  sessions: { open: string; closed: string };
  /** an operating plan of the rig (the DELETE case replaces it after each delete) */
  plan: { id: string };
  share: { id: string; token: string };
  revokedShareId: string;
  invitation: { email: string; token: string; id: string };
  tokens: Record<'tokenA' | 'tokenB' | 'expired' | 'revoked', { id: string; secret: string }>;
  /** set when the expired token could not be made (the column api_token.expires_at is missing) */
  expiredProblem?: string;
  files?: {
    sheet: { id: string; bytes: Buffer; confirmBody: unknown };
    log: { id: string; importBody: unknown };
    jobId: string;
    photo: { id: string; bytes: Buffer };
  };
  /** every secret handed out while building: none may ever come back in a response */
  secrets: string[];
}

/** A 1×1 PNG: the 8-byte signature (ISO/IEC 15948 §5.2) and filler, enough for the magic-number check. */
const PNG = (run: string) => Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from(`authz ${run}`), Buffer.alloc(32, 1)]);

/** A token of `labId` made by `c` (with its current password, as the token route asks). */
async function newToken(c: Client, labId: string, name: string, password: string) {
  const b = ok(await c.post('/api/tokens', { name, labId, password }), 201, `token ${name}`);
  return { id: b.token.id as string, secret: b.secret as string };
}

function bearer(secret: string): Client {
  const c = newClient();
  c.origin = null; // scripts send no Origin
  c.bearer = secret;
  return c;
}

/**
 * Builds lab A's objects and every caller. With `files`, also an uploaded and imported trial sheet,
 * an uploaded sensor log imported by a (finished) background job, and a rig photo.
 */
export async function buildLab(opts: { files?: boolean } = {}): Promise<LabFixture> {
  const run = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const { labId, clients: roles } = await labA();
  const { owner, engineer: eng, reviewer } = roles;
  const secrets: string[] = [];

  const members = ok(await owner.get(`/api/labs/${labId}/members`), 200, 'members').members as { id: string; role: string; user: { email: string } }[];
  const memberIds = Object.fromEntries(ROLES.map((r) => [r, members.find((m) => m.user.email === emailOf(r))!.id])) as Record<Role, string>;
  // the last-owner case (DELETE of the owner's membership → 409) needs the demo owner to be the only one
  expect(members.filter((m) => m.role === 'owner').map((m) => m.user.email), 'lab A has one owner').toEqual([emailOf('owner')]);

  // lab B: a fresh account (signed up and confirmed through the captured mail)
  const outsider = { email: uniqueEmail('authz-outsider'), password: STRONG_PASSWORD };
  const { client: outsiderClient } = await createAccount(outsider.email, outsider.password, 'Outside Tester', `Elsewhere Bench ${run}`);
  const labB = ok(await outsiderClient.get('/api/me'), 200, 'outsider me').labs[0];
  const outsiderMemberId = ok(await outsiderClient.get(`/api/labs/${labB.id}/members`), 200, 'lab B members').members[0].id;

  const { rig, trialIds } = await rigWithTrials(eng, labId, `Authz rig ${run}`);
  const fitTitle = `Authz fit ${run}`;
  const fit = ok(await eng.post(`/api/labs/${labId}/fits`, { rigId: rig.id, title: fitTitle, model: 'coil', trialIds }), 201, 'fit').fit;
  ok(await reviewer.post(`/api/fits/${fit.id}/comments`, { body: 'Residuals look even across the flows.' }), 201, 'fit comment');
  const comparisonTitle = `Authz comparison ${run}`;
  const comparison = ok(await eng.post(`/api/labs/${labId}/comparisons`, { title: comparisonTitle, subjects: [{ kind: 'rig', id: rig.id }, { kind: 'fit', id: fit.id }] }), 201, 'comparison').comparison;
  ok(await reviewer.post(`/api/comparisons/${comparison.id}/comments`, { body: 'The same trials on both sides: no difference expected.' }), 201, 'comparison comment');

  const sessionPlan = { prior: { Ts: '85 degC', UA: '400 W/K' }, inletTemp: '18 degC', flowRange: ['2 L/min', '20 L/min'], maxOutletTemp: '95 degC', trials: 8, seed: 1 };
  const openSession = ok(await eng.post(`/api/rigs/${rig.id}/sessions`, { ...sessionPlan, title: `Authz session ${run}` }), 201, 'session').session.id as string;
  const closedSession = ok(await eng.post(`/api/rigs/${rig.id}/sessions`, { ...sessionPlan, title: `Authz closed session ${run}` }), 201, 'session to close').session.id as string;
  ok(await eng.post(`/api/sessions/${closedSession}/close`, {}), 200, 'close session');
  const plan = ok(await eng.post(`/api/rigs/${rig.id}/plans`, AUTHZ_PLAN), 201, 'operating plan').plan.id as string;

  const studyTitle = `Authz study ${run}`;
  const created = ok(await eng.post(`/api/labs/${labId}/studies`, { title: studyTitle }), 201, 'study').study;
  const loaded = ok(await eng.get(`/api/studies/${created.id}`), 200, 'study').study;
  const blocks = [...loaded.blocks, { id: 'fit1', kind: 'fit', data: { fitId: fit.id } }];
  const saved = ok(await eng.request('PUT', `/api/studies/${created.id}`, { title: studyTitle, baseRevision: loaded.revision, blocks }), 200, 'study blocks').study;
  const blockId = (kind: string) => saved.blocks.find((b: { kind: string }) => b.kind === kind).id as string;
  ok(await reviewer.post(`/api/studies/${created.id}/comments`, { body: 'Say which inlet the table assumes.', blockId: blockId('text') }), 201, 'study comment');

  const shared = ok(await eng.post(`/api/studies/${created.id}/shares`, { days: 30 }), 201, 'share');
  const share = { id: shared.share.id as string, token: String(shared.url).split('/share/')[1] };
  const revokedShareId = ok(await eng.post(`/api/studies/${created.id}/shares`, { days: 30 }), 201, 'share to revoke').share.id as string;
  ok(await eng.request('DELETE', `/api/shares/${revokedShareId}`), 200, 'revoke share');

  const inviteeEmail = uniqueEmail('authz-invitee');
  const inv = ok(await owner.post(`/api/labs/${labId}/invitations`, { email: inviteeEmail, role: 'viewer' }), 201, 'invitation').invitation;
  const { link } = await waitForMailLink(inviteeEmail, /invited/i);
  const invitation = { email: inviteeEmail, id: inv.id as string, token: decodeURIComponent(new URL(link).pathname.split('/').at(-1)!) };

  const tokens = {
    tokenA: await newToken(eng, labId, `authz A ${run}`, DEMO_PASSWORD),
    tokenB: await newToken(outsiderClient, labB.id, `authz B ${run}`, outsider.password),
    expired: await newToken(eng, labId, `authz expired ${run}`, DEMO_PASSWORD),
    revoked: await newToken(eng, labId, `authz revoked ${run}`, DEMO_PASSWORD),
  };
  ok(await eng.request('DELETE', `/api/tokens/${tokens.revoked.id}`), 200, 'revoke token');
  let expiredProblem: string | undefined;
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    await db.query(`UPDATE api_token SET expires_at = now() - interval '1 day' WHERE id = $1`, [tokens.expired.id]);
  } catch (e) {
    expiredProblem = `the expired token could not be made: ${(e as Error).message}`;
  } finally {
    await db.end();
  }

  let files: LabFixture['files'];
  if (opts.files) {
    // a trial sheet of fixtures/import (see its README), with a run-unique note so that its bytes are new
    const src = readFileSync(path.join(root, 'fixtures', 'import', 'trials-de.csv'), 'utf8');
    const sheetBytes = Buffer.from(src.replace('Glut gleichmäßig', `Glut gleichmäßig ${run}`));
    const up = ok(await eng.request('POST', `/api/rigs/${rig.id}/uploads?filename=authz-trials.csv`, new Uint8Array(sheetBytes), { 'Content-Type': 'text/csv' }), 201, 'sheet upload').file;
    const preview = ok(await eng.post(`/api/rigs/${rig.id}/uploads/${up.id}/preview`, {}), 200, 'sheet preview');
    const confirmBody = { mapping: preview.mapping };
    ok(await eng.post(`/api/rigs/${rig.id}/uploads/${up.id}/confirm`, confirmBody), 201, 'sheet import');

    const folder = logFolder('authz');
    try {
      const logBytes = await folder.make(2500);
      const log = ok(await eng.request('POST', `/api/rigs/${rig.id}/uploads?filename=authz-log.csv`, new Uint8Array(logBytes), { 'Content-Type': 'text/csv' }), 201, 'log upload').file;
      const importBody = { mapping: LOG_MAPPING, preset: 'field' };
      const started = ok(await eng.post(`/api/rigs/${rig.id}/uploads/${log.id}/log-import`, importBody), 202, 'log import');
      const job = await jobFinished(eng, started.job.id);
      expect(job.state, job.error).toBe('completed');
      const photoBytes = PNG(run);
      const photo = ok(await eng.request('POST', `/api/rigs/${rig.id}/photos?filename=authz.png`, new Uint8Array(photoBytes), { 'Content-Type': 'image/png' }), 201, 'photo').photo;
      files = { sheet: { id: up.id, bytes: sheetBytes, confirmBody }, log: { id: log.id, importBody }, jobId: started.job.id, photo: { id: photo.id, bytes: photoBytes } };
    } finally {
      folder.remove();
    }
  }

  const clients: Record<Caller, Client> = {
    anon: newClient(),
    outsider: outsiderClient,
    tokenB: bearer(tokens.tokenB.secret),
    tokenA: bearer(tokens.tokenA.secret),
    ...roles,
    expired: bearer(tokens.expired.secret),
    revoked: bearer(tokens.revoked.secret),
  };
  const units: LabFixture['units'] = {};
  for (const who of SESSION_CALLERS) units[who] = ok(await clients[who].get('/api/me'), 200, `me of ${who}`).user.unitSystem;
  for (const who of SESSION_CALLERS) secrets.push(clients[who].cookies.get('emberline_session')!);
  secrets.push(...Object.values(tokens).map((t) => t.secret));

  return {
    run,
    labId,
    labName: demoLab.name,
    labBId: labB.id,
    outsider,
    clients,
    memberIds,
    outsiderMemberId,
    units,
    rig: { id: rig.id, name: rig.name },
    trialIds,
    fit: { id: fit.id, title: fitTitle },
    comparison: { id: comparison.id as string, title: comparisonTitle },
    study: { id: created.id, title: studyTitle, revision: saved.revision, blockIds: { text: blockId('text'), caution: blockId('caution'), fit: blockId('fit') } },
    share,
    sessions: { open: openSession, closed: closedSession },
    plan: { id: plan },
    revokedShareId,
    invitation,
    tokens,
    expiredProblem,
    files,
    secrets,
  };
}

/** A new session for a caller whose case ends sessions (sign-out, sign-out-everywhere). */
export async function freshSession(f: LabFixture, who: Caller): Promise<Client> {
  if (who === 'outsider') return signIn(f.outsider.email, f.outsider.password);
  if ((ROLES as readonly string[]).includes(who)) return signIn(emailOf(who as Role));
  return f.clients[who];
}
