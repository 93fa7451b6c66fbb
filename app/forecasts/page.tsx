import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/viewer';

export const metadata = { title: 'Forecasts' };
export const dynamic = 'force-dynamic';

export default async function ForecastsPage() {
  const v = await requireLabAction('/forecasts', 'lab:read');
  return (
    <AppPage viewer={v} title="Forecasts" lead="How fast a pool or tub will warm with a rig, with losses, cautions and cost.">
      <div className="card p-6 text-ink-soft">
        <p>No forecasts in {v.current.lab.name} yet.</p>
        <p className="mt-2 text-sm">
          Meanwhile the <Link href="/trials">trials</Link> of each rig are ready to be fitted.
        </p>
      </div>
    </AppPage>
  );
}
