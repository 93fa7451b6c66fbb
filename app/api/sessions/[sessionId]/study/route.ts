import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { studyFromSession } from '@/app/_lib/sessions/close';

/** POST: a study from a closed session (a saved fit of its trials and a study of its verdict); asking again gives the same study. */
export const POST = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: s, member } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'study:write');
  await ctx.requireMember(member.lab.id, 'fit:write');
  const study = await studyFromSession(ctx.em, s, ctx.requireActor().user);
  return json({ studyId: study.id }, { status: 201 });
});
