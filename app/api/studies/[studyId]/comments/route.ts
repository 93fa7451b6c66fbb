import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { addComment, commentInput, reviewTrail } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';

type P = { studyId: string };

/** GET: comments (on the study or one of its blocks) and review history. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: study } = await loadInLab(ctx, 'study', ctx.params.studyId, 'lab:read');
  return json(await reviewTrail(ctx.em, 'study', study.id));
});

/** POST: comment on the study or, with `blockId`, on one block. */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { row: study, member } = await loadInLab(ctx, 'study', ctx.params.studyId, 'review:comment');
  const input = await ctx.json(commentInput);
  if (input.blockId && !study.blocks.some((b) => b.id === input.blockId)) return json({ error: 'not_found', message: 'No such block in this study.' }, { status: 404 });
  await addComment(ctx.em, member.lab, ctx.requireActor().user, 'study', study.id, input);
  return json(await reviewTrail(ctx.em, 'study', study.id), { status: 201 });
});
