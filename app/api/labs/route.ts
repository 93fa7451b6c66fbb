import { labDto } from '@/app/_lib/server/dto';
import { createLab, membershipsOf } from '@/app/_lib/labs/labs';
import { json, route } from '@/app/_lib/server/route';
import { createLabInput } from '@/app/_lib/accounts/schemas';
import { setLabCookie } from '@/app/_lib/accounts/session';

/** GET: the labs the actor belongs to. */
export const GET = route({ auth: 'user' }, async (ctx) => {
  const { user, via, tokenLabId } = ctx.requireActor();
  const ms = await membershipsOf(ctx.em, user.id);
  return json({ labs: ms.filter((m) => via === 'session' || m.lab.id === tokenLabId).map((m) => ({ ...labDto(m.lab), role: m.role })) });
});

/** POST: create a lab; its creator becomes its owner. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { user } = ctx.requireActor();
  const { name } = await ctx.json(createLabInput);
  const lab = await createLab(ctx.em, user, name, ctx.ip);
  const res = json({ lab: { ...labDto(lab), role: 'owner' } }, { status: 201 });
  setLabCookie(res, lab.id);
  return res;
});
