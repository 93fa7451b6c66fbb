import Link from 'next/link';
import type { ReactNode } from 'react';
import { config } from '../_lib/server/config';
import type { Viewer } from '../_lib/accounts/viewer';
import { LabSwitcher, SignOutButton } from './lab-switcher';
import { SiteHeader } from './site-header';

/** The frame of every signed-in page: header with lab switcher and account links, then the page. */
export function AppPage({ viewer, title, lead, actions, children }: { viewer: Viewer; title: string; lead?: ReactNode; actions?: ReactNode; children: ReactNode }) {
  const labs = viewer.memberships.map((m) => ({ id: m.lab.id, name: m.lab.name, role: m.role }));
  const owner = viewer.current?.role === 'owner';
  return (
    <>
      <SiteHeader
        menu={
          <>
            <LabSwitcher labs={labs} currentId={viewer.current?.lab.id ?? null} />
            <Link href="/notices" className="rounded-md px-2 py-1.5 text-sm text-paper-deep no-underline hover:bg-coal-raised hover:text-white hover:no-underline" aria-label={`Notices, ${viewer.unreadNotices} unread`}>
              Notices{viewer.unreadNotices ? <span className="num ml-1 rounded-full bg-ember-500 px-1.5 text-xs text-white">{viewer.unreadNotices}</span> : null}
            </Link>
            <Link href="/account" className="rounded-md px-2 py-1.5 text-sm text-paper-deep no-underline hover:bg-coal-raised hover:text-white hover:no-underline">
              {viewer.user.name}
            </Link>
            <SignOutButton />
          </>
        }
      />
      {viewer.current ? (
        <nav aria-label="Lab" className="border-b border-paper-line bg-paper-deep">
          <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-4 gap-y-1 px-4 py-2 text-sm">
            <span className="font-semibold text-ink">{viewer.current.lab.name}</span>
            <span className="rounded-full bg-white px-2 py-0.5 text-xs font-medium text-ember-700 ring-1 ring-paper-line">{viewer.current.role}</span>
            <Link href="/lab/members">Members</Link>
            {owner ? <Link href="/lab/audit">Audit log</Link> : null}
            {owner && config.demo ? <Link href="/lab/mail">Captured mail</Link> : null}
          </div>
        </nav>
      ) : null}
      <main id="main" className="mx-auto max-w-page px-4 pb-16 pt-8">
        <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
          <div>
            <h1 className="text-2xl">{title}</h1>
            {lead ? <div className="mt-1 max-w-3xl text-ink-soft">{lead}</div> : null}
          </div>
          {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
        </div>
        {children}
      </main>
    </>
  );
}

/** A centred card for the signed-out account pages (sign-in, sign-up, reset). */
export function AuthCard({ title, lead, children }: { title: string; lead?: ReactNode; children: ReactNode }) {
  return (
    <>
      <SiteHeader />
      <main id="main" className="mx-auto flex max-w-page justify-center px-4 py-12">
        <div className="card w-full max-w-md p-6 sm:p-8">
          <h1 className="text-2xl">{title}</h1>
          {lead ? <div className="mt-2 text-ink-soft">{lead}</div> : null}
          <div className="mt-6">{children}</div>
        </div>
      </main>
    </>
  );
}
