import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';
import { StateBadge } from '../_components/review-panel';
import { requireLabAction } from '../_lib/accounts/viewer';
import { studiesOfLab } from '../_lib/studies/studies';

export const metadata = { title: 'Studies' };
export const dynamic = 'force-dynamic';

export default async function StudiesPage() {
  const v = await requireLabAction('/studies', 'lab:read');
  const studies = await studiesOfLab(v.em, v.current.lab);
  return (
    <AppPage viewer={v} title="Studies" lead="Notebook pages that bring trials, fits and forecasts together for review and sharing.">
      <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
        <div className="card relative overflow-x-auto" tabIndex={0}>
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Study</th>
                <th scope="col">State</th>
                <th scope="col">Blocks</th>
                <th scope="col">Updated (UTC)</th>
              </tr>
            </thead>
            <tbody>
              {studies.map((s) => (
                <tr key={s.id}>
                  <td>
                    <Link href={`/studies/${s.id}`}>{s.title}</Link>
                  </td>
                  <td>
                    <StateBadge state={s.reviewState} />
                  </td>
                  <td className="num">{s.blocks.length}</td>
                  <td className="num whitespace-nowrap">{s.updatedAt.toISOString().slice(0, 16).replace('T', ' ')}</td>
                </tr>
              ))}
              {studies.length === 0 ? (
                <tr>
                  <td colSpan={4} className="text-ink-muted">No studies yet.</td>
                </tr>
              ) : null}
            </tbody>
          </table>
        </div>
        {v.can('study:write') ? (
          <section className="card p-4">
            <h2 className="text-lg">New study</h2>
            <NewStudy labId={v.current.lab.id} />
          </section>
        ) : null}
      </div>
    </AppPage>
  );
}

function NewStudy({ labId }: { labId: string }) {
  return <JsonForm action={`/api/labs/${labId}/studies`} submitLabel="Create study" onSuccess={{ refresh: true, reset: true, message: 'Created.' }} fields={[{ name: 'title', label: 'Title' }]} />;
}
