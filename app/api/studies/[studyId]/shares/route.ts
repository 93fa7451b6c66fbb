import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { audit } from '@/app/_lib/labs/audit';
import { json, route } from '@/app/_lib/server/route';
import { createShare, shareDto, shareInput, sharesOfStudy } from '@/app/_lib/studies/studies';

type P = { studyId: string };

/** GET: the study's share links (never their tokens). */
export const GET = route<P>({ auth: 'session' }, async (ctx) => {
  const { row: study } = await loadInLab(ctx, 'study', ctx.params.studyId, 'share:manage');
  const links = await sharesOfStudy(ctx.em, study);
  return json({ shares: links.map(shareDto) });
});

/** POST: a read-only link with an expiry; the URL is shown once. */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { row: study } = await loadInLab(ctx, 'study', ctx.params.studyId, 'share:manage');
  const { days } = await ctx.json(shareInput);
  const { link, token } = await createShare(ctx.em, study, ctx.requireActor().user, days);
  await audit(ctx.em, { kind: 'share-created', actor: ctx.requireActor().user, lab: study.lab, subject: `study "${study.title}" for ${days} days`.slice(0, 300), ip: ctx.ip });
  return json({ share: shareDto(link), url: `${ctx.origin}/share/${token}` }, { status: 201 });
});
