import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { ApiToken, type LabRow, type UserRow } from '@/entities';
import { audit } from './audit';
import { notFound } from './errors';
import { newSecret } from './tokens';

/** Creates a personal token acting in one lab; the secret is returned once and only its hash is kept. */
export async function createToken(em: EntityManager, user: UserRow, lab: LabRow, name: string, ip: string) {
  const { token, hash } = newSecret('emb_');
  const row = em.create(ApiToken, { user, lab, name, prefix: token.slice(0, 10), tokenHash: hash });
  await audit(em, { kind: 'token-created', actor: user, lab, subject: name, ip });
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
