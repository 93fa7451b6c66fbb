import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { fitListDto, fitsOfLab, saveFit, saveFitInput } from '@/app/_lib/fits/fits';
import { json, route } from '@/app/_lib/server/route';
import { z } from 'zod';

type P = { labId: string };

/** GET: the lab's saved fits, newest first. */
export const GET = route<P>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const fits = await fitsOfLab(ctx.em, ctx.member!.lab);
  return json({ fits: fits.map(fitListDto) });
});

const body = saveFitInput.extend({ rigId: z.string() });

/** POST: save a fit (recomputed on the server) as an immutable record; same title → next version. */
export const POST = route<P>({ auth: 'user', labAction: 'fit:write', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { rigId, ...input } = await ctx.json(body);
  const { row: rig } = await loadInLab(ctx, 'rig', rigId, 'fit:write');
  if (rig.lab.id !== ctx.params.labId) return json({ error: 'not_found', message: 'Not found.' }, { status: 404 });
  const fit = await saveFit(ctx.em, rig, ctx.requireActor().user, input);
  return json({ fit: fitListDto(fit) }, { status: 201 });
});
