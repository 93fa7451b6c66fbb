import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { analyzeCollector, collectorAnalyzeInput } from '@/app/_lib/fits/collector-analysis';
import { json, route } from '@/app/_lib/server/route';

/** POST: the collector efficiency test (ISO 9806 steady state) of the rig's trials; nothing is stored (any member may explore). */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  const input = await ctx.json(collectorAnalyzeInput);
  return json(await analyzeCollector(ctx.em, rig, input));
});
