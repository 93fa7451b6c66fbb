import { Rig } from '@/entities';
import { rigDto } from '@/app/_lib/dto';
import { notFound } from '@/app/_lib/errors';
import { json, route } from '@/app/_lib/route';

/** GET: one rig, for members of its lab (404 for everyone else). */
export const GET = route<{ rigId: string }>({ auth: 'user' }, async (ctx) => {
  ctx.requireActor();
  if (!/^[0-9a-f-]{36}$/i.test(ctx.params.rigId)) throw notFound();
  const rig = await ctx.em.findOne(Rig, { id: ctx.params.rigId });
  if (!rig) throw notFound();
  await ctx.requireMember(rig.lab.id, 'lab:read');
  return json({ rig: rigDto(rig) });
});
