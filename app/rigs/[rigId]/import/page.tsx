import Link from 'next/link';
import { AppPage } from '../../../_components/app-page';
import { maxUploadBytes } from '../../../_lib/imports/trial-sheets';
import { loadInLab } from '../../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../../_lib/accounts/viewer';
import { ImportWizard } from './wizard';

export const metadata = { title: 'Import trials' };
export const dynamic = 'force-dynamic';

export default async function ImportPage({ params }: { params: Promise<{ rigId: string }> }) {
  const { rigId } = await params;
  const v = await requireLabAction(`/rigs/${rigId}/import`, 'trial:write');
  const { row: rig } = await loadInLab(v, 'rig', rigId, 'trial:write');
  return (
    <AppPage viewer={v} title="Import trials" lead={<>Into <Link href={`/rigs/${rig.id}`}>{rig.name}</Link>: upload, check the columns and units, fix or exclude rows, then import.</>}>
      <ImportWizard rigId={rig.id} units={v.user.unitSystem} maxMb={Math.round(maxUploadBytes() / 1024 / 1024)} />
    </AppPage>
  );
}
