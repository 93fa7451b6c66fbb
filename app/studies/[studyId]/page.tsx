import { notFound } from 'next/navigation';
import { Fit, ShareLink, Study } from '@/entities';
import { AppPage } from '../../_components/app-page';
import { ReviewPanel } from '../../_components/review-panel';
import { StudyBlocks } from '../../_components/study-blocks';
import { reviewTrail } from '../../_lib/fits';
import { modelLabel } from '../../_lib/fit-analysis';
import { UUID } from '../../_lib/rigs';
import { shareDto } from '../../_lib/studies';
import { requireLabAction } from '../../_lib/viewer';
import { StudyEditor } from './editor';
import { ShareManager } from './shares';

export const metadata = { title: 'Study' };
export const dynamic = 'force-dynamic';

export default async function StudyPage({ params, searchParams }: { params: Promise<{ studyId: string }>; searchParams: Promise<{ edit?: string }> }) {
  const { studyId } = await params;
  const { edit } = await searchParams;
  const v = await requireLabAction(`/studies/${studyId}`, 'lab:read');
  const study = UUID.test(studyId) ? await v.em.findOne(Study, { id: studyId, lab: v.current.lab }, { populate: ['updatedBy', 'createdBy'] }) : null;
  if (!study) notFound();
  const canEdit = v.can('study:write') && study.reviewState !== 'in-review';
  const fits = canEdit ? await v.em.find(Fit, { lab: v.current.lab }, { populate: ['rig'], orderBy: { createdAt: 'desc' }, limit: 100 }) : [];
  const trail = await reviewTrail(v.em, 'study', study.id);
  const shares = v.can('share:manage') ? await v.em.find(ShareLink, { study }, { orderBy: { createdAt: 'desc' } }) : [];
  return (
    <AppPage
      viewer={v}
      title={study.title}
      lead={<>Revision {study.revision}, last saved {study.updatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by {study.updatedBy?.name ?? 'a former member'}.</>}
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
          {edit && canEdit ? (
            <StudyEditor
              studyId={study.id}
              initial={{ title: study.title, blocks: study.blocks as Parameters<typeof StudyEditor>[0]['initial']['blocks'], revision: study.revision }}
              fits={fits.map((f) => ({ id: f.id, label: `${f.rig.name}: ${f.title} v${f.version} (${modelLabel(f.model)})`, coil: f.model === 'coil' }))}
              units={v.user.unitSystem}
            />
          ) : null}
          <StudyBlocks em={v.em} lab={v.current.lab} study={study} units={v.user.unitSystem} />
        </div>
        <div className="space-y-5">
          <ReviewPanel
            kind="study"
            id={study.id}
            state={study.reviewState}
            canSubmit={v.can('study:write')}
            canDecide={v.can('review:decide')}
            canComment={v.can('review:comment')}
            comments={trail.comments}
            events={trail.events}
          />
          {v.can('share:manage') ? <ShareManager studyId={study.id} initial={shares.map(shareDto)} /> : null}
        </div>
      </div>
    </AppPage>
  );
}
