import { Rig } from '@/entities';
import { rigDto } from '@/app/_lib/dto';
import { json, route } from '@/app/_lib/route';

/** GET: the lab's rigs. */
export const GET = route<{ labId: string }>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const rigs = await ctx.em.find(Rig, { lab: ctx.params.labId }, { orderBy: { name: 'asc' } });
  return json({ rigs: rigs.map(rigDto) });
});
