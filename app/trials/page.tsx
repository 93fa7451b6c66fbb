import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { TrialsTable } from '../_components/trials-table';
import { requireLabAction } from '../_lib/accounts/viewer';
import { rigsOfLab } from '../_lib/rigs/rigs';

export const metadata = { title: 'Trials' };
export const dynamic = 'force-dynamic';

export default async function TrialsPage({ searchParams }: { searchParams: Promise<{ rig?: string }> }) {
  const v = await requireLabAction('/trials', 'lab:read');
  const { rig: rigId } = await searchParams;
  const { rigs } = await rigsOfLab(v.em, v.current.lab);
  const rig = rigs.find((r) => r.id === rigId) ?? rigs[0];
  return (
    <AppPage viewer={v} title="Trials" lead={rig ? <>Steady trials of <Link href={`/rigs/${rig.id}`}>{rig.name}</Link>.</> : 'No rigs yet.'}>
      {rigs.length > 1 ? (
        <nav aria-label="Rigs" className="mb-4 flex flex-wrap gap-2">
          {rigs.map((r) => (
            <Link key={r.id} href={`/trials?rig=${r.id}`} className={r.id === rig?.id ? 'btn-primary' : 'btn-quiet'} aria-current={r.id === rig?.id ? 'page' : undefined}>
              {r.name}
            </Link>
          ))}
        </nav>
      ) : null}
      {rig ? <TrialsTable key={rig.id} rigId={rig.id} units={v.user.unitSystem} canWrite={v.can('trial:write')} /> : null}
    </AppPage>
  );
}
