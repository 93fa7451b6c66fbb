import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { confirmImport, confirmInput, loadFile } from '@/app/_lib/imports/trial-sheets';
import { json, route } from '@/app/_lib/server/route';

/** POST: import the checked rows as trials, all in one transaction; the mapping is saved for the next file with these headers. */
export const POST = route<{ rigId: string; fileId: string }>({ auth: 'user', maxBodyBytes: 1024 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const file = await loadFile(ctx.em, rig, ctx.params.fileId);
  return json(await confirmImport(ctx.em, rig, file, await ctx.json(confirmInput)), { status: 201 });
});
