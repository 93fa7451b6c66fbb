import { labDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';
import { switchLabInput } from '@/app/_lib/accounts/schemas';
import { setLabCookie } from '@/app/_lib/accounts/session';

/** POST: make one of the user's labs the current one (the lab switcher). */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { labId } = await ctx.json(switchLabInput);
  const { lab, role } = await ctx.requireMember(labId, 'lab:read');
  const res = json({ lab: { ...labDto(lab), role } });
  setLabCookie(res, lab.id);
  return res;
});
