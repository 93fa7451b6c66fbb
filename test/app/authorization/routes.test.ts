/**
 * The authorization matrix of the HTTP API: every route file under app/api (enumerated from the
 * tree, so a new route without an entry fails), called with real objects of lab A by every caller
 * of test/app/support/authz.ts — anonymous, lab B's owner, an API token of lab B, an API token of
 * lab A (engineer), each role of lab A, an expired and a revoked token of lab A. Every case states
 * the status each caller gets. Mutating cases send bodies that pass authorization but change
 * nothing that matters, and the ones that claim to be harmless check the object afterwards.
 * Then: the CSRF refusal of every cookie-authenticated state-changing route, and no response
 * carrying a password hash, a token hash, a session cookie or a secret.
 *
 * The expected statuses follow the permissions table of app/_lib/labs/permissions.ts, written out here
 * (not computed from it) so that a change of the table shows up as a change of this matrix.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { DEMO_PASSWORD } from '@/fixtures/demo-lab';
import { STRONG_PASSWORD, uniqueEmail, type Client, type Reply } from '../support/client';
import { AUTHZ_PLAN, CALLERS, ROLES, buildLab, emailOf, freshSession, repoFiles, setAddressRange, type Caller, type LabFixture, type Role } from '../support/authz';

setAddressRange('198.51.100.');

const root = path.resolve(__dirname, '..', '..', '..');
type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
type Expect = Record<Caller, number>;

interface Case {
  method: Method;
  url: (f: LabFixture) => string;
  /** the body (JSON unless a string, bytes or FormData); POST/PUT/PATCH/DELETE without one send `{}` */
  body?: (f: LabFixture, who: Caller) => unknown;
  headers?: Record<string, string>;
  /** the case ends sessions: each session caller gets one of its own, and the case runs last */
  fresh?: boolean;
  expect: Expect;
  /** after each caller's request: the object is as it was (or the throwaway is cleaned up) */
  after?: (x: { f: LabFixture; who: Caller; reply: Reply; client: Client }) => Promise<void> | void;
}

const WRITERS: readonly Role[] = ['owner', 'engineer']; // rig:write, trial:write, fit:write, study:write, share:manage, token:manage
const COMMENTERS: readonly Role[] = ['owner', 'engineer', 'reviewer']; // review:comment
const OWNERS: readonly Role[] = ['owner']; // member:manage, audit:read, mail:read
const MEMBERS: readonly Role[] = ROLES; // lab:read, lab:export

/** Anyone gets `status`; a token that is no longer valid is refused before anything (401). */
const open = (status: number): Expect => ({ ...(Object.fromEntries(CALLERS.map((c) => [c, status])) as Expect), expired: 401, revoked: 401 });

/** A route about the signed-in person (no lab object): every session `status`; tokens `tokens`. */
const self = (status: number, tokens: number): Expect => ({
  anon: 401, outsider: status, tokenB: tokens, tokenA: tokens, owner: status, engineer: status, reviewer: status, viewer: status, expired: 401, revoked: 401,
});

/**
 * A route on an object of lab A that `roles` may use: they get `status`, other members 403,
 * anyone outside lab A 404 (a token of lab B too). `session`: the route refuses API tokens (403).
 */
const labA = (status: number, roles: readonly Role[], o: { session?: boolean } = {}): Expect => ({
  anon: 401,
  outsider: 404,
  tokenB: o.session ? 403 : 404,
  tokenA: o.session ? 403 : roles.includes('engineer') ? status : 403,
  owner: roles.includes('owner') ? status : 403,
  engineer: roles.includes('engineer') ? status : 403,
  reviewer: roles.includes('reviewer') ? status : 403,
  viewer: roles.includes('viewer') ? status : 403,
  expired: 401,
  revoked: 401,
});

// --- what "unchanged" means for the objects the mutating cases touch --------------------------------

const isSession = (who: Caller) => who === 'outsider' || (ROLES as readonly string[]).includes(who);
let rigBefore: Record<string, unknown>;
let trialBefore: { trial: Record<string, unknown>; history: unknown[] };
let studyBefore: Record<string, unknown>;

const rigNow = async (f: LabFixture) => {
  const { updatedAt: _u, ...rig } = (await f.clients.engineer.get(`/api/rigs/${f.rig.id}`)).body.rig;
  return rig;
};
const trialNow = async (f: LabFixture) => (await f.clients.engineer.get(`/api/trials/${f.trialIds[0]}`)).body;
const studyNow = async (f: LabFixture) => {
  const s = (await f.clients.engineer.get(`/api/studies/${f.study.id}`)).body.study;
  return { title: s.title, revision: s.revision, blocks: s.blocks, reviewState: s.reviewState, updatedBy: s.updatedBy };
};
const roleOf = async (f: LabFixture, role: Role) => (await f.clients.owner.get(`/api/labs/${f.labId}/members`)).body.members.find((m: { id: string }) => m.id === f.memberIds[role])?.role;
const reviewStateOf = async (f: LabFixture) => (await f.clients.engineer.get(`/api/fits/${f.fit.id}`)).body.fit.reviewState;
const tokenRow = async (f: LabFixture, id: string) => (await f.clients.engineer.get('/api/tokens')).body.tokens.find((t: { id: string }) => t.id === id);
const revokedShare = async (f: LabFixture) => (await f.clients.engineer.get(`/api/studies/${f.study.id}/shares`)).body.shares.find((s: { id: string }) => s.id === f.revokedShareId);
let revokedShareAt: string;
let revokedTokenAt: string;

const sheetForm = (f: LabFixture) => {
  const form = new FormData();
  form.set('file', new Blob([new Uint8Array(f.files!.sheet.bytes)], { type: 'text/csv' }), 'authz-trials-again.csv');
  return form;
};

const MATRIX: Record<string, Case[]> = {
  'app/api/health/route.ts': [
    {
      // Liveness only, for anyone: no database error text, no migration names.
      method: 'GET',
      url: () => '/api/health',
      expect: { ...open(200), expired: 200, revoked: 200 },
      after: ({ reply }) => expect(reply.body).toEqual({ ok: true }),
    },
  ],
  'app/api/[...path]/route.ts': [
    // a path no route answers: JSON 404 through the route wrapper, for every method
    { method: 'GET', url: () => '/api/no-such-route', expect: open(404) },
    ...(['POST', 'PUT', 'PATCH', 'DELETE'] as const).map((method): Case => ({ method, url: (f) => `/api/rigs/${f.rig.id}/no-such-thing`, expect: open(404) })),
  ],
  'app/api/auth/sign-up/route.ts': [
    { method: 'POST', url: () => '/api/auth/sign-up', body: () => ({ email: 'not-an-address' }), expect: open(422) },
    {
      // An address that has an account gets the same answer as a new one (a mail goes out, nothing is
      // made); the callers spread over the five accounts we know, so that no address is asked often.
      method: 'POST',
      url: () => '/api/auth/sign-up',
      body: (f, who) => ({ email: [f.outsider.email, ...ROLES.map(emailOf)][CALLERS.indexOf(who) % 5], name: 'Someone Else', password: STRONG_PASSWORD }),
      expect: open(202),
      after: ({ reply }) => {
        if (reply.status === 202) expect(reply.body).toMatchObject({ ok: true, message: expect.any(String) });
      },
    },
  ],
  'app/api/auth/sign-up/confirm/route.ts': [
    { method: 'POST', url: () => '/api/auth/sign-up/confirm', body: () => ({ token: 'sgn_not-a-real-token-0123456789abcdef' }), expect: open(410) },
  ],
  'app/api/auth/sign-in/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-in', body: () => ({ email: 'nobody' }), expect: open(422) }],
  'app/api/auth/forgot-password/route.ts': [
    { method: 'POST', url: () => '/api/auth/forgot-password', body: () => ({ email: uniqueEmail('authz-forgot') }), expect: open(200) },
  ],
  'app/api/auth/reset-password/route.ts': [
    { method: 'POST', url: () => '/api/auth/reset-password', body: () => ({ token: 'rst_not-a-real-token', password: STRONG_PASSWORD }), expect: open(410) },
  ],
  'app/api/auth/password/route.ts': [
    { method: 'POST', url: () => '/api/auth/password', body: () => ({ currentPassword: 'not the password at all', newPassword: STRONG_PASSWORD }), expect: self(422, 403) },
  ],
  'app/api/auth/sign-out/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-out', fresh: true, expect: self(200, 403) }],
  'app/api/auth/sign-out-everywhere/route.ts': [{ method: 'POST', url: () => '/api/auth/sign-out-everywhere', fresh: true, expect: self(200, 403) }],
  'app/api/me/route.ts': [
    {
      method: 'GET',
      url: () => '/api/me',
      expect: self(200, 200),
      after: ({ f, who, reply }) => {
        // a token sees its own lab only
        if (who === 'tokenA') expect(reply.body.labs.map((l: { id: string }) => l.id)).toEqual([f.labId]);
        if (who === 'tokenB') expect(reply.body.labs.map((l: { id: string }) => l.id)).toEqual([f.labBId]);
      },
    },
    {
      method: 'PATCH',
      url: () => '/api/me',
      body: (f, who) => ({ unitSystem: f.units[who] ?? 'si' }),
      expect: self(200, 403),
      after: ({ f, who, reply }) => {
        if (reply.status === 200) expect(reply.body.user.unitSystem).toBe(f.units[who]);
      },
    },
  ],
  'app/api/labs/route.ts': [
    {
      method: 'GET',
      url: () => '/api/labs',
      expect: self(200, 200),
      after: ({ f, who, reply }) => {
        if (who === 'tokenA') expect(reply.body.labs.map((l: { id: string }) => l.id)).toEqual([f.labId]);
        if (who === 'outsider' || who === 'tokenB') expect(reply.body.labs.map((l: { id: string }) => l.id)).toEqual([f.labBId]);
      },
    },
    { method: 'POST', url: () => '/api/labs', body: () => ({ name: '' }), expect: self(422, 403) },
  ],
  'app/api/labs/current/route.ts': [
    // lab A is already the current lab of its members: switching to it changes nothing
    { method: 'POST', url: () => '/api/labs/current', body: (f) => ({ labId: f.labId }), expect: labA(200, MEMBERS, { session: true }) },
  ],
  'app/api/labs/[labId]/members/route.ts': [{ method: 'GET', url: (f) => `/api/labs/${f.labId}/members`, expect: labA(200, MEMBERS) }],
  'app/api/labs/[labId]/members/[memberId]/route.ts': [
    {
      // the viewer stays a viewer
      method: 'PATCH',
      url: (f) => `/api/labs/${f.labId}/members/${f.memberIds.viewer}`,
      body: () => ({ role: 'viewer' }),
      expect: labA(200, OWNERS, { session: true }),
      after: async ({ f }) => expect(await roleOf(f, 'viewer')).toBe('viewer'),
    },
    {
      // lab B's owner names a membership of lab A under lab B's address: no such member there
      method: 'PATCH',
      url: (f) => `/api/labs/${f.labBId}/members/${f.memberIds.viewer}`,
      body: () => ({ role: 'viewer' }),
      expect: { anon: 401, outsider: 404, tokenB: 403, tokenA: 403, owner: 404, engineer: 404, reviewer: 404, viewer: 404, expired: 401, revoked: 401 },
    },
    {
      // the demo lab's only owner: the owner passes authorization and meets the last-owner rule
      method: 'DELETE',
      url: (f) => `/api/labs/${f.labId}/members/${f.memberIds.owner}`,
      expect: labA(409, OWNERS, { session: true }),
      after: async ({ f }) => expect(await roleOf(f, 'owner')).toBe('owner'),
    },
    {
      // lab A's owner names lab B's membership under lab A's address: no such member in lab A
      method: 'DELETE',
      url: (f) => `/api/labs/${f.labId}/members/${f.outsiderMemberId}`,
      expect: labA(404, OWNERS, { session: true }),
    },
  ],
  'app/api/labs/[labId]/invitations/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/invitations`, expect: labA(200, OWNERS, { session: true }) },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/invitations`, body: () => ({ email: 'not-an-address', role: 'viewer' }), expect: labA(422, OWNERS, { session: true }) },
  ],
  'app/api/invitations/[token]/route.ts': [
    {
      // a real invitation, for another address: refused for everyone signed in, and still open afterwards
      method: 'POST',
      url: (f) => `/api/invitations/${encodeURIComponent(f.invitation.token)}`,
      expect: self(410, 403),
      after: async ({ f }) => {
        const inv = (await f.clients.owner.get(`/api/labs/${f.labId}/invitations`)).body.invitations.find((i: { id: string }) => i.id === f.invitation.id);
        expect(inv).toMatchObject({ acceptedAt: null, revokedAt: null });
      },
    },
  ],
  'app/api/labs/[labId]/audit/route.ts': [{ method: 'GET', url: (f) => `/api/labs/${f.labId}/audit`, expect: labA(200, OWNERS, { session: true }) }],
  'app/api/labs/[labId]/mail/route.ts': [{ method: 'GET', url: (f) => `/api/labs/${f.labId}/mail`, expect: labA(200, OWNERS, { session: true }) }],
  'app/api/labs/[labId]/rigs/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/rigs`, expect: labA(200, MEMBERS) },
    // the name of a rig the lab has: refused by the unique-name rule, nothing is made
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/rigs`, body: (f) => ({ name: f.rig.name, heatSource: 'wood-fire' }), expect: labA(409, WRITERS) },
  ],
  'app/api/rigs/[rigId]/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rig.id}`, expect: labA(200, MEMBERS) },
    {
      // its own name again: description, notes and details stay as they are
      method: 'PATCH',
      url: (f) => `/api/rigs/${f.rig.id}`,
      body: (f) => ({ name: f.rig.name }),
      expect: labA(200, WRITERS),
      after: async ({ f }) => expect(await rigNow(f)).toEqual(rigBefore),
    },
  ],
  'app/api/rigs/[rigId]/trials/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rig.id}/trials`, expect: labA(200, MEMBERS) },
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/trials`, body: () => ({ inlet: 'warm', outlet: 'hot' }), expect: labA(422, WRITERS) },
  ],
  'app/api/rigs/[rigId]/trials/bulk/route.ts': [
    {
      // the notes it already has: no change, no history row
      method: 'POST',
      url: (f) => `/api/rigs/${f.rig.id}/trials/bulk`,
      body: (f) => ({ ids: [f.trialIds[0]], patch: { notes: trialBefore.trial.notes } }),
      expect: labA(200, WRITERS),
      after: async ({ f }) => expect(await trialNow(f)).toEqual(trialBefore),
    },
  ],
  'app/api/rigs/[rigId]/analyze/route.ts': [
    // exploring a fit stores nothing: any member may
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/analyze`, body: (f) => ({ models: ['poly1'], trialIds: f.trialIds }), expect: labA(200, MEMBERS) },
  ],
  'app/api/rigs/[rigId]/collector/route.ts': [
    // exploring stores nothing: any member may; the fixture's rig is a propane burner, so members meet the rule (422)
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/collector`, body: () => ({ areaBasis: 'gross' }), expect: labA(422, MEMBERS) },
  ],
  'app/api/rigs/[rigId]/collector/fits/route.ts': [
    // saving needs fit:write; the burner rig is not a collector, so writers meet the rule (422) and nothing is stored
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/collector/fits`, body: () => ({ title: 'authz collector', areaBasis: 'gross' }), expect: labA(422, WRITERS) },
  ],
  'app/api/labs/[labId]/fits/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/fits`, expect: labA(200, MEMBERS) },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/fits`, body: (f) => ({ rigId: f.rig.id, title: '', model: 'coil', trialIds: f.trialIds }), expect: labA(422, WRITERS) },
  ],
  'app/api/fits/[fitId]/route.ts': [{ method: 'GET', url: (f) => `/api/fits/${f.fit.id}`, expect: labA(200, MEMBERS) }],
  'app/api/fits/[fitId]/export/route.ts': [{ method: 'GET', url: (f) => `/api/fits/${f.fit.id}/export?format=csv&table=Fit`, expect: labA(200, MEMBERS) }],
  'app/api/fits/[fitId]/review/route.ts': [
    {
      // the engineer's draft cannot be approved: deciders pass authorization and meet the state rule (409)
      method: 'POST',
      url: (f) => `/api/fits/${f.fit.id}/review`,
      body: () => ({ move: 'approve' }),
      expect: labA(409, ['owner', 'reviewer'], { session: true }),
      after: async ({ f }) => expect(await reviewStateOf(f)).toBe('draft'),
    },
  ],
  'app/api/fits/[fitId]/comments/route.ts': [
    {
      method: 'GET',
      url: (f) => `/api/fits/${f.fit.id}/comments`,
      expect: labA(200, MEMBERS),
      after: ({ reply }) => {
        if (reply.status === 200) expect(reply.body.comments.map((c: { body: string }) => c.body)).toContain('Residuals look even across the flows.');
      },
    },
    { method: 'POST', url: (f) => `/api/fits/${f.fit.id}/comments`, body: () => ({ body: '' }), expect: labA(422, COMMENTERS, { session: true }) },
  ],
  'app/api/rigs/[rigId]/uploads/route.ts': [
    {
      // the trial sheet's bytes again: recognised as the stored file, nothing new is kept
      method: 'POST',
      url: (f) => `/api/rigs/${f.rig.id}/uploads?filename=authz-trials-again.csv`,
      body: (f) => new Uint8Array(f.files!.sheet.bytes),
      headers: { 'Content-Type': 'text/csv' },
      expect: labA(200, WRITERS),
      after: ({ f, reply }) => {
        if (reply.status === 200) expect(reply.body).toMatchObject({ duplicate: true, file: { id: f.files!.sheet.id } });
      },
    },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/preview/route.ts': [
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/uploads/${f.files!.sheet.id}/preview`, body: () => ({}), expect: labA(200, WRITERS) },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/confirm/route.ts': [
    // the sheet is imported already: the same confirmation is refused (409), nothing is written twice
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/uploads/${f.files!.sheet.id}/confirm`, body: (f) => f.files!.sheet.confirmBody, expect: labA(409, WRITERS) },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/log-import/route.ts': [
    // the log is imported already (its job has completed): refused (409), no job is started
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/uploads/${f.files!.log.id}/log-import`, body: (f) => f.files!.log.importBody, expect: labA(409, WRITERS) },
  ],
  'app/api/rigs/[rigId]/uploads/[fileId]/segments/route.ts': [
    // reading the log's series stores nothing
    {
      method: 'POST',
      url: (f) => `/api/rigs/${f.rig.id}/uploads/${f.files!.log.id}/segments`,
      body: (f) => ({ ...(f.files!.log.importBody as object), seriesOnly: true }),
      expect: labA(200, WRITERS),
    },
  ],
  'app/api/rigs/[rigId]/sessions/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rig.id}/sessions`, expect: labA(200, MEMBERS) },
    // too few runs: refused by the schema after the rig is authorized, nothing is planned
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/sessions`, body: () => ({ prior: { Ts: '85 degC', UA: '400 W/K' }, inletTemp: '18 degC', flowRange: ['2 L/min', '20 L/min'], maxOutletTemp: '95 degC', trials: 3 }), expect: labA(422, WRITERS) },
  ],
  'app/api/rigs/[rigId]/plans/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rig.id}/plans`, expect: labA(200, MEMBERS) },
    // a plan without a name: refused after authorization, nothing is stored
    { method: 'POST', url: (f) => `/api/rigs/${f.rig.id}/plans`, body: () => ({ ...AUTHZ_PLAN, name: '' }), expect: labA(422, WRITERS) },
  ],
  'app/api/plans/[planId]/route.ts': [
    { method: 'GET', url: (f) => `/api/plans/${f.plan.id}`, expect: labA(200, MEMBERS) },
    // the plan as it is: nothing changes
    { method: 'PUT', url: (f) => `/api/plans/${f.plan.id}`, body: () => AUTHZ_PLAN, expect: labA(200, WRITERS) },
    {
      // a writer deletes it; the plan is made again for the next caller
      method: 'DELETE',
      url: (f) => `/api/plans/${f.plan.id}`,
      expect: labA(200, WRITERS),
      after: async ({ f, reply }) => {
        if (reply.status === 200) f.plan.id = (await f.clients.engineer.post(`/api/rigs/${f.rig.id}/plans`, AUTHZ_PLAN)).body.plan.id;
      },
    },
  ],
  'app/api/sessions/[sessionId]/route.ts': [{ method: 'GET', url: (f) => `/api/sessions/${f.sessions.open}`, expect: labA(200, MEMBERS) }],
  'app/api/sessions/[sessionId]/events/route.ts': [{ method: 'GET', url: (f) => `/api/sessions/${f.sessions.open}/events?once=1`, expect: labA(200, MEMBERS) }],
  // a run the session does not have: nothing changes
  'app/api/sessions/[sessionId]/runs/route.ts': [{ method: 'POST', url: (f) => `/api/sessions/${f.sessions.open}/runs`, body: () => ({ action: 'skip', runKey: 'r999' }), expect: labA(422, WRITERS) }],
  'app/api/sessions/[sessionId]/readings/route.ts': [{ method: 'POST', url: (f) => `/api/sessions/${f.sessions.open}/readings`, body: () => ({ runKey: 'r1', inlet: 'warm' }), expect: labA(422, WRITERS) }],
  'app/api/sessions/[sessionId]/samples/route.ts': [{ method: 'POST', url: (f) => `/api/sessions/${f.sessions.open}/samples`, body: () => ({ samples: [] }), expect: labA(422, WRITERS) }],
  // closing a closed session answers its stored verdict; a study of a session without a fit is refused
  'app/api/sessions/[sessionId]/close/route.ts': [{ method: 'POST', url: (f) => `/api/sessions/${f.sessions.closed}/close`, expect: labA(200, WRITERS) }],
  'app/api/sessions/[sessionId]/study/route.ts': [{ method: 'POST', url: (f) => `/api/sessions/${f.sessions.closed}/study`, expect: labA(409, WRITERS) }],
  'app/api/rigs/[rigId]/jobs/route.ts': [
    {
      method: 'GET',
      url: (f) => `/api/rigs/${f.rig.id}/jobs`,
      expect: labA(200, MEMBERS),
      after: ({ f, reply }) => {
        if (reply.status === 200) expect(reply.body.jobs.map((j: { id: string }) => j.id)).toContain(f.files!.jobId);
      },
    },
  ],
  'app/api/jobs/[jobId]/route.ts': [
    { method: 'GET', url: (f) => `/api/jobs/${f.files!.jobId}`, expect: labA(200, MEMBERS) },
    // a finished job cannot be cancelled: those who may cancel get 409
    { method: 'DELETE', url: (f) => `/api/jobs/${f.files!.jobId}`, expect: labA(409, WRITERS) },
  ],
  'app/api/rigs/[rigId]/imports/route.ts': [
    {
      // a script sends the imported sheet again: recognised, nothing added
      method: 'POST',
      url: (f) => `/api/rigs/${f.rig.id}/imports`,
      body: (f) => sheetForm(f),
      expect: labA(200, WRITERS),
      after: ({ reply }) => {
        if (reply.status === 200) expect(reply.body).toMatchObject({ duplicate: true, message: expect.stringMatching(/nothing was added/) });
      },
    },
  ],
  'app/api/labs/[labId]/forecast/route.ts': [{ method: 'POST', url: (f) => `/api/labs/${f.labId}/forecast`, body: () => ({ hours: 'soon' }), expect: labA(422, MEMBERS) }],
  'app/api/labs/[labId]/tub-fill/route.ts': [{ method: 'POST', url: (f) => `/api/labs/${f.labId}/tub-fill`, body: () => ({ tubVolume: 'full' }), expect: labA(422, MEMBERS) }],
  'app/api/labs/[labId]/studies/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/studies`, expect: labA(200, MEMBERS) },
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/studies`, body: () => ({ title: '' }), expect: labA(422, WRITERS, { session: true }) },
  ],
  'app/api/labs/[labId]/comparisons/route.ts': [
    { method: 'GET', url: (f) => `/api/labs/${f.labId}/comparisons`, expect: labA(200, MEMBERS) },
    // a body the schema refuses (no title, one design): nothing is stored
    { method: 'POST', url: (f) => `/api/labs/${f.labId}/comparisons`, body: (f) => ({ title: '', subjects: [{ kind: 'rig', id: f.rig.id }] }), expect: labA(422, WRITERS, { session: true }) },
  ],
  'app/api/comparisons/[comparisonId]/route.ts': [{ method: 'GET', url: (f) => `/api/comparisons/${f.comparison.id}`, expect: labA(200, MEMBERS) }],
  'app/api/comparisons/[comparisonId]/comments/route.ts': [
    { method: 'GET', url: (f) => `/api/comparisons/${f.comparison.id}/comments`, expect: labA(200, MEMBERS) },
    { method: 'POST', url: (f) => `/api/comparisons/${f.comparison.id}/comments`, body: () => ({ body: '' }), expect: labA(422, COMMENTERS, { session: true }) },
  ],
  'app/api/comparisons/[comparisonId]/export/route.ts': [{ method: 'GET', url: (f) => `/api/comparisons/${f.comparison.id}/export?format=csv&table=Comparison`, expect: labA(200, MEMBERS) }],
  'app/api/studies/[studyId]/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.study.id}`, expect: labA(200, MEMBERS) },
    {
      // a save against a revision the study never had: the edit-conflict rule refuses it, nothing is written
      method: 'PUT',
      url: (f) => `/api/studies/${f.study.id}`,
      body: (f) => ({ title: f.study.title, blocks: studyBefore.blocks, baseRevision: f.study.revision + 1000 }),
      expect: labA(409, WRITERS, { session: true }),
      after: async ({ f }) => expect(await studyNow(f)).toEqual(studyBefore),
    },
  ],
  'app/api/studies/[studyId]/review/route.ts': [
    {
      method: 'POST',
      url: (f) => `/api/studies/${f.study.id}/review`,
      body: () => ({ move: 'approve' }),
      expect: labA(409, ['owner', 'reviewer'], { session: true }),
      after: async ({ f }) => expect((await studyNow(f)).reviewState).toBe('draft'),
    },
  ],
  'app/api/studies/[studyId]/comments/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.study.id}/comments`, expect: labA(200, MEMBERS) },
    { method: 'POST', url: (f) => `/api/studies/${f.study.id}/comments`, body: () => ({ body: '' }), expect: labA(422, COMMENTERS, { session: true }) },
  ],
  'app/api/studies/[studyId]/shares/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.study.id}/shares`, expect: labA(200, WRITERS, { session: true }) },
    { method: 'POST', url: (f) => `/api/studies/${f.study.id}/shares`, body: () => ({ days: 0 }), expect: labA(422, WRITERS, { session: true }) },
  ],
  'app/api/studies/[studyId]/blocks/[blockId]/route.ts': [
    { method: 'GET', url: (f) => `/api/studies/${f.study.id}/blocks/${f.study.blockIds.fit}`, expect: labA(200, MEMBERS) },
    { method: 'GET', url: (f) => `/api/studies/${f.study.id}/blocks/no-such-block`, expect: labA(404, MEMBERS) },
  ],
  'app/api/share/[token]/blocks/[blockId]/route.ts': [
    // anyone holding the link, signed in or not
    { method: 'GET', url: (f) => `/api/share/${f.share.token}/blocks/${f.study.blockIds.fit}`, expect: open(200) },
  ],
  'app/api/share/[token]/export/route.ts': [{ method: 'GET', url: (f) => `/api/share/${f.share.token}/export?format=csv&table=Fit`, expect: open(200) }],
  'app/api/studies/[studyId]/export/route.ts': [{ method: 'GET', url: (f) => `/api/studies/${f.study.id}/export?format=csv&table=Fit`, expect: labA(200, MEMBERS) }],
  'app/api/shares/[shareId]/route.ts': [
    {
      // revoking a link that is revoked already changes nothing
      method: 'DELETE',
      url: (f) => `/api/shares/${f.revokedShareId}`,
      expect: labA(200, WRITERS, { session: true }),
      after: async ({ f }) => expect((await revokedShare(f)).revokedAt).toBe(revokedShareAt),
    },
  ],
  'app/api/rigs/[rigId]/photos/route.ts': [
    { method: 'GET', url: (f) => `/api/rigs/${f.rig.id}/photos`, expect: labA(200, MEMBERS) },
    {
      // the same picture again: recognised, nothing new is kept
      method: 'POST',
      url: (f) => `/api/rigs/${f.rig.id}/photos?filename=authz-again.png`,
      body: (f) => new Uint8Array(f.files!.photo.bytes),
      headers: { 'Content-Type': 'image/png' },
      expect: labA(200, WRITERS),
      after: ({ f, reply }) => {
        if (reply.status === 200) expect(reply.body).toMatchObject({ duplicate: true, photo: { id: f.files!.photo.id } });
      },
    },
  ],
  'app/api/files/[fileId]/route.ts': [
    { method: 'GET', url: (f) => `/api/files/${f.files!.sheet.id}`, expect: labA(200, MEMBERS) },
    { method: 'GET', url: (f) => `/api/files/${f.files!.photo.id}`, expect: labA(200, MEMBERS) },
  ],
  'app/api/trials/[trialId]/route.ts': [
    { method: 'GET', url: (f) => `/api/trials/${f.trialIds[0]}`, expect: labA(200, MEMBERS) },
    {
      method: 'PATCH',
      url: (f) => `/api/trials/${f.trialIds[0]}`,
      body: () => ({}),
      expect: labA(200, WRITERS),
      after: async ({ f }) => expect(await trialNow(f)).toEqual(trialBefore),
    },
  ],
  'app/api/tokens/route.ts': [
    {
      method: 'GET',
      url: () => '/api/tokens',
      expect: self(200, 403),
      after: ({ reply }) => {
        // every token shows when it expires
        if (reply.status === 200) for (const t of reply.body.tokens) expect(t.expiresAt, `token ${t.name}`).toMatch(/^\d{4}-\d\d-\d\dT/);
      },
    },
    {
      // a throwaway token, revoked again at once; its expiry defaults to 90 days
      method: 'POST',
      url: () => '/api/tokens',
      body: (f, who) => ({ name: `authz throwaway ${f.run}`, labId: f.labId, password: who === 'outsider' ? f.outsider.password : DEMO_PASSWORD }),
      expect: { ...labA(201, WRITERS, { session: true }) },
      after: async ({ f, reply, client }) => {
        if (reply.status !== 201) return;
        f.secrets.push(reply.body.secret);
        expect((await client.request('DELETE', `/api/tokens/${reply.body.token.id}`)).status).toBe(200);
        const days = (Date.parse(reply.body.token.expiresAt) - Date.parse(reply.body.token.createdAt)) / 86_400_000;
        expect(days).toBeCloseTo(90, 3);
      },
    },
  ],
  'app/api/tokens/[tokenId]/route.ts': [
    {
      // the engineer's revoked token: its holder may revoke it again (nothing changes); nobody else sees it
      method: 'DELETE',
      url: (f) => `/api/tokens/${f.tokens.revoked.id}`,
      expect: { ...self(404, 403), engineer: 200 },
      after: async ({ f }) => expect((await tokenRow(f, f.tokens.revoked.id)).revokedAt).toBe(revokedTokenAt),
    },
  ],
};

/** Server actions ('use server' files) and the cases that cover them; there are none yet. */
const SERVER_ACTIONS: Record<string, string[]> = {};

const routeFiles = repoFiles('app/api', (name) => name === 'route.ts');
const methodsOf = (file: string) => [...readFileSync(path.join(root, file), 'utf8').matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);
const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

describe('every route and server action has an entry in the matrix', () => {
  test.each(routeFiles.map((f) => [f]))('%s', (file) => {
    expect(MATRIX[file], `add ${file} to the authorization matrix`).toBeDefined();
    expect([...new Set(MATRIX[file].map((c) => c.method))].sort()).toEqual(methodsOf(file).sort());
  });
  test('no matrix entry names a route that no longer exists', () => {
    expect(Object.keys(MATRIX).filter((k) => !routeFiles.includes(k))).toEqual([]);
  });
  test('server actions are listed too', () => {
    const files = repoFiles('app', (name) => /\.tsx?$/.test(name)).filter((f) => /^['"]use server['"]/m.test(readFileSync(path.join(root, f), 'utf8')));
    expect(files.filter((f) => !SERVER_ACTIONS[f])).toEqual([]);
  });
});

/** "POST /rigs/[rigId]/uploads", with "#2" and on for a route's further cases of the same method. */
function label(file: string, c: Case): string {
  const same = MATRIX[file].filter((x) => x.method === c.method);
  const route = file.replace('app/api', '').replace('/route.ts', '') || '/';
  return `${c.method} ${route}${same.length > 1 ? ` #${same.indexOf(c) + 1}` : ''}`;
}
// an entry of a route that does not exist (yet) fails the check above and is not called
const existing = Object.entries(MATRIX).filter(([file]) => routeFiles.includes(file));

describe('authorization matrix', () => {
  let f: LabFixture;
  const bodies: string[] = [];

  beforeAll(async () => {
    f = await buildLab({ files: true });
    rigBefore = await rigNow(f);
    // the rig as it was made (app/api/labs/[labId]/rigs POST): the snapshot is the real thing
    expect(rigBefore).toMatchObject({ description: expect.stringMatching(/copper coil/), notes: expect.stringMatching(/harmless/), details: { coilLengthM: 12, tubeMaterial: 'copper' } });
    trialBefore = await trialNow(f);
    studyBefore = await studyNow(f);
    revokedShareAt = (await revokedShare(f)).revokedAt;
    revokedTokenAt = (await tokenRow(f, f.tokens.revoked.id)).revokedAt;
    expect(revokedShareAt).toBeTruthy();
    expect(revokedTokenAt).toBeTruthy();
  }, 120_000);

  async function call(c: Case, who: Caller, client: Client) {
    if (who === 'expired' && f.expiredProblem) throw new Error(f.expiredProblem);
    const body = c.body ? c.body(f, who) : c.method === 'GET' ? undefined : {};
    const reply = await client.request(c.method, c.url(f), body, c.headers);
    // a new token's secret is shown once, in the answer that creates it; anywhere else it is a leak
    const created = c.method === 'POST' && c.url(f) === '/api/tokens' && reply.status === 201;
    if (/json/.test(reply.headers.get('content-type') ?? '')) bodies.push(created ? reply.text.replace(reply.body.secret, '<shown once>') : reply.text);
    expect(reply.status, reply.text.slice(0, 300)).toBe(c.expect[who]);
    await c.after?.({ f, who, reply, client });
    return reply;
  }

  const cases = existing.flatMap(([file, list]) => list.flatMap((c) => CALLERS.map((who) => ({ file, c, who }))));
  const name = (x: { file: string; c: Case; who: Caller }) => `${label(x.file, x.c)} as ${x.who} → ${x.c.expect[x.who]}`;

  describe('every route, every caller', () => {
    test.each(cases.filter((x) => !x.c.fresh).map((x) => [name(x), x] as const))('%s', async (_n, x) => {
      await call(x.c, x.who, f.clients[x.who]);
    });
  });

  describe('CSRF: a cookie-authenticated state change from another site is refused', () => {
    // Every state-changing case of the matrix, with the owner's session (a bearer-token request needs
    // no Origin: the token callers above send none). The refusal comes before anything is read.
    const changing = existing.flatMap(([file, list]) => list.filter((c) => STATE_CHANGING.has(c.method)).map((c) => ({ file, c })));
    const variants: { how: string; headers: Record<string, string>; origin: string | null }[] = [
      { how: 'Origin: http://evil.example', headers: {}, origin: 'http://evil.example' },
      { how: 'no Origin, Sec-Fetch-Site: cross-site', headers: { 'Sec-Fetch-Site': 'cross-site' }, origin: null },
    ];
    test.each(changing.flatMap((x) => variants.map((v) => [`${label(x.file, x.c)} (${v.how}) → 403`, x, v] as const)))(
      '%s',
      async (_n, x, v) => {
        const client = x.c.fresh ? await freshSession(f, 'owner') : f.clients.owner;
        f.secrets.push(client.cookies.get('emberline_session')!);
        const saved = client.origin;
        client.origin = v.origin;
        try {
          const body = x.c.body ? x.c.body(f, 'owner') : {};
          const reply = await client.request(x.c.method, x.c.url(f), body, { ...x.c.headers, ...v.headers });
          bodies.push(reply.text);
          expect(reply.status, reply.text.slice(0, 300)).toBe(403);
          expect(reply.body?.error).toBe('cross_origin');
        } finally {
          client.origin = saved;
        }
      },
    );
  });

  describe('objects of another lab stay out of reach through references', () => {
    test("a study of lab B whose block names lab A's fit shows none of it", async () => {
      const b = f.clients.outsider;
      const s = (await b.post(`/api/labs/${f.labBId}/studies`, { title: `Borrowed ${f.run}` })).body.study;
      const cur = (await b.get(`/api/studies/${s.id}`)).body.study;
      const put = await b.request('PUT', `/api/studies/${s.id}`, { title: cur.title, baseRevision: cur.revision, blocks: [{ id: 'x', kind: 'fit', data: { fitId: f.fit.id } }] });
      expect(put.status, put.text).toBe(200);
      const block = await b.get(`/api/studies/${s.id}/blocks/x`);
      bodies.push(block.text);
      expect(block.status).toBe(200);
      expect(block.body.block.body.type, block.text.slice(0, 300)).toBe('note');
      expect(block.text).not.toContain(f.fit.title);
    });

    test("lab B's owner reads none of lab A's mail by inviting one of its members", async () => {
      const b = f.clients.outsider;
      const viewer = emailOf('viewer');
      expect((await b.post(`/api/labs/${f.labBId}/invitations`, { email: viewer, role: 'viewer' })).status).toBe(201);
      // a reset link for lab A's viewer, asked by anyone: it must not show up in lab B's mailbox
      expect((await f.clients.anon.post('/api/auth/forgot-password', { email: viewer })).status).toBe(200);
      const mail = await b.get(`/api/labs/${f.labBId}/mail`);
      expect(mail.status).toBe(200);
      const subjects = mail.body.messages.map((m: { subject: string }) => m.subject);
      expect(subjects.some((s: string) => /invited to/.test(s)), 'the invitation lab B sent').toBe(true);
      expect(mail.text).not.toMatch(/reset-password\?token=/);
      expect(subjects.filter((s: string) => !/invited to .*Elsewhere Bench/.test(s))).toEqual([]);
    });
  });

  describe('routes that end sessions, each caller with a session of its own', () => {
    test.each(cases.filter((x) => x.c.fresh).map((x) => [name(x), x] as const))('%s', async (_n, x) => {
      const client = await freshSession(f, x.who);
      f.secrets.push(client.cookies.get('emberline_session') ?? '');
      const reply = await call(x.c, x.who, client);
      if (isSession(x.who) && reply.status === 200) expect((await client.get('/api/me')).status, 'the session has ended').toBe(401);
    });
  });

  afterAll(() => {
    if (!f) return;
    // No JSON response ever carries a password hash, a token hash, a session cookie or a secret.
    const secrets = f.secrets.filter(Boolean);
    const forbidden = [...secrets, ...secrets.map((s) => createHash('sha256').update(s).digest('hex')), process.env.SESSION_SECRET ?? 'no-secret-set'];
    const all = bodies.join('\n');
    expect(bodies.length).toBeGreaterThan(300);
    expect(all).not.toMatch(/\$argon2/);
    expect(all).not.toMatch(/passwordHash|password_hash|tokenHash|token_hash/);
    for (const s of forbidden) expect(all.includes(s), `a response contains a secret (${s.slice(0, 6)}…)`).toBe(false);
  });
});
