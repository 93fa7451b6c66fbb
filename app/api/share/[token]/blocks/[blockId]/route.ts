import { notFound } from '@/app/_lib/server/errors';
import { route } from '@/app/_lib/server/route';
import { cachedJson } from '@/app/_lib/server/http-cache';
import { blockData } from '@/app/_lib/studies/study-blocks';
import { sharedStudy, shareUnits } from '@/app/_lib/studies/studies';

type P = { token: string; blockId: string };

/**
 * GET: one block of a shared study, for anyone holding a valid link: no member names, no links
 * into the lab, no raw files. `?units=si|us` is the reader's choice; without it a signed-in
 * reader gets their own preference and anyone else SI. With an ETag (304 when unchanged).
 */
export const GET = route<P>({ auth: 'public' }, async (ctx) => {
  const link = await sharedStudy(ctx.em, ctx.params.token);
  if (!link) throw notFound('This share link has expired or was revoked.');
  const block = link.study.blocks.find((b) => b.id === ctx.params.blockId);
  if (!block) throw notFound('This study has no such block.');
  const units = shareUnits(ctx.req.nextUrl.searchParams.get('units'), ctx.actor?.user.unitSystem);
  return cachedJson(ctx.req, { block: await blockData({ em: ctx.em, lab: link.lab, study: link.study, units, publicView: true }, block) });
});
