import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { reviewTrail } from '@/app/_lib/review/review';
import { assertEditable, saveStudy, studyDto, studySave } from '@/app/_lib/studies/studies';

type P = { studyId: string };

/** GET: the study's blocks, revision, review state, comments and history. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: study } = await loadInLab(ctx, 'study', ctx.params.studyId, 'lab:read');
  return json({ study: studyDto(study), ...(await reviewTrail(ctx.em, 'study', study.id)) });
});

/** PUT: save title and blocks against the revision the editor loaded (409 with the current version on conflict). */
export const PUT = route<P>({ auth: 'session', maxBodyBytes: 1024 * 1024 }, async (ctx) => {
  const { row: study } = await loadInLab(ctx, 'study', ctx.params.studyId, 'study:write');
  assertEditable(study);
  const saved = await saveStudy(ctx.em, study, ctx.requireActor().user, await ctx.json(studySave));
  return json({ study: studyDto(saved) });
});
