import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { trialDto, trialHistory, trialPatch, updateTrials } from '@/app/_lib/rigs/trials';

type P = { trialId: string };

/** GET: one trial with its history of changes. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: trial } = await loadInLab(ctx, 'trial', ctx.params.trialId, 'lab:read');
  return json({ trial: trialDto(trial), history: await trialHistory(ctx.em, trial) });
});

/** PATCH: edit the notes or exclude/include the trial (engineers and owners). */
export const PATCH = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: trial } = await loadInLab(ctx, 'trial', ctx.params.trialId, 'trial:write');
  await updateTrials(ctx.em, [trial], await ctx.json(trialPatch), ctx.requireActor().user);
  return json({ trial: trialDto(trial) });
});
