import { MikroORM } from '@mikro-orm/postgresql';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import config from '../../mikro-orm.config';
import { Invitation, PasswordReset } from '../../entities';
import { Client, STRONG_PASSWORD, createAccount, signedIn, uniqueEmail, waitForMailLink } from './support/client';

let orm: MikroORM;
beforeAll(async () => {
  orm = await MikroORM.init(config);
});
afterAll(async () => orm?.close(true));

async function newAccount(tag: string) {
  const email = uniqueEmail(tag);
  const { client, labId } = await createAccount(email, STRONG_PASSWORD, `Test ${tag}`);
  return { email, client, labId };
}

describe('sign-up and the password policy (NIST SP 800-63B §5.1.1: length, a common-password list, no composition rules)', () => {
  test.each([
    ['too short', 'short pw 11', /at least 12 characters/],
    ['a common password', 'qwerty123456', /commonly used/],
    ['a single repeated character', 'aaaaaaaaaaaaaaa', /repeated/],
  ])('refuses %s with the reason beside the field', async (_what, password, reason) => {
    const r = await new Client().post('/api/auth/sign-up', { email: uniqueEmail('weak'), name: 'Weak', password });
    expect(r.status).toBe(422);
    expect(r.body.fields.password).toMatch(reason);
  });

  test('accepts a long passphrase without digits or symbols and makes the user owner of a new lab', async () => {
    const { client } = await newAccount('passphrase');
    const me = await client.get('/api/me');
    expect(me.body.labs).toHaveLength(1);
    expect(me.body.labs[0].role).toBe('owner');
  });

  test('a second sign-up for an address with an account makes no account: the address is told by mail', async () => {
    const { email } = await newAccount('dupe');
    const r = await new Client().post('/api/auth/sign-up', { email: email.toUpperCase(), name: 'Again', password: STRONG_PASSWORD });
    expect(r.status).toBe(202);
    const { mail } = await waitForMailLink(email, /already have an Emberline account/);
    expect(mail.text).not.toMatch(/sign-up\/confirm/);
  });

  test('the session cookie is httpOnly and SameSite=Lax', async () => {
    const email = uniqueEmail('cookie');
    const c = new Client();
    await c.post('/api/auth/sign-up', { email, name: 'Cookie', password: STRONG_PASSWORD });
    const { link } = await waitForMailLink(email, /finish signing up/i);
    const r = await c.post('/api/auth/sign-up/confirm', { token: new URL(link).searchParams.get('token') });
    expect(r.status, r.text).toBe(201);
    const cookie = r.headers.getSetCookie().find((c) => c.startsWith('emberline_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain http on 127.0.0.1; Secure is set behind https
  });
});

describe('sign-in', () => {
  test('a wrong password and an unknown address get the same answer (no account enumeration)', async () => {
    const wrong = await new Client().post('/api/auth/sign-in', { email: 'owner@cinder-hollow.test', password: 'definitely not it' });
    const unknown = await new Client().post('/api/auth/sign-in', { email: uniqueEmail('ghost'), password: 'definitely not it' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  test('repeated failures from one address slow that address down for the account, with Retry-After', async () => {
    const { email } = await newAccount('limited');
    const guesser = new Client();
    const statuses: number[] = [];
    let last;
    for (let i = 0; i < 7; i++) {
      last = await guesser.post('/api/auth/sign-in', { email, password: 'wrong wrong wrong' });
      statuses.push(last.status);
    }
    expect(statuses.slice(0, 6)).toEqual([401, 401, 401, 401, 401, 401]);
    expect(last!.status).toBe(429);
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(last!.body.message).toMatch(/Wait \d+ seconds/);
  });

  test('one address trying many accounts is rate-limited', async () => {
    const c = new Client();
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) statuses.push((await c.post('/api/auth/sign-in', { email: uniqueEmail('spray'), password: 'wrong wrong wrong' })).status);
    expect(statuses.slice(0, 30).every((s) => s === 401)).toBe(true);
    expect(statuses[30]).toBe(429);
  });
});

describe('sessions end when the server says so', () => {
  test('sign-out ends this session', async () => {
    const c = await signedIn('viewer@cinder-hollow.test');
    const jar = new Map(c.cookies);
    expect((await c.post('/api/auth/sign-out')).status).toBe(200);
    const replay = new Client();
    replay.cookies = jar; // the old cookie, replayed
    expect((await replay.get('/api/me')).status).toBe(401);
  });

  test('sign-out everywhere and a password change end every other session', async () => {
    const { email, client: a } = await newAccount('devices');
    const b = await signedIn(email, STRONG_PASSWORD);
    expect((await b.get('/api/me')).status).toBe(200);
    const changed = await a.post('/api/auth/password', { currentPassword: STRONG_PASSWORD, newPassword: 'a brand new passphrase here' });
    expect(changed.status, changed.text).toBe(200);
    expect((await b.get('/api/me')).status).toBe(401);
    expect((await a.get('/api/me')).status).toBe(200); // this browser got a fresh session
    const c = await signedIn(email, 'a brand new passphrase here');
    expect((await a.post('/api/auth/sign-out-everywhere')).status).toBe(200);
    expect((await c.get('/api/me')).status).toBe(401);
    expect((await a.get('/api/me')).status).toBe(401);
  });
});

describe('password reset by e-mail', () => {
  test('the mailed link works once, sets the password and ends other sessions', async () => {
    const { email } = await newAccount('reset');
    const other = await signedIn(email, STRONG_PASSWORD);
    const asked = await new Client().post('/api/auth/forgot-password', { email });
    expect(asked.status).toBe(200);
    const { link, mail } = await waitForMailLink(email, /Reset your Emberline password/);
    expect(mail.html).toMatch(/<a href="http/); // an HTML part in our own style beside the text part
    const token = new URL(link).searchParams.get('token')!;
    const page = await fetch(link);
    expect(page.status).toBe(200);
    const c = new Client();
    const used = await c.post('/api/auth/reset-password', { token, password: 'reset to this long phrase' });
    expect(used.status, used.text).toBe(200);
    expect((await other.get('/api/me')).status).toBe(401);
    const again = await new Client().post('/api/auth/reset-password', { token, password: 'and once more with this one' });
    expect(again.status).toBe(410);
    expect(again.body.message).toMatch(/expired or has already been used/);
    await signedIn(email, 'reset to this long phrase');
  });

  test('a token is stored only as its hash and expires after one hour', async () => {
    const { email } = await newAccount('expiry');
    await new Client().post('/api/auth/forgot-password', { email });
    const { link } = await waitForMailLink(email, /Reset/);
    const token = new URL(link).searchParams.get('token')!;
    const em = orm.em.fork();
    const row = await em.findOneOrFail(PasswordReset, { user: { email } });
    expect(row.tokenHash).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBeCloseTo(3600_000, -4);
    row.expiresAt = new Date(Date.now() - 1000);
    await em.flush();
    expect((await new Client().post('/api/auth/reset-password', { token, password: STRONG_PASSWORD + ' x' })).status).toBe(410);
  });

  test('an unknown address gets the same answer and no mail', async () => {
    const ghost = uniqueEmail('nobody');
    const r = await new Client().post('/api/auth/forgot-password', { email: ghost });
    expect(r.status).toBe(200);
    expect(r.body.message).toMatch(/If that address has an account/);
  });
});

describe('invitations', () => {
  test('are bound to the invited address, single-use, and expire after 7 days', async () => {
    const owner = await newAccount('inv-owner');
    const invitee = uniqueEmail('invitee');
    const sent = await owner.client.post(`/api/labs/${owner.labId}/invitations`, { email: invitee, role: 'reviewer' });
    expect(sent.status, sent.text).toBe(201);
    expect(new Date(sent.body.invitation.expiresAt).getTime() - Date.now()).toBeGreaterThan(7 * 86_400_000 - 60_000);
    const { link } = await waitForMailLink(invitee, /invited/);
    const token = decodeURIComponent(link.split('/invitations/')[1]);
    // someone else cannot use it
    const stranger = await newAccount('stranger');
    const foreign = await stranger.client.post(`/api/invitations/${encodeURIComponent(token)}`);
    expect(foreign.status).toBe(410);
    expect(foreign.body.message).toMatch(/is for .* but you are signed in as/);
    // the invited address can, once
    const { client: c } = await createAccount(invitee, STRONG_PASSWORD, 'Invited Reviewer');
    const ok = await c.post(`/api/invitations/${encodeURIComponent(token)}`);
    expect(ok.status, ok.text).toBe(200);
    expect(ok.body.lab.role).toBe('reviewer');
    expect((await c.post(`/api/invitations/${encodeURIComponent(token)}`)).status).toBe(410);
    // an expired one is refused with a clear page and API answer
    const later = uniqueEmail('late');
    await owner.client.post(`/api/labs/${owner.labId}/invitations`, { email: later, role: 'viewer' });
    const { link: lateLink } = await waitForMailLink(later, /invited/);
    const em = orm.em.fork();
    const inv = await em.findOneOrFail(Invitation, { email: later });
    inv.expiresAt = new Date(Date.now() - 1000);
    await em.flush();
    const page = await (await fetch(lateLink)).text();
    expect(page).toMatch(/This invitation has expired/);
  });

  test('owners change roles and remove members, but never the last owner', async () => {
    const owner = await newAccount('roles');
    const list = await owner.client.get(`/api/labs/${owner.labId}/members`);
    const me = list.body.members[0];
    const demote = await owner.client.request('PATCH', `/api/labs/${owner.labId}/members/${me.id}`, { role: 'viewer' });
    expect(demote.status).toBe(409);
    expect(demote.body.message).toMatch(/at least one owner/);
    const remove = await owner.client.request('DELETE', `/api/labs/${owner.labId}/members/${me.id}`);
    expect(remove.status).toBe(409);
    const audit = await owner.client.get(`/api/labs/${owner.labId}/audit`);
    expect(audit.body.events.map((e: { kind: string }) => e.kind)).toContain('lab-created');
  });
});

describe('API tokens', () => {
  test('are shown once, act with the owner’s role in one lab, record their last use and can be revoked', async () => {
    const eng = await signedIn('engineer@cinder-hollow.test');
    const lab = (await eng.get('/api/me')).body.labs[0];
    const made = await eng.post('/api/tokens', { name: 'yard logger', labId: lab.id, password: 'ember-demo-lab-2026' });
    expect(made.status).toBe(201);
    expect(made.body.secret).toMatch(/^emb_/);
    const listed = await eng.get('/api/tokens');
    expect(listed.text).not.toContain(made.body.secret);
    const script = new Client();
    script.origin = null;
    script.bearer = made.body.secret;
    expect((await script.get(`/api/labs/${lab.id}/rigs`)).status).toBe(200);
    const after = (await eng.get('/api/tokens')).body.tokens.find((t: { id: string }) => t.id === made.body.token.id);
    expect(after.lastUsedAt).not.toBeNull();
    // a token of lab A gets 404 for lab B
    const other = await newAccount('tok-other');
    expect((await script.get(`/api/labs/${other.labId}/rigs`)).status).toBe(404);
    expect((await eng.request('DELETE', `/api/tokens/${made.body.token.id}`)).status).toBe(200);
    expect((await script.get(`/api/labs/${lab.id}/rigs`)).status).toBe(401);
  });
});

describe('bad input and attacks', () => {
  test('state-changing requests from another origin are refused', async () => {
    const c = await signedIn('engineer@cinder-hollow.test');
    c.origin = 'http://attacker.example';
    const r = await c.post('/api/labs', { name: 'Hijacked lab' });
    expect(r.status).toBe(403);
    expect(r.body.error).toBe('cross_origin');
    c.origin = null; // no Origin and no Sec-Fetch-Site: refused as well
    expect((await c.post('/api/labs', { name: 'Hijacked lab' })).status).toBe(403);
  });

  test('oversized bodies are refused before parsing', async () => {
    const r = await new Client().post('/api/auth/sign-in', { email: 'a@b.test', password: 'x'.repeat(70 * 1024) });
    expect(r.status).toBe(413);
  });

  test('malformed JSON gets a clear message', async () => {
    const r = await new Client().request('POST', '/api/auth/sign-in', '{"email":', { 'Content-Type': 'application/json' });
    expect(r.status).toBe(400);
    expect(r.body.message).toMatch(/not valid JSON/);
  });

  test('a member of lab A gets 404 for a rig of lab B', async () => {
    const outsider = await newAccount('peek');
    const owner = await signedIn('owner@cinder-hollow.test');
    const lab = (await owner.get('/api/me')).body.labs[0];
    const rig = (await owner.get(`/api/labs/${lab.id}/rigs`)).body.rigs[0];
    expect((await outsider.client.get(`/api/rigs/${rig.id}`)).status).toBe(404);
    expect((await outsider.client.get(`/api/labs/${lab.id}/members`)).status).toBe(404);
  });
});
