import { SiteHeader } from '../../_components/site-header';
import { StudyBlocks } from '../../_components/study-blocks';
import { getEm } from '../../_lib/db';
import { sharedStudy } from '../../_lib/studies';

export const metadata = { title: 'Shared study', robots: { index: false } };
export const dynamic = 'force-dynamic';

/** A study shared by link: read-only, no sign-in, no member names, no raw files. */
export default async function SharedStudyPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const em = await getEm();
  const link = await sharedStudy(em, token);
  return (
    <>
      <SiteHeader />
      <main id="main" className="mx-auto max-w-page px-4 pb-16 pt-8">
        {link ? (
          <>
            <div className="mb-6 flex flex-wrap items-end justify-between gap-3">
              <div>
                <p className="text-sm text-ink-muted">Shared from {link.lab.name} · read-only · link valid until {link.expiresAt.toISOString().slice(0, 10)}</p>
                <h1 className="text-2xl">{link.study.title}</h1>
              </div>
              <a className="btn-quiet" href={`/api/share/${encodeURIComponent(token)}/export`}>
                Download XLSX
              </a>
            </div>
            <StudyBlocks em={em} lab={link.lab} study={link.study} units="si" publicView />
          </>
        ) : (
          <div className="card max-w-xl p-6">
            <h1 className="text-2xl">This link cannot be used</h1>
            <p role="alert" className="mt-2 text-ink-soft">
              The share link has expired or was revoked. Ask whoever sent it for a new one.
            </p>
          </div>
        )}
      </main>
    </>
  );
}
