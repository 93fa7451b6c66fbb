import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/viewer';

export const metadata = { title: 'Studies' };
export const dynamic = 'force-dynamic';

export default async function StudiesPage() {
  const v = await requireLabAction('/studies', 'lab:read');
  return (
    <AppPage viewer={v} title="Studies" lead="Notebook-style pages that bring trials, fits and forecasts together for review and sharing.">
      <div className="card p-6 text-ink-soft">
        <p>No studies in {v.current.lab.name} yet.</p>
        <p className="mt-2 text-sm">
          Meanwhile the <Link href="/trials">trials</Link> of each rig are ready to be fitted.
        </p>
      </div>
    </AppPage>
  );
}
