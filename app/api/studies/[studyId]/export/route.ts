import { route } from '@/app/_lib/route';
import { studyXlsx, xlsxResponse } from '@/app/_lib/study-export';
import { loadStudy } from '@/app/_lib/studies';

/** GET: the study as XLSX in the user's units. */
export const GET = route<{ studyId: string }>({ auth: 'user' }, async (ctx) => {
  const { study, member } = await loadStudy(ctx, 'lab:export');
  return xlsxResponse(await studyXlsx(ctx.em, study, member.lab.name, ctx.requireActor().user.unitSystem), study.title);
});
