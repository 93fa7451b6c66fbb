import { Membership } from '@/entities';
import { memberDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';

/** GET: the lab's members and their roles (any member may see who else is in the lab). */
export const GET = route<{ labId: string }>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const members = await ctx.em.find(Membership, { lab: ctx.params.labId }, { populate: ['user'], orderBy: { createdAt: 'asc' } });
  return json({ members: members.map(memberDto) });
});
