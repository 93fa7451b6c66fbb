import Link from 'next/link';
import { AppPage } from '../../../_components/app-page';
import { loadInLab } from '../../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../../_lib/accounts/viewer';
import { CollectorWorkbench } from './workbench';

export const metadata = { title: 'Collector efficiency' };
export const dynamic = 'force-dynamic';

export default async function CollectorPage({ params }: { params: Promise<{ rigId: string }> }) {
  const { rigId } = await params;
  const v = await requireLabAction(`/rigs/${rigId}/collector`, 'lab:read');
  const { row: rig } = await loadInLab(v, 'rig', rigId, 'lab:read');
  const d = rig.details ?? {};
  const gross = typeof (d.grossAreaM2 ?? d.collectorAreaM2) === 'number' ? Number(d.grossAreaM2 ?? d.collectorAreaM2) : null;
  const aperture = typeof d.apertureAreaM2 === 'number' ? d.apertureAreaM2 : null;
  return (
    <AppPage
      viewer={v}
      title={`Collector efficiency: ${rig.name}`}
      lead={
        <>
          The steady-state efficiency curve of ISO 9806, fitted on the server from the rig&apos;s trials that carry an irradiance and an ambient temperature.{' '}
          <Link href={`/rigs/${rig.id}`}>Trials of this rig</Link>
        </>
      }
    >
      {rig.heatSource !== 'solar-collector' ? (
        <p role="alert" className="rounded-lg border border-caution-line bg-caution-bg px-3 py-2 text-sm text-caution-text">
          This rig&apos;s heat source is not a solar collector. Edit the rig and choose &ldquo;Solar collector&rdquo; to test its efficiency.
        </p>
      ) : (
        <CollectorWorkbench rigId={rig.id} rigName={rig.name} grossAreaM2={gross} apertureAreaM2={aperture} canSave={v.can('fit:write')} />
      )}
    </AppPage>
  );
}
