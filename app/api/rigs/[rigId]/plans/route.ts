import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { createPlan, operatingPlanInput, planDto, plansOfRig } from '@/app/_lib/rigs/operating-plans';

type P = { rigId: string };

/** GET: the rig's operating plans, each with the cautions it raises. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  return json({ plans: (await plansOfRig(ctx.em, rig)).map(planDto) });
});

/** POST: save an operating plan of the rig (engineers and owners; SI steps). */
export const POST = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'rig:write');
  const row = await createPlan(ctx.em, rig, ctx.requireActor().user, await ctx.json(operatingPlanInput));
  return json({ plan: planDto(row) }, { status: 201 });
});
