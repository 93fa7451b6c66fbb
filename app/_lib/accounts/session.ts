import 'server-only';
import { SignJWT, jwtVerify } from 'jose';
import type { NextResponse } from 'next/server';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Session, User, type SessionRow, type UserRow } from '@/entities';
export type { UserRow };
import { config, sessionKey } from '../server/config';

/** The lab switcher's cookie (which of the viewer's labs is current; authorization never reads it). */
export const LAB_COOKIE = 'emberline_lab';
/** A session ends this long after sign-in, however much it is used. */
export const SESSION_DAYS = 30;
/** A session that has not been used for this long ends (idle timeout). */
export const SESSION_IDLE_DAYS = 7;
/** `lastSeenAt` is written at most this often. */
const SEEN_EVERY_MS = 5 * 60_000;

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
 * Verifies a session cookie: the signature and expiry, then the row (not revoked, not past its
 * absolute expiry, used within the idle timeout) and the user's token version. Returns null for
 * anything that does not hold; an idle session is revoked on the spot.
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
  // two lookups by key, not one `populate`: every request makes this one, and the ORM's populate
  // machinery costs about twice the two plain lookups (measured: 2.4 ms against 1.2 ms of CPU)
  const session = await em.findOne(Session, { id: payload.sid, user: payload.sub });
  if (!session || session.revokedAt || session.expiresAt <= new Date()) return null;
  const user = await em.findOne(User, { id: session.user.id });
  if (!user) return null;
  if (user.tokenVersion !== payload.ver) return null;
  const idleMs = Date.now() - session.lastSeenAt.getTime();
  if (idleMs > SESSION_IDLE_DAYS * 86_400_000) {
    session.revokedAt = new Date();
    await em.flush();
    return null;
  }
  if (idleMs > SEEN_EVERY_MS) {
    session.lastSeenAt = new Date();
    await em.flush();
  }
  return { user, session };
}

/** Ends one session (this browser's sign-out). */
export async function endSession(em: EntityManager, sessionId: string | undefined): Promise<void> {
  if (sessionId) await em.nativeUpdate(Session, { id: sessionId }, { revokedAt: new Date() });
}

/** Cookie attributes from configuration (`Secure` for an https APP_URL or production), never from a request header. */
export function cookieOptions(expires?: Date) {
  return { httpOnly: true, sameSite: 'lax' as const, secure: config.secureCookies, path: '/', ...(expires ? { expires } : { maxAge: 0 }) };
}

/** Sets (or, with no jwt, clears) the session cookie on a response. */
export function setSessionCookie(res: NextResponse, jwt: string, expires?: Date) {
  res.cookies.set(config.sessionCookie, jwt, cookieOptions(jwt ? expires : undefined));
}

/** Remembers the viewer's current lab for a year. */
export function setLabCookie(res: NextResponse, labId: string) {
  res.cookies.set(LAB_COOKIE, labId, { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, path: '/', maxAge: 365 * 86400 });
}
