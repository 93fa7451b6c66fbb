import 'server-only';
import { cache } from 'react';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { Notice } from '@/entities';
import { getEm } from '../server/db';
import { membershipsOf } from '../labs/labs';
import { can, type Action } from '../labs/permissions';
import { config } from '../server/config';
import { LAB_COOKIE, readSession } from './session';

/**
 * The signed-in person for a server-rendered page, verified once per request (React cache):
 * the session, their memberships and the current lab (from the lab-switcher cookie).
 */
export const getViewer = cache(async () => {
  const em = await getEm();
  const jar = await cookies();
  const s = await readSession(em, jar.get(config.sessionCookie)?.value);
  if (!s) return null;
  const memberships = await membershipsOf(em, s.user.id);
  const wanted = jar.get(LAB_COOKIE)?.value;
  const current = memberships.find((m) => m.lab.id === wanted) ?? memberships[0] ?? null;
  const unreadNotices = await em.count(Notice, { user: s.user, readAt: null });
  return { em, user: s.user, memberships, current, unreadNotices, can: (action: Action) => can(current?.role, action) };
});

export type Viewer = NonNullable<Awaited<ReturnType<typeof getViewer>>>;

/** The viewer, or a redirect to sign-in that comes back to `next`. */
export async function requireViewer(next: string): Promise<Viewer> {
  const v = await getViewer();
  if (!v) redirect(`/sign-in?next=${encodeURIComponent(next)}`);
  return v;
}

/** The viewer with a current lab whose role allows `action`; otherwise not-found (no hint of what exists). */
export async function requireLabAction(next: string, action: Action) {
  const v = await requireViewer(next);
  if (!v.current) redirect('/labs/new');
  if (!v.can(action)) {
    const { notFound } = await import('next/navigation');
    notFound();
  }
  return { ...v, current: v.current };
}
