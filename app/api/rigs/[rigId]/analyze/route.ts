import { analyze, analyzeInput } from '@/app/_lib/fits/fit-analysis';
import { loadRig } from '@/app/_lib/rigs/rigs';
import { json, route } from '@/app/_lib/server/route';

/** POST: fit and compare models on the rig's trials; nothing is stored (any member may explore). */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { rig } = await loadRig(ctx, ctx.params.rigId, 'lab:read');
  const input = await ctx.json(analyzeInput);
  return json(await analyze(ctx.em, rig, input, ctx.requireActor().user.unitSystem));
});
