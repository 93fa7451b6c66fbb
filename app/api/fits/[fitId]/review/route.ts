import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { review, reviewInput } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';

/** POST: submit for review (authors), approve or request changes (reviewers and owners, never the fit's author). */
export const POST = route<{ fitId: string }>({ auth: 'session' }, async (ctx) => {
  const { row: fit, member } = await loadInLab(ctx, 'fit', ctx.params.fitId, 'lab:read');
  const input = await ctx.json(reviewInput);
  const state = await review(
    ctx.em,
    { kind: 'fit', id: fit.id, title: `${fit.title} v${fit.version}`, lab: member.lab, reviewState: fit.reviewState, authorId: fit.createdBy?.id ?? null, ownerIds: fit.createdBy ? [fit.createdBy.id] : [], link: `/fits/${fit.id}` },
    ctx.requireActor().user,
    member.role,
    input,
    ctx.ip,
  );
  fit.reviewState = state;
  await ctx.em.flush();
  return json({ reviewState: state });
});
