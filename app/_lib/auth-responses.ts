import 'server-only';
import { NextResponse } from 'next/server';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { UserRow } from '@/entities';
import { userDto } from './dto';
import { SESSION_COOKIE, cookieOptions, openSession } from './session';

/** Opens a session and answers with the user and the session cookie. */
export async function signedIn(em: EntityManager, user: UserRow, userAgent: string, secure: boolean, status = 200) {
  const { jwt, expiresAt } = await openSession(em, user, userAgent);
  const res = NextResponse.json({ user: userDto(user) }, { status });
  res.cookies.set(SESSION_COOKIE, jwt, cookieOptions(secure, expiresAt));
  return res;
}

export function signedOut(secure: boolean) {
  const res = NextResponse.json({ ok: true });
  res.cookies.set(SESSION_COOKIE, '', cookieOptions(secure));
  return res;
}
