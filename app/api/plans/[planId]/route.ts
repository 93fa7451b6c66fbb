import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { deletePlan, operatingPlanInput, planDto, updatePlan } from '@/app/_lib/rigs/operating-plans';

type P = { planId: string };

/** GET: one operating plan with its cautions. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'plan', ctx.params.planId, 'lab:read');
  return json({ plan: planDto(row) });
});

/** PUT: replace the plan's name, steps and loop (engineers and owners). */
export const PUT = route<P>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'plan', ctx.params.planId, 'rig:write');
  return json({ plan: planDto(await updatePlan(ctx.em, row, await ctx.json(operatingPlanInput))) });
});

/** DELETE: remove the plan (a study block showing it then says so). */
export const DELETE = route<P>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'plan', ctx.params.planId, 'rig:write');
  await deletePlan(ctx.em, row);
  return json({ deleted: true });
});
