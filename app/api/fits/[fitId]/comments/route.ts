import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { addComment, commentInput, reviewTrail } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';

type P = { fitId: string };

/** GET: comments and review history of the fit. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: fit } = await loadInLab(ctx, 'fit', ctx.params.fitId, 'lab:read');
  return json(await reviewTrail(ctx.em, 'fit', fit.id));
});

/** POST: comment on the fit (engineers, reviewers, owners). */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { row: fit, member } = await loadInLab(ctx, 'fit', ctx.params.fitId, 'review:comment');
  await addComment(ctx.em, member.lab, ctx.requireActor().user, 'fit', fit.id, await ctx.json(commentInput));
  return json(await reviewTrail(ctx.em, 'fit', fit.id), { status: 201 });
});
