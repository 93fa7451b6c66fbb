import { Rig, Trial } from '@/entities';
import { AppPage } from '../_components/app-page';
import { flowUnit, formatDeltaT, formatFlow, formatTemp, tempUnit } from '../_lib/format';
import { requireLabAction } from '../_lib/viewer';

export const metadata = { title: 'Trials' };
export const dynamic = 'force-dynamic';

export default async function TrialsPage({ searchParams }: { searchParams: Promise<{ rig?: string }> }) {
  const v = await requireLabAction('/trials', 'lab:read');
  const { rig: rigId } = await searchParams;
  const rigs = await v.em.find(Rig, { lab: v.current.lab }, { orderBy: { name: 'asc' } });
  const rig = rigs.find((r) => r.id === rigId) ?? rigs[0];
  const trials = rig ? await v.em.find(Trial, { rig, lab: v.current.lab }, { orderBy: { startedAt: 'asc' }, limit: 200 }) : [];
  const u = v.user.unitSystem;
  return (
    <AppPage viewer={v} title="Trials" lead={rig ? `${rig.name}: steady trials in the order they were run.` : 'No rigs yet.'}>
      {rigs.length > 1 ? (
        <nav aria-label="Rigs" className="mb-4 flex flex-wrap gap-2">
          {rigs.map((r) => (
            <a key={r.id} href={`/trials?rig=${r.id}`} className={r.id === rig?.id ? 'btn-primary' : 'btn-quiet'} aria-current={r.id === rig?.id ? 'page' : undefined}>
              {r.name}
            </a>
          ))}
        </nav>
      ) : null}
      <div className="card overflow-x-auto">
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">#</th>
              <th scope="col">Started (UTC)</th>
              <th scope="col" className="text-right">Flow ({flowUnit(u)})</th>
              <th scope="col" className="text-right">Inlet ({tempUnit(u)})</th>
              <th scope="col" className="text-right">Outlet ({tempUnit(u)})</th>
              <th scope="col" className="text-right">ΔT</th>
              <th scope="col">Notes</th>
            </tr>
          </thead>
          <tbody>
            {trials.map((t, i) => (
              <tr key={t.id} className={t.excluded ? 'text-ink-muted line-through' : ''}>
                <td className="num">{i + 1}</td>
                <td className="num whitespace-nowrap">{t.startedAt.toISOString().replace('T', ' ').slice(0, 16)}</td>
                <td className="num text-right">{formatFlow(t.flowM3PerS, u).split(' ')[0]}</td>
                <td className="num text-right">{formatTemp(t.inletC, u).split(' ')[0]}</td>
                <td className="num text-right">{formatTemp(t.outletC, u).split(' ')[0]}</td>
                <td className="num text-right">{formatDeltaT(t.outletC - t.inletC, u)}</td>
                <td className="text-sm">
                  {t.isReference ? <span className="mr-1 rounded bg-water-50 px-1.5 py-0.5 text-xs font-medium text-water-800">reference</span> : null}
                  {t.notes}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </AppPage>
  );
}
