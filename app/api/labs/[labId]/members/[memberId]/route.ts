import { memberDto } from '@/app/_lib/server/dto';
import { changeRole, removeMember } from '@/app/_lib/labs/labs';
import { json, route } from '@/app/_lib/server/route';
import { roleInput } from '@/app/_lib/accounts/schemas';

type P = { labId: string; memberId: string };

/** PATCH: change a member's role (owners; never the last owner). */
export const PATCH = route<P>({ auth: 'session', labAction: 'member:manage' }, async (ctx) => {
  const { role } = await ctx.json(roleInput);
  const m = await changeRole(ctx.em, ctx.params.labId, ctx.params.memberId, role, ctx.requireActor().user, ctx.ip);
  return json({ member: memberDto(m) });
});

/** DELETE: remove a member (owners; never the last owner). */
export const DELETE = route<P>({ auth: 'session', labAction: 'member:manage' }, async (ctx) => {
  await removeMember(ctx.em, ctx.params.labId, ctx.params.memberId, ctx.requireActor().user, ctx.ip);
  return json({ ok: true });
});
