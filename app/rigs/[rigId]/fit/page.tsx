import Link from 'next/link';
import { AppPage } from '../../../_components/app-page';
import { loadInLab } from '../../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../../_lib/accounts/viewer';
import { FitWorkbench } from './workbench';

export const metadata = { title: 'Fit' };
export const dynamic = 'force-dynamic';

export default async function FitPage({ params }: { params: Promise<{ rigId: string }> }) {
  const { rigId } = await params;
  const v = await requireLabAction(`/rigs/${rigId}/fit`, 'lab:read');
  const { row: rig } = await loadInLab(v, 'rig', rigId, 'lab:read');
  return (
    <AppPage
      viewer={v}
      title={`Fit: ${rig.name}`}
      lead={
        <>
          Outlet temperature against flow, fitted on the server from the stored trials. <Link href={`/rigs/${rig.id}`}>Trials of this rig</Link>
        </>
      }
    >
      <FitWorkbench rigId={rig.id} rigName={rig.name} labId={v.current.lab.id} units={v.user.unitSystem} canSave={v.can('fit:write')} />
    </AppPage>
  );
}
