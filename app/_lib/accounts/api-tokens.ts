import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { ApiToken, type LabRow, type UserRow } from '@/entities';
import { audit } from '../labs/audit';
import { conflict, invalid, notFound } from '../server/errors';
import { verifyPassword } from './passwords';
import { checkLimit, hitLimit } from '../server/rate-limit';
import { newSecret } from '../server/secrets';

/** Most active (unrevoked, unexpired) tokens one person may hold. */
export const MAX_ACTIVE_TOKENS = 50;

/** Token lifetimes, days: chosen at creation. */
export const TOKEN_DAYS = { default: 90, min: 1, max: 365 } as const;

/**
 * Creates a personal token acting in one lab until it expires; the current password is asked
 * again (a borrowed session alone cannot mint a long-lived credential). The secret is returned
 * once and only its hash is kept.
 */
export async function createToken(em: EntityManager, user: UserRow, lab: LabRow, input: { name: string; password: string; expiresInDays: number }, ip: string) {
  // wrong passwords count against the account (the password check must not become an oracle); successful creations do not
  const wrong = { key: `token-create:wrong-password:${user.id}`, max: 10, windowS: 900 };
  await checkLimit(em, wrong);
  if (!(await verifyPassword(user.passwordHash, input.password))) {
    await hitLimit(em, wrong);
    throw invalid('The password is not right.', { password: 'Enter your current password to create a token.' });
  }
  if ((await em.count(ApiToken, { user, revokedAt: null, expiresAt: { $gt: new Date() } })) >= MAX_ACTIVE_TOKENS) {
    throw conflict(`You have ${MAX_ACTIVE_TOKENS} active tokens: revoke one you no longer use first.`, 'too_many_tokens');
  }
  const { token, hash } = newSecret('emb_');
  const expiresAt = new Date(Date.now() + input.expiresInDays * 86_400_000);
  const row = em.create(ApiToken, { user, lab, name: input.name, prefix: token.slice(0, 10), tokenHash: hash, expiresAt });
  await audit(em, { kind: 'token-created', actor: user, lab, subject: `${input.name} (expires ${expiresAt.toISOString().slice(0, 10)})`, ip });
  return { row, token };
}

export async function listTokens(em: EntityManager, user: UserRow) {
  return em.find(ApiToken, { user }, { orderBy: { createdAt: 'desc' } });
}

export async function revokeToken(em: EntityManager, user: UserRow, tokenId: string, ip: string) {
  const t = await em.findOne(ApiToken, { id: tokenId, user });
  if (!t) throw notFound('No such token.');
  if (!t.revokedAt) {
    t.revokedAt = new Date();
    await audit(em, { kind: 'token-revoked', actor: user, lab: t.lab, subject: t.name, ip });
  }
  return t;
}
