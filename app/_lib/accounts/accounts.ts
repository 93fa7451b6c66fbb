import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import { ApiToken, Lab, Membership, PasswordReset, PendingSignUp, Session, User, type UserRow } from '@/entities';
import { safeNextPath } from '@/app/_contracts/safe-next';
import { audit } from '../labs/audit';
import { appOrigin } from '../server/config';
import { DomainError } from '../server/errors';
import { runLater } from '../server/later';
import { appLink, sendMailLater } from '../mail/mail';
import { dummyHash, hashPassword, passwordProblem, verifyPassword } from './passwords';
import { attempts, clearLimit, countAttempt, enforceLimits, hitLimit, tooMany } from '../server/rate-limit';
import type { signUpInput } from './schemas';
import { newSecret, sha256 } from '../server/secrets';

const WRONG = 'That e-mail address and password do not match an account.';
const weak = (problem: string, field = 'password') => new DomainError('invalid', 'invalid', problem, { fields: { [field]: problem } });
const SIGN_UP_HOURS = 24;

export function slugify(name: string): string {
  const base = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'lab';
  return `${base}-${newSecret('', 4).token.toLowerCase().replace(/[^a-z0-9]/g, '').slice(0, 5)}`;
}

/** What sign-up answers, whether or not the address already has an account. */
export const SIGN_UP_SENT = (email: string) =>
  `We sent a message to ${email}. Follow the link in it within ${SIGN_UP_HOURS} hours to finish creating your account.`;

/**
 * Starts a sign-up. The answer and its timing are the same whether or not the address has an
 * account (the password is checked and hashed either way, the rest happens off the request
 * path): a new address gets a link that makes the account; an address with an account gets a
 * message saying so, with links to sign in or reset the password.
 */
export async function signUp(em: EntityManager, input: z.infer<typeof signUpInput>, ip: string): Promise<void> {
  await enforceLimits(em, [{ key: `sign-up:ip:${ip}`, max: 10, windowS: 3600 }]);
  const problem = passwordProblem(input.password, { email: input.email });
  if (problem) throw weak(problem);
  const passwordHash = await hashPassword(input.password);
  const next = safeNextPath(input.next, appOrigin(), '');
  runLater('sign-up', async (bg) => {
    // At most three messages an hour to one address, whoever asks: sign-up is no mail cannon.
    if ((await countAttempt(bg, { key: `sign-up:mail:${input.email}`, max: 3, windowS: 3600 })) > 3) return;
    if (await bg.findOne(User, { email: input.email })) {
      await audit(bg, { kind: 'sign-up-requested', subject: `${input.email} (has an account)`, ip });
      sendMailLater(input.email, {
        subject: 'You already have an Emberline account',
        paragraphs: [
          `Someone (we hope you) tried to create an Emberline account for ${input.email}, but this address already has one.`,
          'Sign in with it, or choose a new password if you have forgotten it. If it was not you, ignore this message: nothing has changed.',
        ],
        action: { label: 'Sign in', url: appLink('/sign-in') },
        footnote: `Forgot the password? ${appLink('/forgot-password')}`,
      }, { kind: 'account-exists' });
      return;
    }
    const { token, hash } = newSecret('sgn_');
    bg.create(PendingSignUp, {
      email: input.email, name: input.name, labName: input.labName ?? '', passwordHash, tokenHash: hash, next,
      expiresAt: new Date(Date.now() + SIGN_UP_HOURS * 3600_000),
    });
    await audit(bg, { kind: 'sign-up-requested', subject: input.email, ip });
    sendMailLater(input.email, {
      subject: 'Finish signing up to Emberline',
      paragraphs: [
        `Someone (we hope you) asked for an Emberline account for ${input.email}.`,
        `Follow the link below within ${SIGN_UP_HOURS} hours to create it and sign in. If it was not you, ignore this message: no account is made.`,
      ],
      action: { label: 'Create my account', url: appLink(`/sign-up/confirm?token=${encodeURIComponent(token)}`) },
    }, { kind: 'sign-up' });
  });
}

/**
 * Makes the account of a confirmed sign-up (the link was followed): single use, atomic, then
 * the person owns a new lab. Returns the user and where to go next.
 */
export async function confirmSignUp(em: EntityManager, token: string, ip: string): Promise<{ user: UserRow; next: string }> {
  await enforceLimits(em, [{ key: `sign-up-confirm:ip:${ip}`, max: 20, windowS: 3600 }]);
  const rows = await em.getConnection().execute<{ id: string }[]>(
    `update pending_sign_up set used_at = now() where token_hash = ? and used_at is null and expires_at > now() returning id`,
    [sha256(token)],
  );
  if (!rows[0]) throw new DomainError('gone', 'link_invalid', 'This sign-up link has expired or has already been used. Sign up again to get a new one.');
  const pending = await em.findOneOrFail(PendingSignUp, { id: rows[0].id });
  if (await em.findOne(User, { email: pending.email })) {
    throw new DomainError('conflict', 'email_taken', 'This address already has an account: sign in, or reset its password.');
  }
  const user = await em.transactional(async (tx) => {
    const user = tx.create(User, { email: pending.email, name: pending.name, passwordHash: pending.passwordHash });
    const lab = tx.create(Lab, { name: pending.labName || `${pending.name}'s lab`, slug: slugify(pending.labName || pending.name) });
    tx.create(Membership, { user, lab, role: 'owner' });
    await tx.nativeDelete(PendingSignUp, { email: pending.email });
    await audit(tx, { kind: 'sign-up', actor: user, subject: pending.email, ip }, false);
    await audit(tx, { kind: 'lab-created', actor: user, lab, subject: lab.name, ip }, false);
    return user;
  });
  return { user, next: pending.next };
}

/** Sign-in pacing (ours): a failure counts for 15 minutes against the account and against (account, address). */
export const SIGN_IN_PACE = {
  windowS: 900,
  /** attempts from one address, any account, per window (only that address is stopped) */
  perAddress: 30,
  /** failures of one account from one address before each further try must wait, doubling from 15 s up to 15 minutes */
  freePerPair: 5,
  /** failures of one account from all addresses before every try of the account must wait a few seconds */
  freePerAccount: 10,
  accountGapS: 5,
} as const;

/** One attempt per `gapS` seconds under `key`; a faster one gets 429 with the seconds left. */
async function pace(em: EntityManager, key: string, gapS: number, message: string) {
  const n = await countAttempt(em, { key, max: 1, windowS: gapS });
  if (n > 1) {
    const a = await attempts(em, key);
    throw tooMany(a.resetAt ?? new Date(Date.now() + gapS * 1000), message);
  }
}

/**
 * Checks e-mail and password. A wrong password and an unknown address get the same message and
 * take the same time. Failures slow sign-in down instead of locking the account, so nobody can
 * lock a person out by guessing wrong on purpose: the address that keeps failing waits longer
 * and longer (15 s doubling to 15 minutes) for that account, and after many failures from
 * anywhere, any try of the account waits a few seconds (see {@link SIGN_IN_PACE}).
 */
export async function signIn(em: EntityManager, emailAddr: string, password: string, ip: string): Promise<UserRow> {
  const P = SIGN_IN_PACE;
  const pairKey = `sign-in:fail:${emailAddr}|${ip}`;
  const accountKey = `sign-in:fail:${emailAddr}`;
  await hitLimit(em, { key: `sign-in:ip:${ip}`, max: P.perAddress, windowS: P.windowS });
  const pair = (await attempts(em, pairKey)).count;
  if (pair >= P.freePerPair) {
    const gapS = Math.min(P.windowS, 15 * 2 ** (pair - P.freePerPair));
    await pace(em, `sign-in:pace:${emailAddr}|${ip}`, gapS, `Too many wrong passwords from here. Wait ${gapS < 90 ? `${gapS} seconds` : `${Math.ceil(gapS / 60)} minutes`} before the next try, or reset the password.`);
  }
  if ((await attempts(em, accountKey)).count >= P.freePerAccount) {
    await pace(em, `sign-in:pace:${emailAddr}`, P.accountGapS, `This account has had many wrong passwords: wait ${P.accountGapS} seconds between tries.`);
  }
  const user = await em.findOne(User, { email: emailAddr });
  const ok = user ? await verifyPassword(user.passwordHash, password) : (await verifyPassword(await dummyHash(), password), false);
  if (!user || !ok) {
    await audit(em, { kind: 'sign-in-failed', actor: user ?? null, subject: emailAddr, ip });
    await countAttempt(em, { key: pairKey, max: P.freePerPair, windowS: P.windowS });
    await countAttempt(em, { key: accountKey, max: P.freePerAccount, windowS: P.windowS });
    throw new DomainError('unauthorized', 'bad_credentials', WRONG);
  }
  await clearLimit(em, pairKey);
  await audit(em, { kind: 'sign-in', actor: user, subject: emailAddr, ip });
  return user;
}

/** Ends every session of the user at once. */
export async function endAllSessions(em: EntityManager, user: UserRow): Promise<void> {
  user.tokenVersion += 1;
  await em.nativeUpdate(Session, { user, revokedAt: null }, { revokedAt: new Date() });
  await em.flush();
}

/** Revokes every API token of the user; returns how many were still valid. */
export async function revokeAllTokens(em: EntityManager, user: UserRow, ip: string): Promise<number> {
  const n = await em.nativeUpdate(ApiToken, { user, revokedAt: null }, { revokedAt: new Date() });
  if (n) await audit(em, { kind: 'tokens-revoked', actor: user, subject: `${n} token${n === 1 ? '' : 's'} of ${user.email}`, ip });
  return n;
}

/** After a new password: other sessions end and outstanding reset links stop working (a used one stays, to say so). */
async function afterNewPassword(em: EntityManager, user: UserRow) {
  await em.nativeDelete(PasswordReset, { user, usedAt: null });
  await endAllSessions(em, user);
}

/** Changes the password (the current one is checked); every session ends, and with `revokeTokens` every API token. */
export async function changePassword(em: EntityManager, user: UserRow, current: string, next: string, ip: string, revokeTokens = false): Promise<{ tokensRevoked: number }> {
  await enforceLimits(em, [{ key: `password-change:account:${user.id}`, max: 10, windowS: 900 }]);
  if (!(await verifyPassword(user.passwordHash, current))) {
    throw new DomainError('invalid', 'invalid', 'The current password is not right.', { fields: { currentPassword: 'The current password is not right.' } });
  }
  const problem = passwordProblem(next, { email: user.email });
  if (problem) throw weak(problem, 'newPassword');
  user.passwordHash = await hashPassword(next);
  await afterNewPassword(em, user);
  const tokensRevoked = revokeTokens ? await revokeAllTokens(em, user, ip) : 0;
  await audit(em, { kind: 'password-changed', actor: user, subject: user.email, ip });
  return { tokensRevoked };
}

/**
 * Sends a reset link when the address has an account. Answers the same, in the same time, either
 * way: after the rate limits, the lookup and the mail happen off the request path.
 */
export async function requestReset(em: EntityManager, emailAddr: string, ip: string): Promise<void> {
  await enforceLimits(em, [{ key: `reset:ip:${ip}`, max: 10, windowS: 3600 }]);
  runLater('password reset', async (bg) => {
    if ((await countAttempt(bg, { key: `reset:account:${emailAddr}`, max: 3, windowS: 3600 })) > 3) return;
    const user = await bg.findOne(User, { email: emailAddr });
    if (!user) return;
    const { token, hash } = newSecret('rst_');
    bg.create(PasswordReset, { user, tokenHash: hash, expiresAt: new Date(Date.now() + 3600_000) });
    await audit(bg, { kind: 'password-reset-requested', actor: user, subject: emailAddr, ip });
    sendMailLater(user.email, {
      subject: 'Reset your Emberline password',
      paragraphs: [
        `Someone (we hope you) asked to reset the password of the Emberline account ${user.email}.`,
        'The link below works once, for one hour. If you did not ask for it, ignore this message: your password stays as it is.',
      ],
      action: { label: 'Choose a new password', url: appLink(`/reset-password?token=${encodeURIComponent(token)}`) },
    }, { kind: 'password-reset' });
  });
}

/** Why a reset link cannot be used (unknown, used, expired), or null when it can: for the page it opens. */
export async function resetLinkProblem(em: EntityManager, token: string | undefined): Promise<string | null> {
  const reset = token && token.length <= 200 ? await em.findOne(PasswordReset, { tokenHash: sha256(token) }) : null;
  if (!reset) return 'This reset link is not valid.';
  if (reset.usedAt) return 'This reset link has already been used.';
  if (reset.expiresAt <= new Date()) return 'This reset link has expired (links work for one hour).';
  return null;
}

/**
 * Uses a reset token: single use (a conditional update, so two requests cannot both succeed),
 * one hour; then the account's other reset links, sessions and API tokens all end.
 */
export async function resetPassword(em: EntityManager, token: string, password: string, ip: string): Promise<UserRow> {
  await enforceLimits(em, [{ key: `reset-use:ip:${ip}`, max: 20, windowS: 3600 }]);
  const gone = () => new DomainError('gone', 'link_invalid', 'This reset link has expired or has already been used. Ask for a new one.');
  const reset = await em.findOne(PasswordReset, { tokenHash: sha256(token) }, { populate: ['user'] });
  if (!reset || reset.usedAt || reset.expiresAt <= new Date()) throw gone();
  const user = reset.user;
  const problem = passwordProblem(password, { email: user.email });
  if (problem) throw weak(problem);
  const passwordHash = await hashPassword(password);
  const used = await em.getConnection().execute<{ id: string }[]>(
    'update password_reset set used_at = now() where id = ? and used_at is null and expires_at > now() returning id',
    [reset.id],
  );
  if (!used[0]) throw gone();
  user.passwordHash = passwordHash;
  await afterNewPassword(em, user);
  await revokeAllTokens(em, user, ip);
  await audit(em, { kind: 'password-reset', actor: user, subject: user.email, ip });
  return user;
}
