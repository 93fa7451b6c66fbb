import { notFound } from '@/app/_lib/server/errors';
import { route } from '@/app/_lib/server/route';
import { exportResponse, studyExportData } from '@/app/_lib/studies/study-export';
import { sharedStudy, shareUnits } from '@/app/_lib/studies/studies';

/** GET: the shared study as XLSX, for anyone holding a valid share link, in the units of the share view (`?units=si|us`). */
export const GET = route<{ token: string }>({ auth: 'public' }, async (ctx) => {
  const link = await sharedStudy(ctx.em, ctx.params.token);
  if (!link) throw notFound('This share link has expired or was revoked.');
  return exportResponse(await studyExportData(ctx.em, link.study, link.lab.name, shareUnits(ctx.req.nextUrl.searchParams.get('units'), ctx.actor?.user.unitSystem)), link.study.title, ctx.req.nextUrl.searchParams, ctx.req);
});
