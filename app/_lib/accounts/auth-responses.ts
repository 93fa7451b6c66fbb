import 'server-only';
import { NextResponse } from 'next/server';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { UserRow } from '@/entities';
import { userDto } from '../server/dto';
import { openSession, setSessionCookie } from './session';

/** Opens a session and answers with the user and the session cookie. */
export async function signedIn(em: EntityManager, user: UserRow, userAgent: string, status = 200, extra: Record<string, unknown> = {}) {
  const { jwt, expiresAt } = await openSession(em, user, userAgent);
  const res = NextResponse.json({ user: userDto(user), ...extra }, { status });
  setSessionCookie(res, jwt, expiresAt);
  return res;
}

export function signedOut() {
  const res = NextResponse.json({ ok: true });
  setSessionCookie(res, '');
  return res;
}
