import 'server-only';
import { SignJWT, jwtVerify } from 'jose';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Session, type SessionRow, type UserRow } from '@/entities';
export type { UserRow };
import { sessionKey } from './config';

export const SESSION_COOKIE = 'emberline_session';
export const LAB_COOKIE = 'emberline_lab';
const SESSION_DAYS = 30;


/** Opens a session row for the user and returns the signed cookie value. */
export async function openSession(em: EntityManager, user: UserRow, userAgent: string): Promise<{ jwt: string; expiresAt: Date }> {
  const expiresAt = new Date(Date.now() + SESSION_DAYS * 86_400_000);
  const session = em.create(Session, { user, expiresAt, lastSeenAt: new Date(), userAgent: userAgent.slice(0, 300) });
  await em.flush();
  const jwt = await new SignJWT({ sid: session.id, ver: user.tokenVersion })
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(user.id)
    .setIssuedAt()
    .setExpirationTime(expiresAt)
    .sign(sessionKey());
  return { jwt, expiresAt };
}

/**
 * Verifies a session cookie: the signature and expiry, then the row (not revoked, not expired)
 * and the user's token version. Returns null for anything that does not hold.
 */
export async function readSession(em: EntityManager, jwt: string | undefined): Promise<{ user: UserRow; session: SessionRow } | null> {
  if (!jwt) return null;
  let payload: { sub?: string; sid?: unknown; ver?: unknown };
  try {
    ({ payload } = await jwtVerify(jwt, sessionKey(), { algorithms: ['HS256'] }));
  } catch {
    return null;
  }
  if (typeof payload.sid !== 'string' || typeof payload.ver !== 'number' || !payload.sub) return null;
  const session = await em.findOne(Session, { id: payload.sid, user: payload.sub }, { populate: ['user'] });
  if (!session || session.revokedAt || session.expiresAt <= new Date()) return null;
  const user = session.user;
  if (user.tokenVersion !== payload.ver) return null;
  if (Date.now() - session.lastSeenAt.getTime() > 5 * 60_000) {
    session.lastSeenAt = new Date();
    await em.flush();
  }
  return { user, session };
}

export function cookieOptions(secure: boolean, expires?: Date) {
  return { httpOnly: true, sameSite: 'lax' as const, secure, path: '/', ...(expires ? { expires } : { maxAge: 0 }) };
}
