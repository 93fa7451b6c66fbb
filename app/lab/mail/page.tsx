import { notFound } from 'next/navigation';
import { AppPage } from '../../_components/app-page';
import { config } from '../../_lib/server/config';
import { labMail } from '../../_lib/mail/lab-mail';
import { requireLabAction } from '../../_lib/accounts/viewer';

export const metadata = { title: 'Captured mail' };
export const dynamic = 'force-dynamic';

export default async function MailPage() {
  if (!config.demo) notFound();
  const v = await requireLabAction('/lab/mail', 'mail:read');
  const messages = await labMail(v.current.lab.id);
  return (
    <AppPage viewer={v} title="Captured mail" lead="Demo mode: the invitations and review notices this lab sent are caught by a local mail fake and shown here instead of being delivered. Mail to a person about their account (sign-up links, password resets) is never shown on a lab page; the terminal running npm start prints it.">
      <div className="space-y-4">
        {messages.map((m) => (
          <article key={m.id} className="card p-5">
            <header className="flex flex-wrap justify-between gap-2 text-sm text-ink-muted">
              <span>
                To <span className="num text-ink">{m.to.join(', ')}</span>
              </span>
              <span className="num">{m.date.replace('T', ' ').slice(0, 19)} UTC</span>
            </header>
            <h2 className="mt-2 text-lg">{m.subject}</h2>
            <pre className="mt-2 whitespace-pre-wrap break-words font-sans text-sm text-ink-soft">{m.text}</pre>
          </article>
        ))}
        {messages.length === 0 ? <p className="text-ink-muted">No messages yet. Invite someone, or ask for a review.</p> : null}
      </div>
    </AppPage>
  );
}
