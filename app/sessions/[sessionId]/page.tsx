import Link from 'next/link';
import { AppPage } from '../../_components/app-page';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { sessionDto, sessionTrials } from '../../_lib/sessions/sessions';
import { SessionRunner } from './session-runner';

export const dynamic = 'force-dynamic';

/** A test session at the rig, made for a phone: one run at a time, the logger live, the verdict when closed. */
export default async function SessionPage({ params }: { params: Promise<{ sessionId: string }> }) {
  const { sessionId } = await params;
  const v = await requireLabAction(`/sessions/${sessionId}`, 'lab:read');
  const { row: s } = await loadInLab(v, 'session', sessionId, 'lab:read');
  const dto = sessionDto(s, await sessionTrials(v.em, s));
  return (
    <AppPage
      viewer={v}
      title={s.title}
      lead={
        <>
          Test session at <Link href={`/rigs/${s.rig.id}`}>{s.rig.name}</Link>
        </>
      }
    >
      <SessionRunner initial={JSON.parse(JSON.stringify(dto))} units={v.user.unitSystem} canWrite={v.can('trial:write')} canStudy={v.can('study:write') && v.can('fit:write')} />
    </AppPage>
  );
}
