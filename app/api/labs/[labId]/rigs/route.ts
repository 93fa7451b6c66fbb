import { rigDto } from '@/app/_lib/server/dto';
import { createRig, rigInput, rigsOfLab } from '@/app/_lib/rigs/rigs';
import { json, route } from '@/app/_lib/server/route';

type P = { labId: string };

/** GET: the lab's rigs. */
export const GET = route<P>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const { rigs } = await rigsOfLab(ctx.em, ctx.member!.lab);
  return json({ rigs: rigs.map(rigDto) });
});

/** POST: create a rig (engineers and owners). */
export const POST = route<P>({ auth: 'user', labAction: 'rig:write' }, async (ctx) => {
  const rig = await createRig(ctx, await ctx.json(rigInput));
  return json({ rig: rigDto(rig) }, { status: 201 });
});
