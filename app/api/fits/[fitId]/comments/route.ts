import { loadFit } from '@/app/_lib/fits/fit-access';
import { addComment, commentInput, reviewTrail } from '@/app/_lib/fits/fits';
import { json, route } from '@/app/_lib/server/route';

type P = { fitId: string };

/** GET: comments and review history of the fit. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { fit } = await loadFit(ctx, 'lab:read');
  return json(await reviewTrail(ctx.em, 'fit', fit.id));
});

/** POST: comment on the fit (engineers, reviewers, owners). */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { fit, member } = await loadFit(ctx, 'review:comment');
  await addComment(ctx.em, member.lab, ctx.requireActor().user, 'fit', fit.id, await ctx.json(commentInput));
  return json(await reviewTrail(ctx.em, 'fit', fit.id), { status: 201 });
});
