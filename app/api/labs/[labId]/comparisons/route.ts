import { comparisonInput, comparisonListDto, comparisonsOfLab, createComparison } from '@/app/_lib/comparisons/comparisons';
import { json, route } from '@/app/_lib/server/route';

type P = { labId: string };

/** GET: the lab's design comparisons. */
export const GET = route<P>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const rows = await comparisonsOfLab(ctx.em, ctx.params.labId);
  return json({ comparisons: rows.map(comparisonListDto) });
});

/** POST: save a comparison of two to four rigs or saved fits of this lab (engineers and owners). */
export const POST = route<P>({ auth: 'session', labAction: 'study:write' }, async (ctx) => {
  const c = await createComparison(ctx, await ctx.json(comparisonInput));
  return json({ comparison: comparisonListDto(c) }, { status: 201 });
});
