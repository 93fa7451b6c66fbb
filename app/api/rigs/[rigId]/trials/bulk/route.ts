import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { z } from 'zod';
import { json, route } from '@/app/_lib/server/route';
import { trialDto, trialPatch, trialsOfRig, updateTrials } from '@/app/_lib/rigs/trials';

const body = z.object({ ids: z.array(z.string()).min(1).max(5000), patch: trialPatch }).strict();

/** POST: apply one edit (exclude/include, notes) to many trials of the rig at once. */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: 512 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const { ids, patch } = await ctx.json(body);
  const trials = await trialsOfRig(ctx.em, rig, ids);
  await updateTrials(ctx.em, trials, patch, ctx.requireActor().user);
  return json({ trials: trials.map(trialDto) });
});
