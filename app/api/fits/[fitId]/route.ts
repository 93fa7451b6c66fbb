import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { fitDto } from '@/app/_lib/fits/fits';
import { reviewTrail } from '@/app/_lib/review/review';
import { json, route } from '@/app/_lib/server/route';

/** GET: a saved fit with its trials, settings, results, comments and review history. */
export const GET = route<{ fitId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: fit } = await loadInLab(ctx, 'fit', ctx.params.fitId, 'lab:read');
  return json({ fit: fitDto(fit), ...(await reviewTrail(ctx.em, 'fit', fit.id)) });
});
