import { comparisonExportData } from '@/app/_lib/comparisons/comparisons';
import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { route } from '@/app/_lib/server/route';
import { exportResponse } from '@/app/_lib/studies/study-export';

/** GET: the comparison as XLSX (Summary, Comparison) in the caller's units, or `?format=csv&table=Comparison`. */
export const GET = route<{ comparisonId: string }>({ auth: 'user' }, async (ctx) => {
  const { row, member } = await loadInLab(ctx, 'comparison', ctx.params.comparisonId, 'lab:export');
  return exportResponse(await comparisonExportData(ctx.em, row, member.lab.name, ctx.requireActor().user.unitSystem), row.title, ctx.req.nextUrl.searchParams);
});
