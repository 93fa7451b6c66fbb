import { review, reviewInput } from '@/app/_lib/fits/fits';
import { json, route } from '@/app/_lib/server/route';
import { loadStudy, studyOwners } from '@/app/_lib/studies/studies';

/** POST: submit the study for review (authors), approve or request changes (reviewers, owners; never its author or anyone who edited it since the last decision). */
export const POST = route<{ studyId: string }>({ auth: 'session' }, async (ctx) => {
  const { study, member } = await loadStudy(ctx, 'lab:read');
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
