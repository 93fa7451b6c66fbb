import { labDto, userDto } from '@/app/_lib/server/dto';
import { membershipsOf } from '@/app/_lib/labs/labs';
import { json, route } from '@/app/_lib/server/route';
import { preferencesInput } from '@/app/_lib/accounts/schemas';

/** GET: who is signed in and their labs with roles. */
export const GET = route({ auth: 'user' }, async (ctx) => {
  const { user, via, tokenLabId } = ctx.requireActor();
  const ms = await membershipsOf(ctx.em, user.id);
  const labs = ms.filter((m) => via === 'session' || m.lab.id === tokenLabId).map((m) => ({ ...labDto(m.lab), role: m.role }));
  return json({ user: userDto(user), via, labs });
});

/** PATCH: the user's display preferences (unit system). */
export const PATCH = route({ auth: 'session' }, async (ctx) => {
  const { user } = ctx.requireActor();
  const { unitSystem } = await ctx.json(preferencesInput);
  user.unitSystem = unitSystem;
  await ctx.em.flush();
  return json({ user: userDto(user) });
});
