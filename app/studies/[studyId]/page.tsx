import lazyComponent from 'next/dynamic';
import { SWRConfig } from 'swr';
import { AppPage } from '../../_components/app-page';
import { ReviewPanel } from '../../_components/review-panel';
import { StudyBlocks } from '../../_components/study-blocks';
import type { StudyRecord } from '../../_contracts/study-blocks';
import { studyBlockKey, studyKey } from '../../_contracts/study-keys';
import { fitsOfLab } from '../../_lib/fits/fits';
import { reviewTrail } from '../../_lib/review/review';
import { modelLabel } from '../../_lib/fits/fit-analysis';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { sensorLogsOf, studyBlocksData } from '../../_lib/studies/study-blocks';
import { comparisonsOfLab } from '../../_lib/comparisons/comparisons';
import { plansOfLab } from '../../_lib/rigs/operating-plans';
import { shareDto, sharesOfStudy, studyDto, studyOwners } from '../../_lib/studies/studies';
import { requireLabAction } from '../../_lib/accounts/viewer';
import type { StudyEditor as Editor } from './editor';
import { StudyLead } from './lead';
import { ShareManager } from './shares';

// the editor's code is sent only to someone editing (most visits read the study)
const StudyEditor = lazyComponent(() => import('./editor').then((m) => m.StudyEditor));

export const metadata = { title: 'Study' };
export const dynamic = 'force-dynamic';

export default async function StudyPage({ params, searchParams }: { params: Promise<{ studyId: string }>; searchParams: Promise<{ edit?: string }> }) {
  const { studyId } = await params;
  const { edit } = await searchParams;
  const v = await requireLabAction(`/studies/${studyId}`, 'lab:read');
  const { row: study } = await loadInLab(v, 'study', studyId, 'lab:read');
  const canEdit = v.can('study:write') && study.reviewState !== 'in-review';
  const editing = !!edit && canEdit;
  const fits = editing ? await fitsOfLab(v.em, v.current.lab) : [];
  const logs = editing ? await sensorLogsOf(v.em, v.current.lab) : [];
  const comparisons = editing ? await comparisonsOfLab(v.em, v.current.lab) : [];
  const plans = editing ? await plansOfLab(v.em, v.current.lab) : [];
  const trail = await reviewTrail(v.em, 'study', study.id);
  const shares = v.can('share:manage') ? await sharesOfStudy(v.em, study) : [];
  // The first paint is complete: the study and every block's data go to the client as the SWR
  // fallback under the same keys the hooks use, so nothing is fetched until the editor changes a block.
  const blocks = await studyBlocksData({ em: v.em, lab: v.current.lab, study, units: v.user.unitSystem, publicView: false });
  const fallback: Record<string, unknown> = { [studyKey(study.id)]: { study: studyDto(study) } satisfies StudyRecord };
  for (const b of blocks) fallback[studyBlockKey(study.id, b.id)] = { block: b };
  return (
    <SWRConfig value={{ fallback }}>
    <AppPage
      viewer={v}
      title={study.title}
      lead={<StudyLead studyId={study.id} />}
      actions={
        <>
          {canEdit && !edit ? (
            <a className="btn-primary" href={`/studies/${study.id}?edit=1`}>
              Edit
            </a>
          ) : null}
          {edit ? (
            <a className="btn-quiet" href={`/studies/${study.id}`}>
              Done editing
            </a>
          ) : null}
          <a className="btn-quiet" href={`/api/studies/${study.id}/export`}>
            Download XLSX
          </a>
        </>
      }
    >
      <div className="grid gap-6 xl:grid-cols-[1fr_21rem]">
        <div className="min-w-0 space-y-5">
          {editing ? (
            <StudyEditor
              studyId={study.id}
              initial={{ title: study.title, blocks: study.blocks as Parameters<typeof Editor>[0]['initial']['blocks'], revision: study.revision }}
              fits={fits.map((f) => ({ id: f.id, label: `${f.rig.name}: ${f.title} v${f.version} (${f.kind === 'collector' ? 'collector curve' : modelLabel(f.model)})`, coil: f.model === 'coil', collector: f.kind === 'collector' }))}
              initialReviewState={study.reviewState}
              logs={logs}
              comparisons={comparisons.map((c) => ({ id: c.id, label: `${c.title} (${c.subjects.length} designs)` }))}
              plans={plans.map((p) => ({ id: p.id, label: `${p.rig.name}: ${p.name}` }))}
              units={v.user.unitSystem}
            />
          ) : null}
          <StudyBlocks source={{ studyId: study.id }} />
        </div>
        <div className="space-y-5">
          <ReviewPanel
            kind="study"
            id={study.id}
            state={study.reviewState}
            canSubmit={v.can('study:write')}
            canDecide={v.can('review:decide')}
            ownWork={studyOwners(study).includes(v.user.id)}
            canComment={v.can('review:comment')}
            comments={trail.comments}
            events={trail.events}
          />
          {v.can('share:manage') ? <ShareManager studyId={study.id} initial={shares.map(shareDto)} /> : null}
        </div>
      </div>
    </AppPage>
    </SWRConfig>
  );
}
