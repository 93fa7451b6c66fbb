import { tubFill, tubFillInput } from '@/app/_lib/forecasts/tub-fill';
import { json, route } from '@/app/_lib/server/route';

/** POST: a tub filled in one pass through the heater: fill time, final temperature, the flow for a target, the cautions; nothing is stored. */
export const POST = route<{ labId: string }>({ auth: 'user', labAction: 'lab:read', maxBodyBytes: 16 * 1024 }, async (ctx) => {
  const input = await ctx.json(tubFillInput);
  return json(await tubFill(ctx.em, ctx.member!.lab, input));
});
