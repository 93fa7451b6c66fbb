import { json, route } from '@/app/_lib/server/route';
import { newStudy, studiesOfLab, studyCreate, studyListDto } from '@/app/_lib/studies/studies';

type P = { labId: string };

/** GET: the lab's studies with their review state. */
export const GET = route<P>({ auth: 'user', labAction: 'lab:read' }, async (ctx) => {
  const rows = await studiesOfLab(ctx.em, ctx.params.labId);
  return json({ studies: rows.map(studyListDto) });
});

/** POST: start a study (engineers and owners). */
export const POST = route<P>({ auth: 'session', labAction: 'study:write' }, async (ctx) => {
  const { title } = await ctx.json(studyCreate);
  const s = newStudy(ctx.em, ctx.member!.lab, ctx.requireActor().user, title);
  await ctx.em.flush();
  return json({ study: studyListDto(s) }, { status: 201 });
});
