import { ShareLink } from '@/entities';
import { audit } from '@/app/_lib/labs/audit';
import { json, route } from '@/app/_lib/server/route';
import { createShare, loadStudy, shareDto, shareInput } from '@/app/_lib/studies/studies';

type P = { studyId: string };

/** GET: the study's share links (never their tokens). */
export const GET = route<P>({ auth: 'session' }, async (ctx) => {
  const { study } = await loadStudy(ctx, 'share:manage');
  const links = await ctx.em.find(ShareLink, { study }, { orderBy: { createdAt: 'desc' } });
  return json({ shares: links.map(shareDto) });
});

/** POST: a read-only link with an expiry; the URL is shown once. */
export const POST = route<P>({ auth: 'session' }, async (ctx) => {
  const { study } = await loadStudy(ctx, 'share:manage');
  const { days } = await ctx.json(shareInput);
  const { link, token } = await createShare(ctx.em, study, ctx.requireActor().user, days);
  await audit(ctx.em, { kind: 'share-created', actor: ctx.requireActor().user, lab: study.lab, subject: `study "${study.title}" for ${days} days`.slice(0, 300), ip: ctx.ip });
  return json({ share: shareDto(link), url: `${ctx.origin}/share/${token}` }, { status: 201 });
});
