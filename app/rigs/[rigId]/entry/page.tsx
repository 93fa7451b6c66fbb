import Link from 'next/link';
import { AppPage } from '../../../_components/app-page';
import { loadInLab } from '../../../_lib/labs/load-in-lab';
import { lastTrial } from '../../../_lib/rigs/trials';
import { requireLabAction } from '../../../_lib/accounts/viewer';
import { EntryForm } from './entry-form';

export const metadata = { title: 'Add a trial' };
export const dynamic = 'force-dynamic';

export default async function EntryPage({ params }: { params: Promise<{ rigId: string }> }) {
  const { rigId } = await params;
  const v = await requireLabAction(`/rigs/${rigId}/entry`, 'trial:write');
  const { row: rig } = await loadInLab(v, 'rig', rigId, 'trial:write');
  const last = await lastTrial(v.em, rig);
  return (
    <AppPage viewer={v} title="Add a trial" lead={<Link href={`/rigs/${rig.id}`}>{rig.name}</Link>}>
      <div className="mx-auto max-w-lg">
        <p className="mb-4 rounded-lg border border-caution-line bg-caution-bg px-3 py-2 text-sm text-caution-text">
          Keep water flowing through a heated coil at all times and stay clear of the outlet: it can be scalding.
        </p>
        <EntryForm rigId={rig.id} units={v.user.unitSystem} previous={last ? { bucketVolumeM3: last.bucketVolumeM3 ?? null, inletTempC: last.inletTempC, ambientTempC: last.ambientTempC ?? null } : null} />
      </div>
    </AppPage>
  );
}
