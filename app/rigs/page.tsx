import Link from 'next/link';
import { Rig, Trial } from '@/entities';
import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/viewer';

export const metadata = { title: 'Rigs' };
export const dynamic = 'force-dynamic';

const SOURCE_LABEL: Record<string, string> = {
  'wood-fire': 'Wood fire',
  'propane-burner': 'Propane burner',
  'natural-gas': 'Natural gas',
  'solar-collector': 'Solar collector',
  electric: 'Electric',
  'heat-pump': 'Heat pump',
  other: 'Other',
};

export default async function RigsPage() {
  const v = await requireLabAction('/rigs', 'lab:read');
  const rigs = await v.em.find(Rig, { lab: v.current.lab }, { orderBy: { name: 'asc' } });
  const counts = new Map<string, number>();
  for (const r of rigs) counts.set(r.id, await v.em.count(Trial, { rig: r, excluded: false }));
  return (
    <AppPage
      viewer={v}
      title="Rigs"
      lead={v.can('rig:write') ? 'The heater set-ups under test in this lab. As an engineer you import trials and fit them.' : 'The heater set-ups under test in this lab.'}
    >
      <ul className="grid gap-4 md:grid-cols-2">
        {rigs.map((r) => (
          <li key={r.id} className="card p-5">
            <div className="flex items-start justify-between gap-3">
              <h2 className="text-lg">{r.name}</h2>
              <span className="rounded-full bg-ember-50 px-2.5 py-0.5 text-xs font-semibold text-ember-700 ring-1 ring-ember-100">{SOURCE_LABEL[r.heatSource]}</span>
            </div>
            <p className="mt-2 text-ink-soft">{r.description}</p>
            <p className="mt-3 text-sm">
              <Link href={`/trials?rig=${r.id}`}>
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
