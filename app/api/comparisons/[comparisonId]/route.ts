import { comparisonListDto, readComparison } from '@/app/_lib/comparisons/comparisons';
import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';

type P = { comparisonId: string };

/** GET: the comparison with its numbers and plots, recomputed from the trials, in the caller's units. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'comparison', ctx.params.comparisonId, 'lab:read');
  return json({ comparison: comparisonListDto(row), view: await readComparison(ctx.em, row, ctx.requireActor().user.unitSystem) });
});

