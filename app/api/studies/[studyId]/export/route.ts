import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { route } from '@/app/_lib/server/route';
import { exportResponse, studyExportData } from '@/app/_lib/studies/study-export';

/** GET: the study as XLSX in the user's units, or one table as CSV (`?format=csv&table=Fit`). */
export const GET = route<{ studyId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: study, member } = await loadInLab(ctx, 'study', ctx.params.studyId, 'lab:export');
  return exportResponse(await studyExportData(ctx.em, study, member.lab.name, ctx.requireActor().user.unitSystem), study.title, ctx.req.nextUrl.searchParams, ctx.req);
});
