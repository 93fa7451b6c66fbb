import { membersOf } from '@/app/_lib/labs/labs';
import { memberDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';

/** GET: the lab's members and their roles (any member may see who else is in the lab). */
export const GET = route<{ labId: string }>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const members = await membersOf(ctx.em, ctx.params.labId);
  return json({ members: members.map(memberDto) });
});
