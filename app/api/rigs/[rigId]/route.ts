import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { rigDto } from '@/app/_lib/server/dto';
import { rigPatch, updateRig } from '@/app/_lib/rigs/rigs';
import { json, route } from '@/app/_lib/server/route';

type P = { rigId: string };

/** GET: one rig, for members of its lab (404 for everyone else). */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  return json({ rig: rigDto(rig) });
});

/** PATCH: edit a rig's name, heat source, description, details or notes. */
export const PATCH = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'rig:write');
  return json({ rig: rigDto(await updateRig(ctx, rig, await ctx.json(rigPatch))) });
});
