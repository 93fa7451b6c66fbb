import { Trial, TrialChange } from '@/entities';
import { notFound } from '@/app/_lib/server/errors';
import { UUID } from '@/app/_lib/rigs/rigs';
import { json, route, type RouteContext } from '@/app/_lib/server/route';
import type { Action } from '@/app/_lib/labs/permissions';
import { trialDto, trialPatch, updateTrials } from '@/app/_lib/rigs/trials';

type P = { trialId: string };

async function loadTrial(ctx: RouteContext<P>, action: Action) {
  ctx.requireActor();
  if (!UUID.test(ctx.params.trialId)) throw notFound();
  const trial = await ctx.em.findOne(Trial, { id: ctx.params.trialId });
  if (!trial) throw notFound();
  await ctx.requireMember(trial.lab.id, action);
  return trial;
}

/** GET: one trial with its history of changes. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const trial = await loadTrial(ctx, 'lab:read');
  const history = await ctx.em.find(TrialChange, { trial }, { populate: ['user'], orderBy: { createdAt: 'asc' } });
  return json({
    trial: trialDto(trial),
    history: history.map((h) => ({ at: h.createdAt.toISOString(), by: h.user?.name ?? null, field: h.field, before: h.before, after: h.after })),
  });
});

/** PATCH: edit the notes or exclude/include the trial (engineers and owners). */
export const PATCH = route<P>({ auth: 'user' }, async (ctx) => {
  const trial = await loadTrial(ctx, 'trial:write');
  await updateTrials(ctx.em, [trial], await ctx.json(trialPatch), ctx.requireActor().user);
  return json({ trial: trialDto(trial) });
});
