import { z } from 'zod';
import { forecast } from '@/app/_lib/forecasts/forecasts';
import { json, route } from '@/app/_lib/server/route';

/** POST: a pool or tub forecast (inputs as unit strings, as the analysis command line takes them); nothing is stored. The plots come as numbers for the page to draw. */
export const POST = route<{ labId: string }>({ auth: 'user', labAction: 'lab:read', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const body = await ctx.json(z.record(z.string(), z.unknown()));
  return json(await forecast(ctx.em, ctx.member!.lab, body, ctx.requireActor().user.unitSystem, 'data'));
});
