import { labDto } from '@/app/_lib/server/dto';
import { acceptInvitation } from '@/app/_lib/labs/labs';
import { json, route } from '@/app/_lib/server/route';
import { setLabCookie } from '@/app/_lib/accounts/session';

/** POST: accept an invitation as the signed-in user (the invited address only). */
export const POST = route<{ token: string }>({ auth: 'session' }, async (ctx) => {
  const m = await acceptInvitation(ctx.em, ctx.params.token, ctx.requireActor().user, ctx.ip);
  const res = json({ lab: { ...labDto(m.lab), role: m.role } });
  setLabCookie(res, m.lab.id);
  return res;
});
