import { AppPage } from '../../_components/app-page';
import { JsonForm } from '../../_components/json-form';
import { requireViewer } from '../../_lib/accounts/viewer';

export const metadata = { title: 'New lab' };
export const dynamic = 'force-dynamic';

export default async function NewLabPage() {
  const v = await requireViewer('/labs/new');
  return (
    <AppPage viewer={v} title="Create a lab" lead="A lab holds its own rigs, trials, fits and studies. You will be its owner.">
      <div className="card max-w-lg p-6">
        <JsonForm action="/api/labs" submitLabel="Create lab" onSuccess={{ redirect: '/rigs', refresh: true }} fields={[{ name: 'name', label: 'Lab name' }]} />
      </div>
    </AppPage>
  );
}
