import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { requireViewer } from '../_lib/accounts/viewer';
import { takeNotices } from '../_lib/review/review';

export const metadata = { title: 'Notices' };
export const dynamic = 'force-dynamic';

/** In-app notices (review requests and decisions); opening the page marks them read. */
export default async function NoticesPage() {
  const v = await requireViewer('/notices');
  const notices = await takeNotices(v.em, v.user);
  const unread = new Set(notices.filter((n) => !n.readAt).map((n) => n.id));
  return (
    <AppPage viewer={{ ...v, unreadNotices: 0 }} title="Notices" lead="Review requests and decisions about your work.">
      <ul className="space-y-2">
        {notices.map((n) => (
          <li key={n.id} className={`card p-4 ${unread.has(n.id) ? 'border-ember-300' : ''}`}>
            <p className="text-sm text-ink-muted">
              <span className="num">{n.createdAt.toISOString().slice(0, 16).replace('T', ' ')}</span> · {n.lab.name}
              {unread.has(n.id) ? <strong className="ml-2 text-ember-700">new</strong> : null}
            </p>
            <p className="mt-1">
              <Link href={n.link}>{n.text}</Link>
            </p>
          </li>
        ))}
        {notices.length === 0 ? <li className="text-ink-muted">Nothing yet.</li> : null}
      </ul>
    </AppPage>
  );
}
