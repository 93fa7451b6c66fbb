import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { addComment, commentInput, reviewTrail } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';

type P = { comparisonId: string };

/** GET: the comments on the comparison. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'comparison', ctx.params.comparisonId, 'lab:read');
  return json(await reviewTrail(ctx.em, 'comparison', row.id));
});

/** POST: comment on the comparison (engineers, reviewers, owners). */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { row, member } = await loadInLab(ctx, 'comparison', ctx.params.comparisonId, 'review:comment');
  await addComment(ctx.em, member.lab, ctx.requireActor().user, 'comparison', row.id, await ctx.json(commentInput));
  return json(await reviewTrail(ctx.em, 'comparison', row.id), { status: 201 });
});
