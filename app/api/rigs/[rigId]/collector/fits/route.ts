import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { saveCollectorFit, saveCollectorFitInput } from '@/app/_lib/fits/collector-analysis';
import { fitListDto } from '@/app/_lib/fits/fits';
import { json, route } from '@/app/_lib/server/route';

/** POST: save the rig's collector test (recomputed on the server) as an immutable fit of kind collector; same title → next version. */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'fit:write');
  const input = await ctx.json(saveCollectorFitInput);
  const fit = await saveCollectorFit(ctx.em, rig, ctx.requireActor().user, input);
  return json({ fit: fitListDto(fit) }, { status: 201 });
});
