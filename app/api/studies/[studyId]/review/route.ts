import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { review, reviewInput } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';
import { studyOwners } from '@/app/_lib/studies/studies';

/** POST: submit the study for review (authors), approve or request changes (reviewers, owners; never its author or anyone who edited it since the last decision). */
export const POST = route<{ studyId: string }>({ auth: 'session' }, async (ctx) => {
  const { row: study, member } = await loadInLab(ctx, 'study', ctx.params.studyId, 'lab:read');
  const moveTo = await review(
    ctx.em,
    { kind: 'study', id: study.id, title: study.title, lab: member.lab, reviewState: study.reviewState, authorId: study.createdBy?.id ?? null, ownerIds: studyOwners(study), link: `/studies/${study.id}` },
    ctx.requireActor().user,
    member.role,
    await ctx.json(reviewInput),
    ctx.ip,
  );
  study.reviewState = moveTo;
  // a decision starts a new round: only later editors are kept from deciding the next one
  if (moveTo === 'approved' || moveTo === 'changes-requested') study.editedSinceReview = [];
  await ctx.em.flush();
  return json({ reviewState: moveTo });
});
