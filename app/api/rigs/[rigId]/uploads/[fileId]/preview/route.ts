import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { z } from 'zod';
import { loadFile, previewImport } from '@/app/_lib/imports/trial-sheets';
import { json, route } from '@/app/_lib/server/route';

const body = z.object({ sheet: z.string().max(100).optional(), mapping: z.unknown().optional() }).strict();

/** POST: read the stored file, suggest a mapping (or apply the given one) and check every row. Nothing is saved. */
export const POST = route<{ rigId: string; fileId: string }>({ auth: 'user', maxBodyBytes: 256 * 1024 }, async (ctx) => {
  const { row: rig, member } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const file = await loadFile(ctx.em, rig, ctx.params.fileId);
  const { sheet, mapping } = await ctx.json(body);
  return json(await previewImport(ctx.em, member.lab, file, { sheet, mapping }));
});
