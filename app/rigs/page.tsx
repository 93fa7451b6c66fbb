import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { HEAT_SOURCE_LABELS } from '../_lib/rigs/labels';
import { requireLabAction } from '../_lib/accounts/viewer';
import { rigsOfLab } from '../_lib/rigs/rigs';

export const metadata = { title: 'Rigs' };
export const dynamic = 'force-dynamic';


export default async function RigsPage() {
  const v = await requireLabAction('/rigs', 'lab:read');
  const { rigs, counts } = await rigsOfLab(v.em, v.current.lab);
  return (
    <AppPage
      viewer={v}
      title="Rigs"
      lead="The heater set-ups under test in this lab."
      actions={
        v.can('rig:write') ? (
          <Link className="btn-primary" href="/rigs/new">
            New rig
          </Link>
        ) : null
      }
    >
      <ul className="grid gap-4 md:grid-cols-2">
        {rigs.map((r) => (
          <li key={r.id} className="card p-5">
            <div className="flex items-start justify-between gap-3">
              <h2 className="text-lg">
                <Link href={`/rigs/${r.id}`} className="text-ink">
                  {r.name}
                </Link>
              </h2>
              <span className="rounded-full bg-ember-50 px-2.5 py-0.5 text-xs font-semibold text-ember-700 ring-1 ring-ember-100">{HEAT_SOURCE_LABELS[r.heatSource]}</span>
            </div>
            <p className="mt-2 text-ink-soft">{r.description}</p>
            <p className="mt-3 text-sm">
              <Link href={`/rigs/${r.id}`}>
                <span className="num">{counts.get(r.id)}</span> trials
              </Link>
            </p>
          </li>
        ))}
      </ul>
      {rigs.length === 0 ? <p className="text-ink-muted">No rigs in this lab yet.</p> : null}
    </AppPage>
  );
}
