import { SWRConfig } from 'swr';
import { SiteHeader } from '../../_components/site-header';
import { StudyBlocks } from '../../_components/study-blocks';
import { sharedBlockKey } from '../../_contracts/study-keys';
import { getEm } from '../../_lib/server/db';
import { studyBlocksData } from '../../_lib/studies/study-blocks';
import { sharedStudy, shareUnits } from '../../_lib/studies/studies';
import { getViewer } from '../../_lib/accounts/viewer';

export const metadata = { title: 'Shared study', robots: { index: false } };
export const dynamic = 'force-dynamic';

const UNIT_CHOICES = [
  { units: 'si', label: 'SI (°C, L/min, kW)' },
  { units: 'us', label: 'US customary (°F, gpm, Btu/h)' },
] as const;

/**
 * A study shared by link: read-only, no sign-in, no member names, no raw files. The reader picks
 * SI or US customary units (`?units=`); a signed-in reader starts in their own preference.
 */
export default async function SharedStudyPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams: Promise<{ units?: string }> }) {
  const { token } = await params;
  const { units: asked } = await searchParams;
  const em = await getEm();
  const link = await sharedStudy(em, token);
  const units = shareUnits(asked, link ? (await getViewer())?.user.unitSystem : null);
  const blocks = link ? await studyBlocksData({ em, lab: link.lab, study: link.study, units, publicView: true }) : [];
  const fallback = Object.fromEntries(blocks.map((b) => [sharedBlockKey(token, b.id, units), { block: b }]));
  const here = `/share/${encodeURIComponent(token)}`;
  return (
    <>
      <SiteHeader />
      <main id="main" className="mx-auto max-w-page px-4 pb-16 pt-8">
        {link ? (
          <SWRConfig value={{ fallback }}>
            <div className="mb-6 flex flex-wrap items-end justify-between gap-3">
              <div>
                <p className="text-sm text-ink-muted">Shared from {link.lab.name} · read-only · link valid until {link.expiresAt.toISOString().slice(0, 10)}</p>
                <h1 className="text-2xl">{link.study.title}</h1>
              </div>
              <div className="flex flex-wrap items-center gap-3">
                <nav aria-label="Units" className="flex overflow-hidden rounded-lg border border-paper-line text-sm">
                  {UNIT_CHOICES.map((c) => (
                    <a
                      key={c.units}
                      href={`${here}?units=${c.units}`}
                      aria-current={units === c.units ? 'true' : undefined}
                      className={`px-3 py-1.5 no-underline ${units === c.units ? 'bg-ink text-white' : 'bg-white text-ink-soft hover:bg-paper-deep'}`}
                    >
                      {c.label}
                    </a>
                  ))}
                </nav>
                <a className="btn-quiet" href={`/api/share/${encodeURIComponent(token)}/export?units=${units}`}>
                  Download XLSX
                </a>
              </div>
            </div>
            <StudyBlocks source={{ token, units, blocks: link.study.blocks.map(({ id, kind }) => ({ id, kind })) }} />
          </SWRConfig>
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
