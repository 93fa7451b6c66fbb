import { ShareLink } from '@/entities';
import { json, route } from '@/app/_lib/route';
import { createShare, loadStudy, shareDto, shareInput } from '@/app/_lib/studies';

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
  return json({ share: shareDto(link), url: `${ctx.origin}/share/${token}` }, { status: 201 });
});
