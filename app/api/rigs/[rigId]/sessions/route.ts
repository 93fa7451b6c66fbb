import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { planForRig, sessionDto, sessionListDto, sessionPlanInput, sessionsOfRig } from '@/app/_lib/sessions/sessions';

type P = { rigId: string };

/** GET: the rig's test sessions, newest first. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  return json({ sessions: (await sessionsOfRig(ctx.em, rig)).map(sessionListDto) });
});

/**
 * POST: plan a session (locally D-optimal flows at a prior: a saved fit of the lab or a guess of
 * Ts and UA). With `preview: true` the plan is answered and nothing is stored; else it is saved with the rig (201).
 */
export const POST = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const body = await ctx.json(sessionPlanInput);
  const r = await planForRig(ctx.em, rig, ctx.requireActor().user, body, async (id) => (await loadInLab(ctx, 'fit', id, 'lab:read')).row);
  if (r.preview) return json({ preview: true, settings: r.settings, plan: r.plan, runs: r.runs });
  return json({ session: sessionDto(r.row) }, { status: 201 });
});
