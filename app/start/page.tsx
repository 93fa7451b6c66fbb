import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { StateBadge } from '../_components/review-panel';
import { requireLabAction } from '../_lib/accounts/viewer';
import { ROLE_SUMMARIES } from '../_lib/labs/permissions';
import { landingFor, type WorkItem } from '../_lib/start/landing';

export const metadata = { title: 'Next steps' };
export const dynamic = 'force-dynamic';

const KIND = { fit: 'Fit', study: 'Study', comparison: 'Comparison' } as const;

function Items({ title, items, empty, children }: { title: string; items: WorkItem[]; empty: string; children?: React.ReactNode }) {
  return (
    <section className="card p-4" aria-label={title}>
      <h2 className="mb-3 text-lg">{title}</h2>
      {items.length ? (
        <ul className="divide-y divide-paper-line">
          {items.map((i) => (
            <li key={i.href} className="py-2">
              <div className="flex flex-wrap items-center gap-2">
                <span className="text-xs font-semibold uppercase tracking-wide text-ink-muted">{KIND[i.kind]}</span>
                <Link href={i.href}>{i.title}</Link>
                {i.state ? <StateBadge state={i.state} /> : null}
                {i.by ? <span className="text-sm text-ink-muted">by {i.by}</span> : null}
              </div>
              {i.lastComment ? <p className="mt-1 text-sm text-ink-soft">“{i.lastComment}”</p> : null}
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-muted">{empty}</p>
      )}
      {children}
    </section>
  );
}

/** The page after signing in: what this member does next, by their role in the current lab. */
export default async function StartPage() {
  const v = await requireLabAction('/start', 'lab:read');
  const l = await landingFor(v.em, v.current.lab, v.user, v.current.role);
  const lead = `${ROLE_SUMMARIES[v.current.role]} Here is what waits for you in ${v.current.lab.name}.`;
  return (
    <AppPage viewer={v} title={`Welcome, ${v.user.name}`} lead={lead}>
      <div className="grid gap-6 lg:grid-cols-2">
        {l.role === 'engineer' ? (
          <>
            <Items title="Your open work" items={l.open} empty="Nothing open: every fit and study of yours is in review or approved.">
              <p className="mt-3 flex flex-wrap gap-3 text-sm">
                <Link href="/rigs">Add trials to a rig</Link>
                <Link href="/comparisons">Compare two designs</Link>
                <Link href="/studies">Write a study</Link>
              </p>
            </Items>
            <Items title="Waiting for a reviewer" items={l.waiting} empty="Nothing of yours is in review." />
            <Items title="Design comparisons" items={l.comparisons} empty="No comparisons yet." />
          </>
        ) : null}
        {l.role === 'reviewer' ? (
          <>
            <Items title="Your review queue" items={l.queue} empty="Nothing waits for review. Comments on comparisons are always welcome." />
            <Items title="Comparisons to comment on" items={l.comparisons} empty="No comparisons yet." />
          </>
        ) : null}
        {l.role === 'viewer' ? (
          <>
            <Items title="Studies to read" items={l.studies} empty="No studies yet.">
              <p className="mt-3 text-sm text-ink-soft">Each study and comparison downloads as a spreadsheet (XLSX) from its page.</p>
            </Items>
            <Items title="Design comparisons" items={l.comparisons} empty="No comparisons yet." />
          </>
        ) : null}
        {l.role === 'owner' ? (
          <>
            <section className="card p-4" aria-label="Your team">
              <h2 className="mb-3 text-lg">Your team</h2>
              <table className="data-table">
                <thead>
                  <tr>
                    <th scope="col">Member</th>
                    <th scope="col">Role</th>
                  </tr>
                </thead>
                <tbody>
                  {l.members.map((m) => (
                    <tr key={m.id}>
                      <td>
                        {m.name} <span className="block text-xs text-ink-muted">{m.email}</span>
                      </td>
                      <td>{m.role}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              <p className="mt-3 text-sm text-ink-soft">
                {l.invitations.length ? `${l.invitations.length} invitation${l.invitations.length === 1 ? '' : 's'} not yet accepted. ` : ''}
                <Link href="/lab/members">Invite members and change roles</Link>
              </p>
            </section>
            <Items title="Work in review" items={l.queue} empty="Nothing waits for review." />
          </>
        ) : null}
      </div>
    </AppPage>
  );
}
