import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Rig } from '@/entities';
import { AppPage } from '../../../_components/app-page';
import { UUID } from '../../../_lib/rigs/rigs';
import { requireLabAction } from '../../../_lib/accounts/viewer';
import { FitWorkbench } from './workbench';

export const metadata = { title: 'Fit' };
export const dynamic = 'force-dynamic';

export default async function FitPage({ params }: { params: Promise<{ rigId: string }> }) {
  const { rigId } = await params;
  const v = await requireLabAction(`/rigs/${rigId}/fit`, 'lab:read');
  const rig = UUID.test(rigId) ? await v.em.findOne(Rig, { id: rigId, lab: v.current.lab }) : null;
  if (!rig) notFound();
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
