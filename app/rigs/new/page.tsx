import { AppPage } from '../../_components/app-page';
import { RigForm } from '../../_components/rig-form';
import { requireLabAction } from '../../_lib/accounts/viewer';

export const metadata = { title: 'New rig' };
export const dynamic = 'force-dynamic';

export default async function NewRigPage() {
  const v = await requireLabAction('/rigs/new', 'rig:write');
  return (
    <AppPage viewer={v} title="New rig" lead="A heater set-up under test: trials, fits and forecasts hang off it.">
      <div className="card max-w-2xl p-6">
        <RigForm labId={v.current.lab.id} />
      </div>
    </AppPage>
  );
}
