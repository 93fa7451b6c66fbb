import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { notFound } from '@/app/_lib/server/errors';
import { route } from '@/app/_lib/server/route';
import { cachedJson } from '@/app/_lib/server/http-cache';
import { blockData } from '@/app/_lib/studies/study-blocks';

type P = { studyId: string; blockId: string };

/** GET: one block of the study as plain JSON (numbers, tables, server-rendered SVG) in the member's units, with an ETag (304 when unchanged). */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: study, member } = await loadInLab(ctx, 'study', ctx.params.studyId, 'lab:read');
  const block = study.blocks.find((b) => b.id === ctx.params.blockId);
  if (!block) throw notFound('This study has no such block (it may have been deleted).');
  const units = ctx.requireActor().user.unitSystem;
  return cachedJson(ctx.req, { block: await blockData({ em: ctx.em, lab: member.lab, study, units, publicView: false }, block), revision: study.revision });
});
