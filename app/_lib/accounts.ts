import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import { Lab, Membership, PasswordReset, Session, User, type UserRow } from '@/entities';
import { audit } from './audit';
import { HttpError, badRequest } from './errors';
import { linkBase, sendMail } from './mail';
import { dummyHash, hashPassword, passwordProblem, verifyPassword } from './passwords';
import { checkLimit, enforceLimits, hitLimit } from './rate-limit';
import type { signUpInput } from './schemas';
import { newSecret, sha256 } from './tokens';

const WRONG = 'That e-mail address and password do not match an account.';
const weak = (problem: string) => new HttpError(422, 'invalid', problem, { fields: { password: problem } });

export function slugify(name: string): string {
  const base = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'lab';
  return `${base}-${newSecret('', 4).token.toLowerCase().replace(/[^a-z0-9]/g, '').slice(0, 5)}`;
}

/** Creates an account and its first lab (the user becomes its owner). */
export async function signUp(em: EntityManager, input: z.infer<typeof signUpInput>, ip: string): Promise<UserRow> {
  await enforceLimits(em, [{ key: `sign-up:ip:${ip}`, max: 10, windowS: 3600 }]);
  const problem = passwordProblem(input.password, { email: input.email });
  if (problem) throw weak(problem);
  if (await em.findOne(User, { email: input.email })) {
    throw new HttpError(409, 'email_taken', 'An account with that e-mail address exists. Sign in, or reset the password.', {
      fields: { email: 'An account with that e-mail address exists.' },
    });
  }
  const passwordHash = await hashPassword(input.password);
  return em.transactional(async (tx) => {
    const user = tx.create(User, { email: input.email, name: input.name, passwordHash });
    const lab = tx.create(Lab, { name: input.labName || `${input.name}'s lab`, slug: slugify(input.labName || input.name) });
    tx.create(Membership, { user, lab, role: 'owner' });
    await audit(tx, { kind: 'sign-up', actor: user, subject: input.email, ip }, false);
    await audit(tx, { kind: 'lab-created', actor: user, lab, subject: lab.name, ip }, false);
    return user;
  });
}

/**
 * Checks e-mail and password. A wrong password and an unknown address get the same message and
 * take the same time. Limited per address and per account.
 */
export async function signIn(em: EntityManager, emailAddr: string, password: string, ip: string): Promise<UserRow> {
  // Every attempt counts against the address; only failures count against the account, so that
  // successful sign-ins never lock a person out.
  const accountLimit = { key: `sign-in:account:${emailAddr}`, max: 10, windowS: 900 };
  await enforceLimits(em, [{ key: `sign-in:ip:${ip}`, max: 30, windowS: 900 }]);
  await checkLimit(em, accountLimit);
  const user = await em.findOne(User, { email: emailAddr });
  const ok = user ? await verifyPassword(user.passwordHash, password) : (await verifyPassword(await dummyHash(), password), false);
  if (!user || !ok) {
    await audit(em, { kind: 'sign-in-failed', actor: user ?? null, subject: emailAddr, ip });
    await hitLimit(em, accountLimit);
    throw new HttpError(401, 'bad_credentials', WRONG);
  }
  await audit(em, { kind: 'sign-in', actor: user, subject: emailAddr, ip });
  return user;
}

/** Ends every session of the user at once. */
export async function endAllSessions(em: EntityManager, user: UserRow): Promise<void> {
  user.tokenVersion += 1;
  await em.nativeUpdate(Session, { user, revokedAt: null }, { revokedAt: new Date() });
  await em.flush();
}

export async function changePassword(em: EntityManager, user: UserRow, current: string, next: string, ip: string): Promise<void> {
  await enforceLimits(em, [{ key: `password-change:account:${user.id}`, max: 10, windowS: 900 }]);
  if (!(await verifyPassword(user.passwordHash, current))) {
    throw new HttpError(422, 'invalid', 'The current password is not right.', { fields: { currentPassword: 'The current password is not right.' } });
  }
  const problem = passwordProblem(next, { email: user.email });
  if (problem) throw new HttpError(422, 'invalid', problem, { fields: { newPassword: problem } });
  user.passwordHash = await hashPassword(next);
  await endAllSessions(em, user);
  await audit(em, { kind: 'password-changed', actor: user, subject: user.email, ip });
}

/** Sends a reset link when the address has an account; answers the same either way. */
export async function requestReset(em: EntityManager, emailAddr: string, ip: string, origin: string): Promise<void> {
  await enforceLimits(em, [
    { key: `reset:ip:${ip}`, max: 10, windowS: 3600 },
    { key: `reset:account:${emailAddr}`, max: 3, windowS: 3600 },
  ]);
  const user = await em.findOne(User, { email: emailAddr });
  if (!user) return;
  const { token, hash } = newSecret('rst_');
  em.create(PasswordReset, { user, tokenHash: hash, expiresAt: new Date(Date.now() + 3600_000) });
  await audit(em, { kind: 'password-reset-requested', actor: user, subject: emailAddr, ip });
  await sendMail(user.email, {
    subject: 'Reset your Emberline password',
    paragraphs: [
      `Someone (we hope you) asked to reset the password of the Emberline account ${user.email}.`,
      'The link below works once, for one hour. If you did not ask for it, ignore this message: your password stays as it is.',
    ],
    action: { label: 'Choose a new password', url: `${linkBase(origin)}/reset-password?token=${encodeURIComponent(token)}` },
  });
}

/** Uses a reset token: single use, one hour, then every session of the account ends. */
export async function resetPassword(em: EntityManager, token: string, password: string, ip: string): Promise<UserRow> {
  await enforceLimits(em, [{ key: `reset-use:ip:${ip}`, max: 20, windowS: 3600 }]);
  const reset = await em.findOne(PasswordReset, { tokenHash: sha256(token) }, { populate: ['user'] });
  if (!reset || reset.usedAt || reset.expiresAt <= new Date()) {
    throw new HttpError(410, 'link_invalid', 'This reset link has expired or has already been used. Ask for a new one.');
  }
  const user = reset.user;
  const problem = passwordProblem(password, { email: user.email });
  if (problem) throw weak(problem);
  user.passwordHash = await hashPassword(password);
  reset.usedAt = new Date();
  await endAllSessions(em, user);
  await audit(em, { kind: 'password-reset', actor: user, subject: user.email, ip });
  return user;
}

export function assertSameUser(a: UserRow, b: UserRow) {
  if (a.id !== b.id) throw badRequest('That does not belong to you.');
}
