import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { analyze, analyzeDetail, analyzeInput } from '@/app/_lib/fits/fit-analysis';
import { json, route } from '@/app/_lib/server/route';

/**
 * POST: fit and compare models on the rig's trials; nothing is stored (any member may explore).
 * Answers what the page draws (the plots' numbers, reduced for display); `?detail=full` adds every
 * point's diagnostics to each fit.
 */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  const input = await ctx.json(analyzeInput);
  return json(await analyze(ctx.em, rig, input, analyzeDetail(ctx.req.nextUrl.searchParams.get('detail'))));
});
