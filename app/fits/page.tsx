import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/viewer';

export const metadata = { title: 'Fits' };
export const dynamic = 'force-dynamic';

export default async function FitsPage() {
  const v = await requireLabAction('/fits', 'lab:read');
  return (
    <AppPage viewer={v} title="Fits" lead="Fitted models of outlet temperature against flow, with residuals, uncertainty and review state.">
      <div className="card p-6 text-ink-soft">
        <p>No fits in {v.current.lab.name} yet.</p>
        <p className="mt-2 text-sm">
          Meanwhile the <Link href="/trials">trials</Link> of each rig are ready to be fitted.
        </p>
      </div>
    </AppPage>
  );
}
