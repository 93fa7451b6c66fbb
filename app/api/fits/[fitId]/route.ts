import { loadFit } from '@/app/_lib/fits/fit-access';
import { fitDto, reviewTrail } from '@/app/_lib/fits/fits';
import { json, route } from '@/app/_lib/server/route';

/** GET: a saved fit with its trials, settings, results, comments and review history. */
export const GET = route<{ fitId: string }>({ auth: 'user' }, async (ctx) => {
  const { fit } = await loadFit(ctx, 'lab:read');
  return json({ fit: fitDto(fit), ...(await reviewTrail(ctx.em, 'fit', fit.id)) });
});
